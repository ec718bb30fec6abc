import { useState } from 'react';
import type { BiasSourcePartType, FitForUseResponse, Spread } from '../../../../shared/api/bias.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { ScrollBox } from '../../../components/ui/scroll-box.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useRunFitForUse } from '../api/run-fit-for-use.ts';
import { FitHistogram } from './fit-histogram.tsx';

const numberOrNaN = (s: string) => (s.trim() === '' ? Number.NaN : Number(s));
const STAGE_FIELDS = ['vcc', 'r1', 'r2', 're', 'rc'] as const;

function SpreadsTable({ r }: { r: FitForUseResponse }) {
  const rows: { name: string; unit: string; s: Spread; k: number; d: number }[] = [
    { name: 'IC', unit: 'mA', s: r.spreads.ic, k: 1000, d: 3 },
    { name: 'VB', unit: 'V', s: r.spreads.vb, k: 1, d: 3 },
    { name: 'VE', unit: 'V', s: r.spreads.ve, k: 1, d: 3 },
    { name: 'VC', unit: 'V', s: r.spreads.vc, k: 1, d: 3 },
    { name: 'VCE', unit: 'V', s: r.spreads.vce, k: 1, d: 3 },
    { name: 'hFE (input)', unit: '', s: r.inputs.hfe, k: 1, d: 1 },
    { name: '|Vbe| (input)', unit: 'mV', s: r.inputs.vbeV, k: 1000, d: 1 },
  ];
  return (
    <ScrollBox label="Spread over the parts" className="rounded-lg border border-rule bg-panel">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Spread over the parts</caption>
        <thead className="bg-paper text-left text-xs font-bold uppercase tracking-wide text-ink-soft">
          <tr>
            {['Quantity', 'min', '5 %', 'mean', '95 %', 'max'].map((h, i) => (
              <th key={h} scope="col" className={`px-3 py-2 ${i ? 'text-right' : ''}`}>
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((x) => (
            <tr key={x.name} className="border-t border-rule/70">
              <th scope="row" className="px-3 py-1.5 text-left font-semibold">
                {x.name} {x.unit && <span className="font-normal text-ink-faint">({x.unit})</span>}
              </th>
              {[x.s.min, x.s.p05, x.s.mean, x.s.p95, x.s.max].map((v, i) => (
                <td key={i} className="num px-3 py-1.5 text-right">
                  {(v * x.k).toFixed(x.d)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollBox>
  );
}

/**
 * The fit-for-use check: a divider-biased stage (VCC, R1, R2, RE, RC) run against the measured
 * hFE and Vbe of a lot or part type — spreads, the share that would saturate, and a histogram of
 * IC or VCE with the saturation line. A design aid; bench procedures apply.
 */
export function FitForUsePanel({ sources }: { sources: BiasSourcePartType[] }) {
  const [v, setV] = useState({ partTypeId: '', lotId: '', vcc: '12', r1: '47', r2: '10', re: '1', rc: '4.7' });
  const [show, setShow] = useState<'ic' | 'vce'>('vce');
  const run = useRunFitForUse();
  const err = run.error instanceof ApiError ? run.error : null;
  const fe = (f: string) => err?.fieldError(f) ?? err?.fieldError(`stage.${f}`);
  const set = (k: keyof typeof v) => (e: { target: { value: string } }) => {
    setV((o) => ({ ...o, [k]: e.target.value, ...(k === 'partTypeId' ? { lotId: '' } : {}) }));
    run.reset();
  };
  const pt = sources.find((s) => String(s.partTypeId) === v.partTypeId);
  const r = run.data;
  const kOhm = (s: string) => numberOrNaN(s) * 1000;

  return (
    <div className="flex flex-col gap-4">
      <form
        aria-label="Stage"
        className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4"
        onSubmit={(e) => {
          e.preventDefault();
          run.mutate({
            ...(v.lotId ? { lotId: Number(v.lotId) } : { partTypeId: Number(v.partTypeId) }),
            stage: { vcc: numberOrNaN(v.vcc), r1: kOhm(v.r1), r2: kOhm(v.r2), re: kOhm(v.re), rc: kOhm(v.rc) },
          });
        }}
      >
        <SelectField
          label="Part type"
          value={v.partTypeId}
          onChange={set('partTypeId')}
          error={fe('partTypeId')}
          options={[{ value: '', label: sources.length ? 'Choose a part type' : 'No measured parts yet' }, ...sources.map((s) => ({ value: String(s.partTypeId), label: `${s.partNumber} — ${s.polarity}, ${s.measured} measured` }))]}
        />
        <SelectField
          label="Lot"
          value={v.lotId}
          onChange={set('lotId')}
          error={fe('lotId')}
          disabled={!pt}
          options={[{ value: '', label: pt ? `All ${pt.lots.length} lots of the part type` : '—' }, ...(pt?.lots ?? []).map((l) => ({ value: String(l.lotId), label: `${l.lotCode}${l.supplierLot ? ` (${l.supplierLot})` : ''} — ${l.measured} measured` }))]}
        />
        <TextField label="VCC (V)" type="number" step="any" min={0} value={v.vcc} onChange={set('vcc')} error={fe('vcc')} />
        <div className="hidden lg:block" />
        <TextField label="R1 (kΩ)" hint="VCC to base" type="number" step="any" min={0} value={v.r1} onChange={set('r1')} error={fe('r1')} />
        <TextField label="R2 (kΩ)" hint="Base to ground" type="number" step="any" min={0} value={v.r2} onChange={set('r2')} error={fe('r2')} />
        <TextField label="RE (kΩ)" hint="Emitter to ground; 0 for none" type="number" step="any" min={0} value={v.re} onChange={set('re')} error={fe('re')} />
        <TextField label="RC (kΩ)" hint="VCC to collector; 0 for none" type="number" step="any" min={0} value={v.rc} onChange={set('rc')} error={fe('rc')} />
        {run.isError && !STAGE_FIELDS.some((f) => fe(f)) && (
          <div className="sm:col-span-2 lg:col-span-4">
            <Notice tone="fail" title="The check could not run">
              {(run.error as Error).message}
            </Notice>
          </div>
        )}
        <div className="sm:col-span-2 lg:col-span-4">
          <Button type="submit" variant="primary" busy={run.isPending} disabled={!v.partTypeId}>
            Run the check
          </Button>
        </div>
      </form>

      <Notice tone="hold" title="A design aid, not a qualification">
        The check models an ideal divider-biased stage from DC readings referred to 25 °C: no self-heating, resistor tolerance or leakage. For PNP parts the magnitudes are used with the supply
        reversed. Confirm the stage on the bench with the real circuit, following your bench's procedures and local rules — take particular care with supply voltages above 50 V.
      </Notice>

      {r && (
        <section aria-label="Fit-for-use result" className="flex flex-col gap-3">
          <div className="flex flex-wrap items-baseline gap-x-6 gap-y-1">
            <p className="text-2xl font-bold text-ink" data-testid="saturated-share">
              {r.saturatedCount} of {r.n} parts ({(r.saturatedShare * 100).toFixed(1)} %) would saturate
            </p>
            <StatusTag tone={r.saturatedCount === 0 && r.cutoffCount === 0 ? 'pass' : 'hold'}>
              {r.saturatedCount === 0 && r.cutoffCount === 0 ? 'All in the active region' : 'Not all in the active region'}
            </StatusTag>
          </div>
          <p className="text-sm text-ink-soft">
            {r.source.label} · {r.n} parts{r.source.kind === 'part-type' ? ` from ${r.source.lots} lots` : ''}
            {r.cutoffCount > 0 ? ` · ${r.cutoffCount} stay cut off (VTH below their Vbe)` : ''} · a typical part (median hFE and Vbe) sits at IC {(r.typical.ic * 1000).toFixed(3)} mA, VCE{' '}
            {r.typical.vce.toFixed(2)} V{r.typical.saturated ? ' (saturated)' : ''}
          </p>
          <SpreadsTable r={r} />
          <div className="flex gap-2" role="group" aria-label="Histogram of">
            <Button variant={show === 'vce' ? 'primary' : 'secondary'} aria-pressed={show === 'vce'} onClick={() => setShow('vce')}>
              VCE
            </Button>
            <Button variant={show === 'ic' ? 'primary' : 'secondary'} aria-pressed={show === 'ic'} onClick={() => setShow('ic')}>
              IC
            </Button>
          </div>
          {show === 'vce' ? (
            <>
              <FitHistogram data={r.histograms.vce} unit="V" scale={1} label={`VCE over ${r.n} parts`} line={{ x: r.saturationVceV, text: `saturation, VCE < ${r.saturationVceV} V` }} />
              {r.saturatedCount > 0 && (
                <p className="text-xs text-ink-soft">
                  The {r.saturatedCount} saturated part{r.saturatedCount === 1 ? ' is' : 's are'} drawn at VCE = {r.saturationVceV} V, where the model holds them.
                </p>
              )}
            </>
          ) : (
            <FitHistogram data={r.histograms.ic} unit="mA" scale={1000} label={`IC over ${r.n} parts`} />
          )}
          <p className="text-xs text-ink-faint">
            VTH = VCC·R2/(R1+R2), RTH = R1∥R2, IB = (VTH − VBE)/(RTH + (β+1)RE), IC = β·IB; a part counts as saturated when VCE would fall below {r.saturationVceV} V.
          </p>
        </section>
      )}
    </div>
  );
}
