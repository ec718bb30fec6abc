import { CartesianGrid, ComposedChart, Line, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { HistogramData } from '../../../../shared/api/bias.ts';

const COPPER = '#b5652b';
const FAIL = '#b3261e';

/**
 * A histogram on a numeric axis (each class drawn from its lower to its upper edge), with an
 * optional marked line — the saturation limit on the VCE histogram.
 */
export function FitHistogram({ data, unit, scale, label, line }: { data: HistogramData; unit: string; scale: number; label: string; line?: { x: number; text: string } }) {
  const edges = data.edges.map((e) => e * scale);
  const points = data.counts.map((c, i) => ({ x: ((edges[i] as number) + (edges[i + 1] as number)) / 2, count: c, from: edges[i] as number, to: edges[i + 1] as number }));
  const lo0 = Math.min(edges[0] as number, line ? line.x * scale : Infinity);
  const hi0 = Math.max(edges[edges.length - 1] as number, line ? line.x * scale : -Infinity);
  const pad = (hi0 - lo0) * 0.05 || 1;
  const domain: [number, number] = [lo0 - pad, hi0 + pad];
  const maxCount = Math.max(1, ...data.counts);
  const digits = hi0 - lo0 < 1 ? 3 : hi0 - lo0 < 10 ? 2 : 1;
  return (
    <figure aria-label={label} className="w-full">
      <div className="h-64 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={points} margin={{ top: 22, right: 16, bottom: 16, left: 0 }}>
            <CartesianGrid stroke="#e6e3da" vertical={false} />
            <XAxis
              type="number"
              dataKey="x"
              domain={domain}
              allowDataOverflow
              tick={{ fontSize: 12 }}
              tickCount={8}
              tickFormatter={(v: number) => v.toFixed(digits)}
              label={{ value: unit, position: 'insideBottomRight', offset: -8, fontSize: 12 }}
            />
            <YAxis domain={[0, Math.ceil(maxCount * 1.1)]} allowDecimals={false} tick={{ fontSize: 12 }} width={44} />
            {points.map((p) =>
              p.count > 0 ? <ReferenceArea key={p.from} x1={p.from} x2={p.to} y1={0} y2={p.count} fill={COPPER} fillOpacity={0.85} stroke="#8f4c1d" strokeWidth={0.5} ifOverflow="visible" /> : null,
            )}
            {line && (
              <ReferenceLine
                x={line.x * scale}
                stroke={FAIL}
                strokeWidth={2}
                strokeDasharray="6 4"
                ifOverflow="extendDomain"
                label={{ value: line.text, position: 'top', fill: FAIL, fontSize: 12, fontWeight: 600 }}
              />
            )}
            <Line dataKey="count" stroke="transparent" dot={false} activeDot={{ r: 4, fill: COPPER }} isAnimationActive={false} />
            <Tooltip
              formatter={(value) => [String(value), 'parts']}
              labelFormatter={(_l, payload) => {
                const p = payload?.[0]?.payload as { from: number; to: number } | undefined;
                return p ? `${p.from.toFixed(digits)} – ${p.to.toFixed(digits)} ${unit}` : '';
              }}
            />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 flex flex-wrap gap-4 text-xs text-ink-soft">
        <span>
          <span aria-hidden className="mr-1 inline-block h-2.5 w-3 align-middle" style={{ background: COPPER }} />
          parts per class (Freedman–Diaconis)
        </span>
        {line && (
          <span>
            <span aria-hidden className="mr-1 inline-block w-4 border-t-2 border-dashed align-middle" style={{ borderColor: FAIL }} />
            {line.text}
          </span>
        )}
      </figcaption>
    </figure>
  );
}
