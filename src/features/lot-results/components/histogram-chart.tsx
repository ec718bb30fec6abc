import { CartesianGrid, ComposedChart, Line, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { LotSummary } from '../../../../shared/api/lot-results.ts';

const COPPER = '#b5652b';
const FAIL = '#b3261e';
const INFO = '#2b5f8f';

/**
 * hFE histogram at 25 °C on a true numeric axis: each class is drawn as an area from its lower
 * to its upper edge, the part's limits as red dashed lines, the gain-bin edges as blue dotted lines.
 */
export function HistogramChart({ summary }: { summary: LotSummary }) {
  const { edges, counts } = summary.histogram;
  const limits = [summary.limits.hfeMin, summary.limits.hfeMax].filter((v): v is number => v !== null);
  const binEdges = summary.bins.length ? [...new Set([summary.bins[0].hfeMin, ...summary.bins.map((b) => b.hfeMax)])] : [];
  const lo0 = Math.min(edges[0], ...limits, ...binEdges);
  const hi0 = Math.max(edges[edges.length - 1], ...limits, ...binEdges);
  const pad = (hi0 - lo0) * 0.04 || 1;
  const domain: [number, number] = [Math.floor(lo0 - pad), Math.ceil(hi0 + pad)];
  const maxCount = Math.max(1, ...counts);
  const points = counts.map((c, i) => ({ x: (edges[i] + edges[i + 1]) / 2, count: c, from: edges[i], to: edges[i + 1] }));

  return (
    <figure aria-label={`hFE histogram, ${summary.n} parts, ${summary.histogram.rule} classes`} className="w-full">
      <div className="h-72 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={points} margin={{ top: 22, right: 16, bottom: 8, left: 0 }}>
            <CartesianGrid stroke="#e6e3da" vertical={false} />
            <XAxis type="number" dataKey="x" domain={domain} allowDataOverflow tick={{ fontSize: 12 }} tickCount={9} />
            <YAxis domain={[0, Math.ceil(maxCount * 1.08)]} allowDecimals={false} tick={{ fontSize: 12 }} width={48} />
            {points.map((p) =>
              p.count > 0 ? <ReferenceArea key={p.from} x1={p.from} x2={p.to} y1={0} y2={p.count} fill={COPPER} fillOpacity={0.85} stroke="#8f4c1d" strokeWidth={0.5} ifOverflow="visible" /> : null,
            )}
            {binEdges.map((e) => (
              <ReferenceLine key={`bin-${e}`} x={e} stroke={INFO} strokeDasharray="2 3" ifOverflow="extendDomain" label={{ value: String(e), position: 'insideTopLeft', fill: INFO, fontSize: 11 }} />
            ))}
            {limits.map((v, i) => (
              <ReferenceLine
                key={`lim-${v}`}
                x={v}
                stroke={FAIL}
                strokeWidth={2}
                strokeDasharray="6 4"
                ifOverflow="extendDomain"
                label={{ value: `${limits.length === 2 ? (i === 0 ? 'min' : 'max') : summary.limits.hfeMin !== null ? 'min' : 'max'} ${v}`, position: 'top', fill: FAIL, fontSize: 12, fontWeight: 600 }}
              />
            ))}
            <Line dataKey="count" stroke="transparent" dot={false} activeDot={{ r: 4, fill: COPPER }} isAnimationActive={false} />
            <Tooltip
              formatter={(value) => [String(value), 'parts']}
              labelFormatter={(_l, payload) => {
                const p = payload?.[0]?.payload as { from: number; to: number } | undefined;
                return p ? `hFE ${p.from.toFixed(1)} – ${p.to.toFixed(1)}` : '';
              }}
            />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 flex flex-wrap gap-4 text-xs text-ink-soft">
        <span>
          <span aria-hidden className="mr-1 inline-block h-2.5 w-3 align-middle" style={{ background: COPPER }} />
          parts per class ({summary.histogram.rule})
        </span>
        <span>
          <span aria-hidden className="mr-1 inline-block w-4 border-t-2 border-dashed align-middle" style={{ borderColor: FAIL }} />
          hFE limits
        </span>
        {binEdges.length > 0 && (
          <span>
            <span aria-hidden className="mr-1 inline-block w-4 border-t-2 border-dotted align-middle" style={{ borderColor: INFO }} />
            gain-bin edges
          </span>
        )}
      </figcaption>
    </figure>
  );
}
