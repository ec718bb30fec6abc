import type { ReactNode } from 'react';
import type { PartScorecard, ScorecardLot } from '../../../../shared/api/supplier-quality.ts';
import { StatusTag } from '../../../components/ui/notice.tsx';
import { EmptyState, Panel } from '../../../components/ui/page.tsx';
import { ScrollBox } from '../../../components/ui/scroll-box.tsx';
import { AcceptanceChart } from './acceptance-chart.tsx';
import { ControlChart } from './control-chart.tsx';
import { DistributionChart } from './distribution-chart.tsx';
import { FiguresStrip } from './figures-strip.tsx';
import { num } from './format.ts';

const STATUS_TONE: Record<string, 'pass' | 'fail' | 'hold' | 'neutral'> = { accepted: 'pass', rejected: 'fail', mrb: 'hold' };

/** One part type of a supplier's scorecard: figures, control charts, acceptance over time, distributions and the lots. */
export function PartScorecardView({ part, lotActions }: { part: PartScorecard; lotActions?: (lot: ScorecardLot) => ReactNode }) {
  const p = part.partType;
  return (
    <section aria-labelledby={`part-${p.id}`} className="flex flex-col gap-4">
      <h2 id={`part-${p.id}`} className="text-lg font-bold text-ink">
        {p.partNumber} <span className="text-sm font-normal text-ink-soft">{p.polarity} · {p.description} · hFE limits {p.hfeMin ?? 'open'}–{p.hfeMax ?? 'open'}</span>
      </h2>
      <Panel>
        <FiguresStrip f={part.figures} />
        {part.severityReason && <p className="mt-2 text-xs text-ink-soft">Switching state: {part.severityReason}</p>}
      </Panel>
      <div className="grid gap-4 xl:grid-cols-2">
        <Panel title="Lot mean hFE (X̄ chart)">
          {part.chart ? <ControlChart chart={part.chart} which="xbar" /> : <EmptyState title="Control limits need two accepted lots with readings" />}
        </Panel>
        <Panel title="Spread within lots (s chart)">
          {part.chart ? <ControlChart chart={part.chart} which="s" /> : <EmptyState title="Control limits need two accepted lots with readings" />}
        </Panel>
        <Panel title="Lot acceptance over time">
          {part.acceptance.length ? <AcceptanceChart acceptance={part.acceptance} /> : <EmptyState title="No lot disposed in the period" />}
        </Panel>
        <Panel title="hFE distribution of the last lots">
          {part.distributions ? <DistributionChart distributions={part.distributions} limits={p} /> : <EmptyState title="No disposed lot with at least five readings" />}
        </Panel>
      </div>
      <Panel title="Lots">
        <ScrollBox label={`Lots of ${p.partNumber}`}>
          {/* At least 40rem wide: on a phone the table scrolls sideways instead of breaking lot codes over lines. */}
          <table className="w-full min-w-[40rem] text-sm">
            <caption className="sr-only">Lots of {p.partNumber} in the period</caption>
            <thead className="text-left text-xs uppercase tracking-wide text-ink-soft">
              <tr>
                {['Lot', 'Received', 'Date code', 'Status', 'n', 'Mean hFE', 'sd', 'Outside limits', 'CoC on time', ''].map((h) => (
                  <th key={h} scope="col" className="py-1 pr-3">
                    {h}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {part.lots.map((l) => (
                <tr key={l.lotId} className="border-t border-rule/70">
                  <td className="num whitespace-nowrap py-1.5 pr-3 font-semibold">{l.code}</td>
                  <td className="py-1.5 pr-3">{new Date(l.receivedAt).toLocaleDateString()}</td>
                  <td className="num py-1.5 pr-3">{l.dateCode ?? '—'}</td>
                  <td className="py-1.5 pr-3">
                    <StatusTag tone={STATUS_TONE[l.status] ?? 'neutral'}>{l.status}</StatusTag>
                    {l.alertId !== null && (
                      <span className="ml-1">
                        <StatusTag tone="hold">drift alert</StatusTag>
                      </span>
                    )}
                  </td>
                  <td className="num py-1.5 pr-3">{l.n}</td>
                  <td className="num py-1.5 pr-3">{num(l.mean)}</td>
                  <td className="num py-1.5 pr-3">{num(l.sd)}</td>
                  <td className="num py-1.5 pr-3">{l.defects}</td>
                  <td className="py-1.5 pr-3">{l.cocOnTime ? '✓ yes' : '✕ no'}</td>
                  <td className="py-1.5">{lotActions?.(l)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollBox>
      </Panel>
    </section>
  );
}
