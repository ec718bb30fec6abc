import { Link, useLocation } from 'react-router-dom';

export const catalogPaths = {
  partTypes: '/catalog',
  partType: (id: number) => `/catalog/part-types/${id}`,
  suppliers: '/catalog/suppliers',
  supplier: (id: number) => `/catalog/suppliers/${id}`,
};

export function CatalogTabs() {
  const { pathname } = useLocation();
  const onSuppliers = pathname.startsWith(catalogPaths.suppliers);
  const tab = (active: boolean) => `rounded-md px-3 py-1.5 text-sm font-semibold ${active ? 'bg-ink text-white' : 'text-ink-soft hover:bg-panel'}`;
  return (
    <nav aria-label="Catalog sections" className="mb-4 flex gap-2">
      <Link to={catalogPaths.partTypes} className={tab(!onSuppliers)} aria-current={!onSuppliers ? 'page' : undefined}>
        Part types
      </Link>
      <Link to={catalogPaths.suppliers} className={tab(onSuppliers)} aria-current={onSuppliers ? 'page' : undefined}>
        Suppliers
      </Link>
    </nav>
  );
}

export function ReadOnlyNote() {
  return <p className="mb-3 text-sm text-ink-soft">You can read the catalog; quality engineers maintain it.</p>;
}
