import { useState } from 'react';
import { Notice } from '../../../components/ui/notice.tsx';
import { PageHeader, Panel } from '../../../components/ui/page.tsx';
import { useOrderPlan } from '../../../features/order-planning/api/get-order-plan.ts';
import { OrderPlanForm } from '../../../features/order-planning/components/order-plan-form.tsx';
import { OrderPlanResult } from '../../../features/order-planning/components/order-plan-result.tsx';
import { usePartTypes } from '../../../features/part-types/api/get-part-types.ts';
import { useSuppliers } from '../../../features/suppliers/api/get-suppliers.ts';
import { RequireArea } from '../require-area.tsx';
import { SuppliersTabs } from './suppliers-tabs.tsx';

export function PlanningPage() {
  const [jobId, setJobId] = useState<string | null>(null);
  // The page composes the suppliers and part-types features for the form's choices.
  const suppliers = useSuppliers({ page: 1, pageSize: 200, sort: 'name', dir: 'asc' });
  const parts = usePartTypes({ page: 1, pageSize: 200, active: 'true', sort: 'partNumber', dir: 'asc' });
  const job = useOrderPlan(jobId);
  return (
    <RequireArea area="suppliers">
      <PageHeader title="Suppliers" subtitle="Order planning: how many parts to buy from a supplier to get N matched sets at a tolerance, with a stated confidence." />
      <SuppliersTabs />
      <div className="grid gap-5 xl:grid-cols-[28rem_1fr]">
        <Panel title="Question">
          <OrderPlanForm
            suppliers={(suppliers.data?.items ?? []).map((s) => ({ id: s.id, label: `${s.name} (${s.code})` }))}
            partTypes={(parts.data?.items ?? []).map((p) => ({ id: p.id, label: `${p.partNumber} — ${p.polarity}, ${p.description}`, matchHfePct: p.matchHfePct, matchVbeMv: p.matchVbeMv }))}
            onStarted={(j) => setJobId(j.id)}
          />
        </Panel>
        <Panel title="Answer">
          {!jobId ? (
            <p className="text-sm text-ink-soft">
              The plan simulates lots drawn from the parts this supplier delivered before (accepted lots, readings at 25 °C) and runs the real matching on each, so the answer includes what the matching
              loses at the tolerance — not only the gain spread.
            </p>
          ) : job.isError ? (
            <Notice tone="fail" title="The plan could not be read">{(job.error as Error).message}</Notice>
          ) : job.data ? (
            <OrderPlanResult job={job.data} />
          ) : null}
        </Panel>
      </div>
    </RequireArea>
  );
}
