import { lazy, Suspense, useState, type ComponentType, type ReactNode } from 'react';
import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { Spinner } from '../components/ui/spinner';
import { paths } from '../config/paths';
import { ProtectedLayout } from './routes/protected';
import { SignInRoute } from './routes/sign-in';
import { ProjectsRoute } from './routes/projects';
import { NotFoundRoute } from './routes/not-found';
import { RouteError } from './routes/route-error';

// The first screens a person sees (sign in, the projects list) are in the entry chunk; every other
// screen is its own chunk, fetched the first time it is opened, so signing in does not wait for
// the editor's CodeMirror, the revision's KaTeX or the admin tables.
function screen<M>(load: () => Promise<M>, pick: (module: M) => ComponentType) {
  return lazy(() => load().then((module) => ({ default: pick(module) })));
}

const ProjectRoute = screen(
  () => import('./routes/project'),
  (m) => m.ProjectRoute,
);
const SheetRoute = screen(
  () => import('./routes/sheet'),
  (m) => m.SheetRoute,
);
const RevisionRoute = screen(
  () => import('./routes/revision'),
  (m) => m.RevisionRoute,
);
const PrintRoute = screen(
  () => import('./routes/print'),
  (m) => m.PrintRoute,
);
const CompareRoute = screen(
  () => import('./routes/compare'),
  (m) => m.CompareRoute,
);
const OutboxRoute = screen(
  () => import('./routes/outbox'),
  (m) => m.OutboxRoute,
);
const AdminRoute = screen(
  () => import('./routes/admin'),
  (m) => m.AdminRoute,
);
const ReferenceRoute = screen(
  () => import('./routes/reference'),
  (m) => m.ReferenceRoute,
);
const TemplatesRoute = screen(
  () => import('./routes/templates'),
  (m) => m.TemplatesRoute,
);
const ResetPasswordRoute = screen(
  () => import('./routes/reset-password'),
  (m) => m.ResetPasswordRoute,
);
const PackageRoute = screen(
  () => import('./routes/package'),
  (m) => m.PackageRoute,
);
const SearchRoute = screen(
  () => import('./routes/search'),
  (m) => m.SearchRoute,
);
const VerifyRoute = screen(
  () => import('./routes/verify'),
  (m) => m.VerifyRoute,
);

/** While a screen's code arrives: inside the shell for signed-in pages, alone for the others. */
function Opening({ children, bare = false }: { children: ReactNode; bare?: boolean }) {
  return (
    <Suspense
      fallback={
        bare ? (
          <div className="mx-auto max-w-md px-6 py-16">
            <Spinner label="Opening…" />
          </div>
        ) : (
          <Spinner label="Opening…" />
        )
      }
    >
      {children}
    </Suspense>
  );
}

function createAppRouter() {
  return createBrowserRouter([
    {
      path: paths.signIn.path,
      errorElement: <RouteError screen="sign-in page" />,
      element: <SignInRoute />,
    },
    // Public: a seal is checked without signing in.
    {
      path: paths.verify.path,
      errorElement: <RouteError screen="seal check" />,
      element: (
        <Opening bare>
          <VerifyRoute />
        </Opening>
      ),
    },
    {
      path: paths.verify.codePath,
      errorElement: <RouteError screen="seal check" />,
      element: (
        <Opening bare>
          <VerifyRoute />
        </Opening>
      ),
    },
    // The project's calculation package, printed as paper like a single revision.
    {
      path: paths.package.path,
      errorElement: <RouteError screen="calculation package" />,
      element: (
        <Opening bare>
          <PackageRoute />
        </Opening>
      ),
    },
    // Public: a one-time link from the mail sets a new password.
    {
      path: paths.resetPassword.path,
      errorElement: <RouteError screen="password reset" />,
      element: (
        <Opening bare>
          <ResetPasswordRoute />
        </Opening>
      ),
    },
    // Printed as paper: no app header; signs strangers in like every member-only page.
    {
      path: paths.print.path,
      errorElement: <RouteError screen="print" />,
      element: (
        <Opening bare>
          <PrintRoute />
        </Opening>
      ),
    },
    {
      element: <ProtectedLayout />,
      errorElement: <RouteError screen="page" />,
      children: [
        {
          index: true,
          element: <ProjectsRoute />,
          errorElement: <RouteError screen="projects list" />,
        },
        {
          path: paths.project.path,
          errorElement: <RouteError screen="project" />,
          element: (
            <Opening>
              <ProjectRoute />
            </Opening>
          ),
        },
        {
          path: paths.sheet.path,
          errorElement: <RouteError screen="sheet" />,
          element: (
            <Opening>
              <SheetRoute />
            </Opening>
          ),
        },
        {
          path: paths.revision.path,
          errorElement: <RouteError screen="revision" />,
          element: (
            <Opening>
              <RevisionRoute />
            </Opening>
          ),
        },
        {
          path: paths.compare.path,
          errorElement: <RouteError screen="comparison" />,
          element: (
            <Opening>
              <CompareRoute />
            </Opening>
          ),
        },
        {
          path: paths.outbox.path,
          errorElement: <RouteError screen="mail outbox" />,
          element: (
            <Opening>
              <OutboxRoute />
            </Opening>
          ),
        },
        {
          path: paths.templates.path,
          errorElement: <RouteError screen="firm templates" />,
          element: (
            <Opening>
              <TemplatesRoute />
            </Opening>
          ),
        },
        {
          path: paths.search.path,
          errorElement: <RouteError screen="search" />,
          element: (
            <Opening>
              <SearchRoute />
            </Opening>
          ),
        },
        {
          path: paths.admin.path,
          errorElement: <RouteError screen="administration" />,
          element: (
            <Opening>
              <AdminRoute />
            </Opening>
          ),
        },
        {
          path: paths.reference.path,
          element: (
            <Opening>
              <ReferenceRoute />
            </Opening>
          ),
        },
        { path: '*', element: <NotFoundRoute /> },
      ],
    },
  ]);
}

export function AppRouter() {
  const [router] = useState(createAppRouter);
  return <RouterProvider router={router} />;
}
