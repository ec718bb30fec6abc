import { useState } from 'react';
import { HFE_TOLERANCE_DEFINITION, MATCH_MODE_LABELS, type MatchMode, type PairingPreviewResponse, type SetSize } from '../../../../shared/api/pairing.ts';
import type { Polarity } from '../../../../shared/api/catalog.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ScrollBox } from '../../../components/ui/scroll-box.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { usePreviewPairing } from '../api/preview-pairing.ts';

interface Row {
  key: number;
  id: string;
  polarity: Polarity;
  hfe: string;
  vbeMv: string;
}

const cell = 'rounded border bg-panel px-2 py-1 text-sm text-ink focus:border-copper focus:outline-none aria-[invalid=true]:border-fail';
const numberOrNaN = (s: string) => (s.trim() === '' ? Number.NaN : Number(s));

let nextKey = 1;
const blank = (n: number, polarity: Polarity = 'NPN'): Row => ({ key: nextKey++, id: `Q${n}`, polarity, hfe: '', vbeMv: '' });

/**
 * Loose parts an assembler measured by hand: a small editable table (id, polarity, hFE, Vbe),
 * the tolerances, and the matched sets the server finds among them. Nothing is stored.
 */
export function LoosePartsForm() {
  const [rows, setRows] = useState<Row[]>(() => [1, 2, 3, 4].map((n) => blank(n)));
  const [opts, setOpts] = useState({ hfeTolerancePct: '5', vbeToleranceMv: '2', setSize: '2', mode: 'same' as MatchMode });
  const preview = usePreviewPairing();
  const err = preview.error instanceof ApiError ? preview.error : null;
  const fe = (f: string) => err?.fieldError(f);
  const edit = (key: number, patch: Partial<Row>) => {
    setRows((rs) => rs.map((r) => (r.key === key ? { ...r, ...patch } : r)));
    preview.reset();
  };
  const setOpt = (k: keyof typeof opts) => (e: { target: { value: string } }) => {
    setOpts((o) => ({ ...o, [k]: e.target.value, ...(k === 'mode' && e.target.value === 'complementary' ? { setSize: '2' } : {}) }));
    preview.reset();
  };
  const result: PairingPreviewResponse | undefined = preview.data;
  const label = (id: string | number) => String(id);

  return (
    <div className="flex flex-col gap-4">
      <form
        aria-label="Loose parts"
        className="flex flex-col gap-4"
        onSubmit={(e) => {
          e.preventDefault();
          preview.mutate({
            parts: rows.map((r) => ({ id: r.id.trim(), polarity: r.polarity, hfe: numberOrNaN(r.hfe), vbeMv: numberOrNaN(r.vbeMv) })),
            hfeTolerancePct: numberOrNaN(opts.hfeTolerancePct),
            vbeToleranceMv: numberOrNaN(opts.vbeToleranceMv),
            setSize: Number(opts.setSize) as SetSize,
            mode: opts.mode,
          });
        }}
      >
        <ScrollBox label="Hand-measured parts" className="max-w-2xl rounded-lg border border-rule bg-panel">
          <table className="w-full border-collapse text-sm">
            <caption className="sr-only">Hand-measured parts</caption>
            <thead className="bg-paper text-left text-xs font-bold uppercase tracking-wide text-ink-soft">
              <tr>
                <th scope="col" className="px-2 py-2">
                  Part id
                </th>
                <th scope="col" className="px-2 py-2">
                  Polarity
                </th>
                <th scope="col" className="px-2 py-2">
                  hFE
                </th>
                <th scope="col" className="px-2 py-2">
                  Vbe (mV)
                </th>
                <th scope="col" className="px-2 py-2">
                  <span className="sr-only">Remove</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r, i) => {
                const e = (f: string) => fe(`parts[${i}].${f}`);
                const rowErr = e('id') ?? e('polarity') ?? e('hfe') ?? e('vbeMv');
                return (
                  <tr key={r.key} className="border-t border-rule/70 align-top">
                    <td className="px-2 py-1">
                      <input aria-label={`Part ${i + 1} id`} className={`${cell} w-28 font-mono border-rule`} value={r.id} aria-invalid={Boolean(e('id')) || undefined} onChange={(x) => edit(r.key, { id: x.target.value })} />
                    </td>
                    <td className="px-2 py-1">
                      <select aria-label={`Part ${i + 1} polarity`} className={`${cell} w-24 border-rule`} value={r.polarity} onChange={(x) => edit(r.key, { polarity: x.target.value as Polarity })}>
                        <option value="NPN">NPN</option>
                        <option value="PNP">PNP</option>
                      </select>
                    </td>
                    <td className="px-2 py-1">
                      <input
                        aria-label={`Part ${i + 1} hFE`}
                        inputMode="decimal"
                        className={`${cell} w-28 border-rule`}
                        value={r.hfe}
                        aria-invalid={Boolean(e('hfe')) || undefined}
                        onChange={(x) => edit(r.key, { hfe: x.target.value })}
                      />
                    </td>
                    <td className="px-2 py-1">
                      <input
                        aria-label={`Part ${i + 1} Vbe`}
                        inputMode="decimal"
                        className={`${cell} w-28 border-rule`}
                        value={r.vbeMv}
                        aria-invalid={Boolean(e('vbeMv')) || undefined}
                        onChange={(x) => edit(r.key, { vbeMv: x.target.value })}
                      />
                      {rowErr && (
                        <p className="mt-0.5 text-xs font-semibold text-fail" role="alert">
                          ✕ {rowErr}
                        </p>
                      )}
                    </td>
                    <td className="px-2 py-1">
                      <Button
                        type="button"
                        variant="quiet"
                        aria-label={`Remove part ${i + 1}`}
                        disabled={rows.length <= 1}
                        onClick={() => {
                          setRows((rs) => rs.filter((x) => x.key !== r.key));
                          preview.reset();
                        }}
                      >
                        ✕
                      </Button>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </ScrollBox>
        <div>
          <Button
            type="button"
            onClick={() => {
              setRows((rs) => [...rs, blank(rs.length + 1, rs[rs.length - 1]?.polarity)]);
              preview.reset();
            }}
          >
            Add a part
          </Button>
        </div>
        <div className="grid gap-3 sm:grid-cols-4">
          <SelectField label="Mode" value={opts.mode} onChange={setOpt('mode')} error={fe('mode')} options={(['same', 'complementary'] as const).map((m) => ({ value: m, label: MATCH_MODE_LABELS[m] }))} />
          <SelectField
            label="Set size"
            value={opts.setSize}
            onChange={setOpt('setSize')}
            error={fe('setSize')}
            disabled={opts.mode === 'complementary'}
            options={[
              { value: '2', label: 'Pairs (2)' },
              { value: '4', label: 'Quads (4)' },
            ]}
          />
          <TextField label="hFE tolerance t (%)" hint={HFE_TOLERANCE_DEFINITION} type="number" step="0.1" min={0} value={opts.hfeTolerancePct} onChange={setOpt('hfeTolerancePct')} error={fe('hfeTolerancePct')} />
          <TextField label="Vbe tolerance v (mV)" hint="|Vbe1 − Vbe2| ≤ v" type="number" step="0.1" min={0} value={opts.vbeToleranceMv} onChange={setOpt('vbeToleranceMv')} error={fe('vbeToleranceMv')} />
        </div>
        {preview.isError && !err?.problem.errors?.length && (
          <Notice tone="fail" title="No answer">
            {(preview.error as Error).message}
          </Notice>
        )}
        {err?.problem.errors?.length ? (
          <Notice tone="fail" title="Check the marked fields">
            {err.problem.detail}
          </Notice>
        ) : null}
        <div>
          <Button type="submit" variant="primary" busy={preview.isPending}>
            Find matched sets
          </Button>
        </div>
      </form>

      {result && (
        <section aria-label="Matched sets among the loose parts" className="flex flex-col gap-2">
          <p className="text-lg font-bold text-ink" data-testid="loose-sets">
            {result.sets.length} {Number(opts.setSize) === 2 ? (result.sets.length === 1 ? 'pair' : 'pairs') : result.sets.length === 1 ? 'quad' : 'quads'} within tolerance
          </p>
          {result.sets.length > 0 && (
            <ScrollBox label="Matched sets" className="rounded-lg border border-rule bg-panel">
              <table className="w-full border-collapse text-sm">
                <caption className="sr-only">Matched sets</caption>
                <thead className="bg-paper text-left text-xs font-bold uppercase tracking-wide text-ink-soft">
                  <tr>
                    <th className="px-3 py-2">Parts</th>
                    <th className="px-3 py-2 text-right">hFE spread</th>
                    <th className="px-3 py-2 text-right">ΔVbe</th>
                    <th className="px-3 py-2">Mirror IC1/IC2</th>
                    <th className="px-3 py-2">Diff-pair offset</th>
                    <th className="px-3 py-2">hFE ratio</th>
                  </tr>
                </thead>
                <tbody>
                  {result.sets.map((s) => (
                    <tr key={s.partIds.join('+')} className="border-t border-rule/70">
                      <td className="px-3 py-1.5 font-mono font-semibold">{s.partIds.map(label).join(' + ')}</td>
                      <td className="num px-3 py-1.5 text-right">{s.hfeSpreadPct.toFixed(2)} %</td>
                      <td className="num px-3 py-1.5 text-right">{s.vbeSpreadMv.toFixed(2)} mV</td>
                      <td className="num px-3 py-1.5">
                        {s.meaning.mirrorRatio.toFixed(4)} ({s.meaning.mirrorErrorPct.toFixed(2)} %)
                      </td>
                      <td className="num px-3 py-1.5">{s.meaning.offsetMv.toFixed(2)} mV</td>
                      <td className="num px-3 py-1.5">{s.meaning.hfeRatio.toFixed(3)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </ScrollBox>
          )}
          <p className="text-sm text-ink-soft">{result.unmatched.length ? `Left over: ${result.unmatched.map(label).join(', ')}.` : 'Every part is in a set.'}</p>
          <p className="text-xs text-ink-faint">
            The most sets first, then the smallest total mismatch ({result.method}). Mirror ratio exp(ΔVbe/VT) at 25 °C for equal saturation currents; a differential pair's input offset equals ΔVbe.
            Readings taken by hand at another temperature should be referred to 25 °C first.
          </p>
        </section>
      )}
    </div>
  );
}
