import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { AppLayout } from './routes/app-layout.tsx';
import { HomePage } from './routes/home.tsx';
import { NotFoundPage } from './routes/not-found.tsx';
import { SignInPage } from './routes/sign-in.tsx';

/**
 * Area pages load on demand (one chunk per page), so the first load carries only the shell,
 * sign-in and the start page.
 */
function page<M extends Record<string, unknown>>(load: () => Promise<M>, name: keyof M & string) {
  return async () => ({ Component: (await load())[name] as React.ComponentType });
}

export const routes: RouteObject[] = [
  { path: '/sign-in', element: <SignInPage /> },
  {
    path: '/',
    element: <AppLayout />,
    children: [
      { index: true, element: <HomePage /> },
      { path: 'dock', lazy: page(() => import('./routes/dock/dock.tsx'), 'DockPage') },
      { path: 'dock/lots/:id', lazy: page(() => import('./routes/dock/lot.tsx'), 'LotPage') },
      { path: 'bench', lazy: page(() => import('./routes/bench/bench-queue-page.tsx'), 'BenchQueuePage') },
      { path: 'bench/lots/:id', lazy: page(() => import('./routes/bench/bench-lot-page.tsx'), 'BenchLotPage') },
      { path: 'bins', lazy: page(() => import('./routes/bins/bins-page.tsx'), 'BinsPage') },
      { path: 'bins/containers/code/:code', lazy: page(() => import('./routes/bins/container-code-page.tsx'), 'ContainerCodePage') },
      { path: 'bins/containers/:id', lazy: page(() => import('./routes/bins/container-page.tsx'), 'ContainerPage') },
      { path: 'pairing', lazy: page(() => import('./routes/pairing/pairing-page.tsx'), 'PairingPage') },
      { path: 'pairing/kits/:id', lazy: page(() => import('./routes/pairing/kit-page.tsx'), 'KitPage') },
      { path: 'pairing/loose-parts', lazy: page(() => import('./routes/pairing/loose-parts-page.tsx'), 'LoosePartsPage') },
      { path: 'pairing/fit-for-use', lazy: page(() => import('./routes/pairing/fit-for-use-page.tsx'), 'FitForUsePage') },
      { path: 'suppliers', lazy: page(() => import('./routes/suppliers/scorecards-page.tsx'), 'SuppliersPage') },
      { path: 'suppliers/ncrs', lazy: page(() => import('./routes/suppliers/ncrs-page.tsx'), 'NcrsPage') },
      { path: 'suppliers/ncrs/:id', lazy: page(() => import('./routes/suppliers/ncr-page.tsx'), 'NcrPage') },
      { path: 'suppliers/planning', lazy: page(() => import('./routes/suppliers/planning-page.tsx'), 'PlanningPage') },
      { path: 'suppliers/:id', lazy: page(() => import('./routes/suppliers/supplier-scorecard-page.tsx'), 'SupplierScorecardPage') },
      { path: 'catalog', lazy: page(() => import('./routes/catalog/part-types.tsx'), 'CatalogPartTypesPage') },
      { path: 'catalog/part-types/:id', lazy: page(() => import('./routes/catalog/part-type-detail.tsx'), 'CatalogPartTypeDetailPage') },
      { path: 'catalog/suppliers', lazy: page(() => import('./routes/catalog/suppliers.tsx'), 'CatalogSuppliersPage') },
      { path: 'catalog/suppliers/:id', lazy: page(() => import('./routes/catalog/supplier-detail.tsx'), 'CatalogSupplierDetailPage') },
      { path: 'admin/users', lazy: page(() => import('./routes/admin/users.tsx'), 'AdminUsersPage') },
      { path: 'admin/audit', lazy: page(() => import('./routes/admin/audit.tsx'), 'AdminAuditPage') },
      { path: 'admin/mail', lazy: page(() => import('./routes/admin/mail.tsx'), 'AdminMailPage') },
      { path: '*', element: <NotFoundPage /> },
    ],
  },
];

export function createRouter() {
  return createBrowserRouter(routes);
}
