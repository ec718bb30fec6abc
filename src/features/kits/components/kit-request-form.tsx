import { useEffect, useRef, useState } from 'react';
import { HFE_TOLERANCE_DEFINITION, MATCH_MODE_LABELS, type KitDetail, type KitPlanRequest, type MatchMode, type PairingStockRow, type SetSize } from '../../../../shared/api/pairing.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useCreateKit } from '../api/create-kit.ts';
import { usePlanKit } from '../api/plan-kit.ts';
import { KitPlanView } from './kit-plan-view.tsx';

const HOLDS = [
  { value: '60', label: '1 hour' },
  { value: '240', label: '4 hours' },
  { value: '480', label: '8 hours' },
  { value: '1440', label: '24 hours' },
];

const FIELDS = ['partTypeId', 'complementPartTypeId', 'mode', 'setSize', 'setsWanted', 'hfeTolerancePct', 'vbeToleranceMv', 'holdMinutes', 'note'];

interface Values {
  partTypeId: string;
  complementPartTypeId: string;
  mode: MatchMode;
  setSize: string;
  setsWanted: string;
  hfeTolerancePct: string;
  vbeToleranceMv: string;
  holdMinutes: string;
  note: string;
}

const numberOrNaN = (s: string) => (s.trim() === '' ? Number.NaN : Number(s));

/**
 * The matched-set request: part type(s), set size, sets wanted, mode and tolerances (defaults
 * from the part type, the definition stated). "Plan" shows what the stock makes now; "Reserve"
 * plans again and reserves in one step.
 */
export function KitRequestForm({ stock, onReserved }: { stock: PairingStockRow[]; onReserved: (kit: KitDetail) => void }) {
  const [v, setV] = useState<Values>({ partTypeId: '', complementPartTypeId: '', mode: 'same', setSize: '2', setsWanted: '4', hfeTolerancePct: '', vbeToleranceMv: '', holdMinutes: '240', note: '' });
  const plan = usePlanKit();
  const reserve = useCreateKit();
  // A new plan takes the focus (its headline), so it is read out and Tab goes on to reserving; the
  // Plan button, disabled while busy, would otherwise drop the focus to the page.
  const resultRef = useRef<HTMLParagraphElement>(null);
  useEffect(() => {
    if (plan.data) resultRef.current?.focus();
  }, [plan.data]);
  // A refused reservation takes the focus to why (the Reserve button, disabled while busy, would
  // drop it to the page): the notice, or the reserve form's first field in error.
  const refusedRef = useRef<HTMLDivElement>(null);
  const reserveFormRef = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (!reserve.error) return;
    const target = refusedRef.current ?? reserveFormRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]');
    target?.focus();
  }, [reserve.error]);
  const error = (reserve.error ?? plan.error) as Error | null;
  const apiErr = error instanceof ApiError ? error : null;
  const fe = (f: string) => apiErr?.fieldError(f);
  const first = stock.find((s) => String(s.id) === v.partTypeId);
  const complements = stock.filter((s) => first && s.polarity !== first.polarity);

  const change = (patch: Partial<Values>) => {
    setV((o) => ({ ...o, ...patch }));
    plan.reset();
    reserve.reset();
  };
  const set = (k: keyof Values) => (e: { target: { value: string } }) => change({ [k]: e.target.value } as Partial<Values>);

  const body = (): KitPlanRequest => ({
    partTypeId: Number(v.partTypeId),
    ...(v.mode === 'complementary' && v.complementPartTypeId ? { complementPartTypeId: Number(v.complementPartTypeId) } : {}),
    mode: v.mode,
    setSize: Number(v.setSize) as SetSize,
    setsWanted: numberOrNaN(v.setsWanted),
    ...(v.hfeTolerancePct.trim() ? { hfeTolerancePct: numberOrNaN(v.hfeTolerancePct) } : {}),
    ...(v.vbeToleranceMv.trim() ? { vbeToleranceMv: numberOrNaN(v.vbeToleranceMv) } : {}),
  });

  const p = plan.data;
  const reservable = p && p.setsPossible > 0;
  const reserveCount = p ? Math.min(p.setsWanted, p.setsPossible) : 0;

  return (
    <div className="flex flex-col gap-4">
      <form
        aria-label="Matched-set request"
        className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4"
        onSubmit={(e) => {
          e.preventDefault();
          reserve.reset();
          plan.mutate(body());
        }}
      >
        <SelectField
          label="Part type"
          value={v.partTypeId}
          error={fe('partTypeId')}
          onChange={(e) => {
            const pt = stock.find((s) => String(s.id) === e.target.value);
            change({
              partTypeId: e.target.value,
              complementPartTypeId: '',
              ...(pt ? { hfeTolerancePct: String(pt.matchHfePct), vbeToleranceMv: String(pt.matchVbeMv) } : {}),
            });
          }}
          options={[
            { value: '', label: stock.length ? 'Choose a part type' : 'No parts in positioned stock' },
            ...stock.map((s) => ({ value: String(s.id), label: `${s.partNumber} — ${s.polarity}, ${s.inStock} in stock` })),
          ]}
        />
        <SelectField
          label="Mode"
          value={v.mode}
          error={fe('mode')}
          onChange={(e) => change({ mode: e.target.value as MatchMode, setSize: e.target.value === 'complementary' ? '2' : v.setSize, complementPartTypeId: '' })}
          options={(['same', 'complementary'] as const).map((m) => ({ value: m, label: MATCH_MODE_LABELS[m] }))}
        />
        {v.mode === 'complementary' ? (
          <SelectField
            label="Complementary part type"
            hint="The opposite polarity"
            value={v.complementPartTypeId}
            error={fe('complementPartTypeId')}
            onChange={(e) => {
              const c = stock.find((s) => String(s.id) === e.target.value);
              change({
                complementPartTypeId: e.target.value,
                ...(c && first ? { hfeTolerancePct: String(Math.min(first.matchHfePct, c.matchHfePct)), vbeToleranceMv: String(Math.min(first.matchVbeMv, c.matchVbeMv)) } : {}),
              });
            }}
            options={[{ value: '', label: first ? 'Choose the complement' : 'Choose the part type first' }, ...complements.map((s) => ({ value: String(s.id), label: `${s.partNumber} — ${s.polarity}, ${s.inStock} in stock` }))]}
          />
        ) : (
          <SelectField
            label="Set size"
            value={v.setSize}
            error={fe('setSize')}
            onChange={set('setSize')}
            options={[
              { value: '2', label: 'Pairs (2)' },
              { value: '4', label: 'Quads (4)' },
            ]}
          />
        )}
        <TextField label="Sets wanted" type="number" min={1} max={500} value={v.setsWanted} onChange={set('setsWanted')} error={fe('setsWanted')} />
        <TextField
          label="hFE tolerance t (%)"
          hint={`${HFE_TOLERANCE_DEFINITION}; every pair of a set`}
          type="number"
          step="0.1"
          min={0}
          value={v.hfeTolerancePct}
          onChange={set('hfeTolerancePct')}
          error={fe('hfeTolerancePct')}
          placeholder="part type default"
        />
        <TextField
          label="Vbe tolerance v (mV)"
          hint={`|Vbe1 − Vbe2| ≤ v${v.mode === 'complementary' ? ', on |Vbe|' : ''}; at 25 °C`}
          type="number"
          step="0.1"
          min={0}
          value={v.vbeToleranceMv}
          onChange={set('vbeToleranceMv')}
          error={fe('vbeToleranceMv')}
          placeholder="part type default"
        />
        <div className="flex items-end sm:col-span-2">
          <Button type="submit" variant="primary" busy={plan.isPending} disabled={!v.partTypeId}>
            Plan
          </Button>
        </div>
      </form>
      {error && !FIELDS.some((f) => fe(f)) && (
        <div ref={reserve.error ? refusedRef : undefined} tabIndex={-1} className="rounded-md" data-testid={reserve.error ? "reserve-refused" : "plan-failed"}>
          <Notice tone="fail" title={reserve.error ? 'Nothing was reserved' : 'The plan could not be made'}>
            {error.message}
          </Notice>
        </div>
      )}
      {reserve.error && apiErr?.fieldError('setsWanted') && (
        <div ref={refusedRef} tabIndex={-1} className="rounded-md" data-testid="reserve-refused">
          <Notice tone="fail" title="Nothing was reserved">
            {apiErr.problem.detail}
          </Notice>
        </div>
      )}
      {p && <KitPlanView plan={p} resultRef={resultRef} />}
      {reservable && (
        <form
          ref={reserveFormRef}
          aria-label="Reserve the plan"
          className="grid items-end gap-3 rounded-lg border border-copper bg-copper-light/40 p-3 sm:grid-cols-[12rem_1fr_auto]"
          onSubmit={(e) => {
            e.preventDefault();
            reserve.mutate(
              { ...body(), setsWanted: reserveCount, holdMinutes: Number(v.holdMinutes), ...(v.note.trim() ? { note: v.note.trim() } : {}) },
              { onSuccess: onReserved },
            );
          }}
        >
          <SelectField label="Hold the parts for" value={v.holdMinutes} onChange={set('holdMinutes')} error={fe('holdMinutes')} options={HOLDS} />
          <TextField label="Note (optional)" value={v.note} onChange={(e) => setV((o) => ({ ...o, note: e.target.value }))} error={fe('note')} maxLength={300} placeholder="What the sets are for" />
          <Button type="submit" variant="primary" busy={reserve.isPending}>
            Reserve {reserveCount} {Number(v.setSize) === 2 ? (reserveCount === 1 ? 'pair' : 'pairs') : reserveCount === 1 ? 'quad' : 'quads'}
          </Button>
        </form>
      )}
    </div>
  );
}
