import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { AdminAuditPage } from './routes/admin/audit.tsx';
import { AdminMailPage } from './routes/admin/mail.tsx';
import { AdminUsersPage } from './routes/admin/users.tsx';
import { AppLayout } from './routes/app-layout.tsx';
import { AreaPage } from './routes/areas/area-page.tsx';
import { BenchLotPage } from './routes/bench/bench-lot-page.tsx';
import { BenchQueuePage } from './routes/bench/bench-queue-page.tsx';
import { CatalogPartTypeDetailPage } from './routes/catalog/part-type-detail.tsx';
import { CatalogPartTypesPage } from './routes/catalog/part-types.tsx';
import { CatalogSupplierDetailPage } from './routes/catalog/supplier-detail.tsx';
import { CatalogSuppliersPage } from './routes/catalog/suppliers.tsx';
import { DockPage } from './routes/dock/dock.tsx';
import { LotPage } from './routes/dock/lot.tsx';
import { BinsPage } from './routes/bins/bins-page.tsx';
import { ContainerCodePage } from './routes/bins/container-code-page.tsx';
import { ContainerPage } from './routes/bins/container-page.tsx';
import { HomePage } from './routes/home.tsx';
import { NcrPage } from './routes/suppliers/ncr-page.tsx';
import { NcrsPage } from './routes/suppliers/ncrs-page.tsx';
import { PlanningPage } from './routes/suppliers/planning-page.tsx';
import { SupplierScorecardPage } from './routes/suppliers/supplier-scorecard-page.tsx';
import { SuppliersPage } from './routes/suppliers/scorecards-page.tsx';
import { NotFoundPage } from './routes/not-found.tsx';
import { SignInPage } from './routes/sign-in.tsx';

export const routes: RouteObject[] = [
  { path: '/sign-in', element: <SignInPage /> },
  {
    path: '/',
    element: <AppLayout />,
    children: [
      { index: true, element: <HomePage /> },
      { path: 'dock', element: <DockPage /> },
      { path: 'dock/lots/:id', element: <LotPage /> },
      { path: 'bench', element: <BenchQueuePage /> },
      { path: 'bench/lots/:id', element: <BenchLotPage /> },
      { path: 'bins', element: <BinsPage /> },
      { path: 'bins/containers/code/:code', element: <ContainerCodePage /> },
      { path: 'bins/containers/:id', element: <ContainerPage /> },
      { path: 'pairing', element: <AreaPage area="pairing" /> },
      { path: 'suppliers', element: <SuppliersPage /> },
      { path: 'suppliers/ncrs', element: <NcrsPage /> },
      { path: 'suppliers/ncrs/:id', element: <NcrPage /> },
      { path: 'suppliers/planning', element: <PlanningPage /> },
      { path: 'suppliers/:id', element: <SupplierScorecardPage /> },
      { path: 'catalog', element: <CatalogPartTypesPage /> },
      { path: 'catalog/part-types/:id', element: <CatalogPartTypeDetailPage /> },
      { path: 'catalog/suppliers', element: <CatalogSuppliersPage /> },
      { path: 'catalog/suppliers/:id', element: <CatalogSupplierDetailPage /> },
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
