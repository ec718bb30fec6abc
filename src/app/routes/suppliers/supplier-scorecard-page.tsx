import { Link, useParams } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice.tsx';
import { EmptyState, Loading, PageHeader, Panel } from '../../../components/ui/page.tsx';
import { AlertsList } from '../../../features/drift-alerts/components/alerts-list.tsx';
import { useSupplierScorecard } from '../../../features/scorecards/api/get-supplier-scorecard.ts';
import { FiguresStrip } from '../../../features/scorecards/components/figures-strip.tsx';
import { PartScorecardView } from '../../../features/scorecards/components/part-scorecard.tsx';
import { PeriodFilter } from '../../../features/scorecards/components/period-filter.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { RequireArea } from '../require-area.tsx';
import { alertActions } from './alert-actions.tsx';
import { SuppliersTabs, supplierPaths } from './suppliers-tabs.tsx';
import { usePeriod } from './use-period.ts';

export function SupplierScorecardPage() {
  const id = Number(useParams().id);
  const [period, setPeriod] = usePeriod();
  const q = useSupplierScorecard(id, period);
  let body;
  if (!Number.isInteger(id) || id < 1 || (q.error instanceof ApiError && q.error.status === 404)) {
    body = (
      <EmptyState title="No such supplier">
        <Link to={supplierPaths.scorecards} className="font-semibold underline">
          Back to the scorecards
        </Link>
      </EmptyState>
    );
  } else if (q.isLoading) {
    body = <Loading label="Loading the scorecard…" />;
  } else if (q.isError || !q.data) {
    body = <Notice tone="fail" title="The scorecard could not be loaded">{(q.error as Error | null)?.message}</Notice>;
  } else {
    const s = q.data;
    body = (
      <div className="flex flex-col gap-6">
        <PageHeader
          title={s.supplier.name}
          subtitle={<span className="num">Supplier {s.supplier.code} · {s.supplier.approval} · lots received {s.period.from} to {s.period.to}</span>}
          actions={
            <Link to={`${supplierPaths.scorecards}?from=${period.from}&to=${period.to}`} className="self-center text-sm font-semibold text-ink-soft underline-offset-2 hover:underline">
              ‹ All suppliers
            </Link>
          }
        />
        <PeriodFilter key={`${period.from}-${period.to}`} value={period} onChange={setPeriod} />
        <Panel title="All part types">
          <FiguresStrip f={s.totals} />
        </Panel>
        {s.parts.length === 0 ? (
          <EmptyState title="No lot from this supplier in the period">Widen the period to see earlier lots.</EmptyState>
        ) : (
          s.parts.map((p) => (
            <PartScorecardView
              key={p.partType.id}
              part={p}
              lotActions={(l) =>
                l.status === 'rejected' || l.status === 'mrb' ? (
                  <Link to={supplierPaths.newNcr(l.lotId, l.alertId)} className="text-sm font-semibold text-copper-dark underline">
                    Raise NCR…
                  </Link>
                ) : null
              }
            />
          ))
        )}
        <Panel title={`Alerts for ${s.supplier.name}`}>
          <AlertsList canAct supplierId={s.supplier.id} actions={alertActions} />
        </Panel>
      </div>
    );
  }
  return (
    <RequireArea area="suppliers">
      <SuppliersTabs />
      {body}
    </RequireArea>
  );
}
