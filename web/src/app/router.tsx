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

function createAppRouter() {
  return createBrowserRouter([
    { path: paths.signIn.path, element: <SignInRoute /> },
    {
      element: <ProtectedLayout />,
      children: [
        { index: true, element: <ProjectsRoute /> },
        { path: paths.project.path, element: <ProjectRoute /> },
        { path: sheetPath, element: <SheetRoute /> },
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
