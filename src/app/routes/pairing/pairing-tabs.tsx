import { Link, useLocation } from 'react-router-dom';

export const pairingPaths = {
  kits: '/pairing',
  kit: (id: number) => `/pairing/kits/${id}`,
  loose: '/pairing/loose-parts',
  fit: '/pairing/fit-for-use',
};

export function PairingTabs() {
  const { pathname } = useLocation();
  const current = pathname.startsWith(pairingPaths.loose) ? 'loose' : pathname.startsWith(pairingPaths.fit) ? 'fit' : 'kits';
  const tab = (active: boolean) => `rounded-md px-3 py-1.5 text-sm font-semibold ${active ? 'bg-ink text-white' : 'text-ink-soft hover:bg-panel'}`;
  const links = [
    ['kits', pairingPaths.kits, 'Kits from stock'],
    ['loose', pairingPaths.loose, 'Loose parts'],
    ['fit', pairingPaths.fit, 'Fit-for-use'],
  ] as const;
  return (
    <nav aria-label="Pairing sections" className="mb-4 flex flex-wrap gap-2">
      {links.map(([key, to, label]) => (
        <Link key={key} to={to} className={tab(current === key)} aria-current={current === key ? 'page' : undefined}>
          {label}
        </Link>
      ))}
    </nav>
  );
}
