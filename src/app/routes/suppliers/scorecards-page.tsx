import { PageHeader, Panel } from '../../../components/ui/page.tsx';
import { AlertsList } from '../../../features/drift-alerts/components/alerts-list.tsx';
import { PeriodFilter } from '../../../features/scorecards/components/period-filter.tsx';
import { ScorecardsTable } from '../../../features/scorecards/components/scorecards-table.tsx';
import { AREA_PURPOSE } from '../../areas.ts';
import { RequireArea } from '../require-area.tsx';
import { alertActions } from './alert-actions.tsx';
import { SuppliersTabs, supplierPaths } from './suppliers-tabs.tsx';
import { usePeriod } from './use-period.ts';

export function SuppliersPage() {
  const [period, setPeriod] = usePeriod();
  return (
    <RequireArea area="suppliers">
      <PageHeader title="Suppliers" subtitle={AREA_PURPOSE.suppliers} />
      <SuppliersTabs />
      <div className="flex flex-col gap-5">
        <Panel title="Scorecards">
          <div className="flex flex-col gap-3">
            <PeriodFilter key={`${period.from}-${period.to}`} value={period} onChange={setPeriod} />
            <ScorecardsTable period={period} detailPath={(id) => `${supplierPaths.scorecard(id)}?from=${period.from}&to=${period.to}`} />
          </div>
        </Panel>
        <Panel title="Drift and mixed-stock alerts">
          <AlertsList canAct actions={alertActions} />
        </Panel>
      </div>
    </RequireArea>
  );
}
