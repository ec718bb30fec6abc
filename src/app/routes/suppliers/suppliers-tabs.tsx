import { Link, useLocation } from 'react-router-dom';

export const supplierPaths = {
  scorecards: '/suppliers',
  scorecard: (id: number) => `/suppliers/${id}`,
  ncrs: '/suppliers/ncrs',
  ncr: (id: number) => `/suppliers/ncrs/${id}`,
  newNcr: (lotId: number, alertId?: number | null) => `/suppliers/ncrs?lotId=${lotId}${alertId ? `&alertId=${alertId}` : ''}`,
  planning: '/suppliers/planning',
};

export function SuppliersTabs() {
  const { pathname } = useLocation();
  const current = pathname.startsWith(supplierPaths.ncrs) ? 'ncrs' : pathname.startsWith(supplierPaths.planning) ? 'planning' : 'scorecards';
  const tab = (active: boolean) => `rounded-md px-3 py-1.5 text-sm font-semibold ${active ? 'bg-ink text-white' : 'text-ink-soft hover:bg-panel'}`;
  const links = [
    ['scorecards', supplierPaths.scorecards, 'Scorecards and alerts'],
    ['ncrs', supplierPaths.ncrs, 'Nonconformance reports'],
    ['planning', supplierPaths.planning, 'Order planning'],
  ] as const;
  return (
    <nav aria-label="Suppliers sections" className="mb-4 flex flex-wrap gap-2">
      {links.map(([key, to, label]) => (
        <Link key={key} to={to} className={tab(current === key)} aria-current={current === key ? 'page' : undefined}>
          {label}
        </Link>
      ))}
    </nav>
  );
}
