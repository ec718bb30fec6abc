import { Link } from 'react-router-dom';
import type { DriftAlertRow } from '../../../../shared/api/supplier-quality.ts';
import { supplierPaths } from './suppliers-tabs.tsx';

/** "Raise NCR" from an alert, or a link to the NCR already raised for its lot. */
export function alertActions(a: DriftAlertRow) {
  const open = a.ncrs.find((n) => n.status !== 'closed');
  if (open) {
    return (
      <Link to={supplierPaths.ncr(open.id)} className="rounded-md border border-rule bg-panel px-3 py-1.5 text-sm font-semibold text-ink hover:bg-paper">
        Open {open.code}
      </Link>
    );
  }
  return (
    <Link to={supplierPaths.newNcr(a.lot.id, a.id)} className="rounded-md border border-copper-dark bg-copper px-3 py-1.5 text-sm font-semibold text-white hover:bg-copper-dark">
      Raise NCR…
    </Link>
  );
}
