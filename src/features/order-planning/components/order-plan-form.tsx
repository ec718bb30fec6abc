import { useState } from 'react';
import type { OrderPlanJob, OrderPlanRequest } from '../../../../shared/api/supplier-quality.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useStartOrderPlan } from '../api/start-order-plan.ts';

export interface Option {
  id: number;
  label: string;
  /** Part types: default matching tolerances. */
  matchHfePct?: number;
  matchVbeMv?: number;
}

/** "How many parts must I buy to get N matched sets?" — the question as a form. */
export function OrderPlanForm({ suppliers, partTypes, onStarted }: { suppliers: Option[]; partTypes: Option[]; onStarted: (job: OrderPlanJob) => void }) {
  const [v, setV] = useState({ supplierId: '', partTypeId: '', setsWanted: '50', setSize: '2', hfeTolerancePct: '3', vbeToleranceMv: '2', confidencePct: '95', seed: '1' });
  const start = useStartOrderPlan();
  const err = start.error instanceof ApiError ? start.error : null;
  const fe = (f: string) => err?.fieldError(f);
  const set = (k: keyof typeof v) => (e: { target: { value: string } }) => setV((o) => ({ ...o, [k]: e.target.value }));
  const numberOrNaN = (s: string) => (s.trim() === '' ? Number.NaN : Number(s));
  return (
    <form
      aria-label="Order-quantity plan"
      className="grid gap-3 sm:grid-cols-2"
      onSubmit={(e) => {
        e.preventDefault();
        const body: OrderPlanRequest = {
          supplierId: Number(v.supplierId),
          partTypeId: Number(v.partTypeId),
          setsWanted: numberOrNaN(v.setsWanted),
          setSize: Number(v.setSize) as 2 | 4,
          hfeTolerancePct: numberOrNaN(v.hfeTolerancePct),
          vbeToleranceMv: numberOrNaN(v.vbeToleranceMv),
          confidencePct: numberOrNaN(v.confidencePct),
          seed: numberOrNaN(v.seed),
        };
        start.mutate(body, { onSuccess: onStarted });
      }}
    >
      <SelectField label="Supplier" value={v.supplierId} onChange={set('supplierId')} error={fe('supplierId')} options={[{ value: '', label: 'Choose a supplier' }, ...suppliers.map((s) => ({ value: String(s.id), label: s.label }))]} />
      <SelectField
        label="Part type"
        value={v.partTypeId}
        onChange={(e) => {
          const p = partTypes.find((x) => String(x.id) === e.target.value);
          setV((o) => ({ ...o, partTypeId: e.target.value, ...(p?.matchHfePct !== undefined ? { hfeTolerancePct: String(p.matchHfePct), vbeToleranceMv: String(p.matchVbeMv) } : {}) }));
        }}
        error={fe('partTypeId')}
        options={[{ value: '', label: 'Choose a part type' }, ...partTypes.map((p) => ({ value: String(p.id), label: p.label }))]}
      />
      <TextField label="Matched sets needed (N)" type="number" min={1} max={1000} value={v.setsWanted} onChange={set('setsWanted')} error={fe('setsWanted')} />
      <SelectField label="Set size" value={v.setSize} onChange={set('setSize')} error={fe('setSize')} options={[{ value: '2', label: 'Pairs (2)' }, { value: '4', label: 'Quads (4)' }]} />
      <TextField label="hFE tolerance (%)" hint="|h1 − h2| / min(h1, h2)" type="number" step="0.1" value={v.hfeTolerancePct} onChange={set('hfeTolerancePct')} error={fe('hfeTolerancePct')} />
      <TextField label="Vbe tolerance (mV)" type="number" step="0.1" value={v.vbeToleranceMv} onChange={set('vbeToleranceMv')} error={fe('vbeToleranceMv')} />
      <TextField label="Confidence (%)" hint="Probability of getting at least N sets" type="number" step="0.1" value={v.confidencePct} onChange={set('confidencePct')} error={fe('confidencePct')} />
      <TextField label="Seed" hint="The same seed gives the same answer" type="number" min={0} value={v.seed} onChange={set('seed')} error={fe('seed')} />
      {start.isError && !err?.problem.errors?.some((x) => x.field in v) && (
        <div className="sm:col-span-2">
          <Notice tone="fail" title="The plan did not start">{(start.error as Error).message}</Notice>
        </div>
      )}
      {err?.problem.errors?.some((x) => x.field === 'supplierId') && err.status === 422 && (
        <div className="sm:col-span-2">
          <Notice tone="hold" title="Not enough history">{err.problem.detail}</Notice>
        </div>
      )}
      <div className="sm:col-span-2">
        <Button type="submit" variant="primary" busy={start.isPending}>
          Plan the order
        </Button>
      </div>
    </form>
  );
}
