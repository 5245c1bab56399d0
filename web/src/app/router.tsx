import { useState } from 'react';
import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { paths } from '../config/paths';
import { ProtectedLayout } from './routes/protected';
import { SignInRoute } from './routes/sign-in';
import { ProjectsRoute } from './routes/projects';
import { ProjectRoute } from './routes/project';
import { AdminRoute } from './routes/admin';
import { SheetRoute, sheetPath } from './routes/sheet';
import { NotFoundRoute } from './routes/not-found';
import { RevisionRoute, revisionPath } from './routes/revision';
import { PrintRoute, printPath } from './routes/print';
import { CompareRoute, comparePath } from './routes/compare';
import { OutboxRoute, outboxPath } from './routes/outbox';
import { VerifyRoute, verifyCodePath, verifyPath } from './routes/verify';

function createAppRouter() {
  return createBrowserRouter([
    { path: paths.signIn.path, element: <SignInRoute /> },
    // Public: a seal is checked without signing in.
    { path: verifyPath, element: <VerifyRoute /> },
    { path: verifyCodePath, element: <VerifyRoute /> },
    // Printed as paper: no app header; signs strangers in like every member-only page.
    { path: printPath, element: <PrintRoute /> },
    {
      element: <ProtectedLayout />,
      children: [
        { index: true, element: <ProjectsRoute /> },
        { path: paths.project.path, element: <ProjectRoute /> },
        { path: sheetPath, element: <SheetRoute /> },
        { path: revisionPath, element: <RevisionRoute /> },
        { path: comparePath, element: <CompareRoute /> },
        { path: outboxPath, element: <OutboxRoute /> },
        { path: paths.admin.path, element: <AdminRoute /> },
        { path: '*', element: <NotFoundRoute /> },
      ],
    },
  ]);
}

export function AppRouter() {
  const [router] = useState(createAppRouter);
  return <RouterProvider router={router} />;
}
