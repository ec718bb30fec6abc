import { useState } from 'react';
import type { HistogramRuleParam, LotSummary } from '../../../../shared/api/lot-results.ts';
import { Loading, Panel, EmptyState } from '../../../components/ui/page.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { ScrollBox } from '../../../components/ui/scroll-box.tsx';
import { useLotSummary } from '../api/get-lot-summary.ts';
import { HistogramChart } from './histogram-chart.tsx';

const f = (v: number | null, d = 1) => (v === null ? '–' : v.toFixed(d));

const RULES: { value: HistogramRuleParam; label: string }[] = [
  { value: 'freedman-diaconis', label: 'Freedman–Diaconis' },
  { value: 'scott', label: 'Scott' },
  { value: 'sturges', label: 'Sturges' },
  { value: 'bins', label: 'Gain bins' },
];

function StatsTable({ s }: { s: LotSummary }) {
  const rows = [
    { name: 'hFE', q: s.hfe, cp: s.hfe.cp, cpk: s.hfe.cpk },
    { name: 'Vbe (mV)', q: s.vbeMv, cp: s.vbeMv.cp, cpk: s.vbeMv.cpk },
  ];
  return (
    <ScrollBox label="Lot statistics at 25 °C">
      <table className="w-full border-collapse text-sm" aria-label="Lot statistics at 25 °C">
        <thead>
          <tr className="border-b border-rule text-right text-xs font-bold uppercase tracking-wide text-ink-soft">
            <th className="px-2 py-1 text-left" />
            {['mean', 's', 'min', 'p5', 'median', 'p95', 'max', 'Cp', 'Cpk'].map((h) => (
              <th key={h} className="px-2 py-1">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.name} className="border-b border-rule/60 text-right">
              <th scope="row" className="px-2 py-1 text-left font-semibold">
                {r.name}
              </th>
              {[r.q.mean, r.q.sd, r.q.min, r.q.p05, r.q.median, r.q.p95, r.q.max].map((v, i) => (
                <td key={i} className="num px-2 py-1">
                  {f(v, i === 1 ? 2 : 1)}
                </td>
              ))}
              <td className="num px-2 py-1">{f(r.cp, 2)}</td>
              <td className={`num px-2 py-1 ${r.cpk !== null && r.cpk < 1.33 ? 'font-semibold text-hold' : ''}`}>{f(r.cpk, 2)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollBox>
  );
}

/** Statistics of the lot's readings at 25 °C, the hFE histogram with limits and bin edges, and the yield per gain bin. */
export function LotSummaryPanel({ lotId }: { lotId: number }) {
  const [rule, setRule] = useState<HistogramRuleParam>('freedman-diaconis');
  const q = useLotSummary(lotId, rule);
  return (
    <Panel title="Lot results">
      {q.isLoading ? (
        <Loading label="Computing the statistics…" />
      ) : q.isError ? (
        <Notice tone="fail" title="The statistics could not be computed">{(q.error as Error).message}</Notice>
      ) : !q.data || q.data.n === 0 ? (
        <EmptyState title="No readings yet">Statistics and the histogram appear as soon as parts are measured.</EmptyState>
      ) : (
        <div className="flex flex-col gap-4" data-testid="lot-summary">
          <div className="flex flex-wrap items-center gap-3 text-sm">
            <span className="num text-base font-semibold text-ink">{q.data.n.toLocaleString()} {q.data.n === 1 ? 'part' : 'parts'}</span>
            {q.data.outsideLimits > 0 ? (
              <StatusTag tone="fail">
                {q.data.outsideLimits} outside limits (hFE low {q.data.outsideBy.hfeLow}, high {q.data.outsideBy.hfeHigh}; Vbe low {q.data.outsideBy.vbeLow}, high {q.data.outsideBy.vbeHigh})
              </StatusTag>
            ) : (
              <StatusTag tone="pass">all within limits</StatusTag>
            )}
            {q.data.normality && (
              <span className="text-ink-soft">
                Anderson–Darling A*² {q.data.normality.a2Star.toFixed(3)}, p {q.data.normality.pValueBand}: {q.data.normality.normalAt5 ? 'normality not rejected at 5 %' : 'not normal at 5 % — look for mixed date codes'}
              </span>
            )}
            <span className="text-xs text-ink-faint">values referred to {q.data.referenceTempC} °C · computed in {q.data.computedMs} ms</span>
          </div>
          <StatsTable s={q.data} />
          <div>
            <div className="mb-1 flex flex-wrap items-center justify-between gap-2">
              <h3 className="text-sm font-bold text-ink">hFE histogram</h3>
              <label className="flex items-center gap-2 text-sm text-ink-soft">
                Classes
                <select value={rule} onChange={(e) => setRule(e.target.value as HistogramRuleParam)} className="rounded border border-rule bg-panel px-2 py-1 text-sm">
                  {RULES.filter((r) => r.value !== 'bins' || q.data.bins.length > 0).map((r) => (
                    <option key={r.value} value={r.value}>
                      {r.label}
                    </option>
                  ))}
                </select>
              </label>
            </div>
            <HistogramChart summary={q.data} />
          </div>
          {q.data.bins.length > 0 && (
            <ScrollBox label="Yield per gain bin">
              <table className="w-full max-w-xl border-collapse text-sm" aria-label="Yield per gain bin">
                <thead>
                  <tr className="border-b border-rule text-left text-xs font-bold uppercase tracking-wide text-ink-soft">
                    <th className="px-2 py-1">Bin</th>
                    <th className="px-2 py-1">hFE</th>
                    <th className="px-2 py-1 text-right">Parts</th>
                    <th className="px-2 py-1 text-right">Yield</th>
                  </tr>
                </thead>
                <tbody>
                  {q.data.bins.map((b) => (
                    <tr key={b.code} className="border-b border-rule/60">
                      <td className="px-2 py-1 font-semibold">
                        {b.code} <span className="font-normal text-ink-soft">{b.label}</span>
                      </td>
                      <td className="num px-2 py-1">
                        {b.hfeMin} – {b.hfeMax}
                      </td>
                      <td className="num px-2 py-1 text-right">{b.count.toLocaleString()}</td>
                      <td className="num px-2 py-1 text-right">{b.yieldPct.toFixed(1)} %</td>
                    </tr>
                  ))}
                  <tr>
                    <td className="px-2 py-1 text-ink-soft" colSpan={2}>
                      outside all bins
                    </td>
                    <td className="num px-2 py-1 text-right">{q.data.outsideBins.toLocaleString()}</td>
                    <td className="num px-2 py-1 text-right">{((100 * q.data.outsideBins) / q.data.n).toFixed(1)} %</td>
                  </tr>
                </tbody>
              </table>
            </ScrollBox>
          )}
        </div>
      )}
    </Panel>
  );
}
