import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { AdminAuditPage } from './routes/admin/audit.tsx';
import { AdminMailPage } from './routes/admin/mail.tsx';
import { AdminUsersPage } from './routes/admin/users.tsx';
import { AppLayout } from './routes/app-layout.tsx';
import { AreaPage } from './routes/areas/area-page.tsx';
import { HomePage } from './routes/home.tsx';
import { NotFoundPage } from './routes/not-found.tsx';
import { SignInPage } from './routes/sign-in.tsx';

export const routes: RouteObject[] = [
  { path: '/sign-in', element: <SignInPage /> },
  {
    path: '/',
    element: <AppLayout />,
    children: [
      { index: true, element: <HomePage /> },
      { path: 'dock', element: <AreaPage area="dock" /> },
      { path: 'bench', element: <AreaPage area="bench" /> },
      { path: 'bins', element: <AreaPage area="bins" /> },
      { path: 'pairing', element: <AreaPage area="pairing" /> },
      { path: 'suppliers', element: <AreaPage area="suppliers" /> },
      { path: 'catalog', element: <AreaPage area="catalog" /> },
      { path: 'admin/users', element: <AdminUsersPage /> },
      { path: 'admin/audit', element: <AdminAuditPage /> },
      { path: 'admin/mail', element: <AdminMailPage /> },
      { path: '*', element: <NotFoundPage /> },
    ],
  },
];

export function createRouter() {
  return createBrowserRouter(routes);
}
