import { Bar, BarChart, CartesianGrid, Cell, LabelList, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { OUTSIDE_BINS_CODE, type StockPartType } from '../../../../shared/api/bins.ts';
import { binColour } from '../../../../shared/domain/binning/index.ts';
import { binInterval, BinChip } from './bin-chip.tsx';

/**
 * Stock per bin of one part type as bars in the bins' colours; every bar is labelled with its
 * code and count, and the same numbers are listed under the chart, so colour is never needed.
 */
export function StockChart({ part }: { part: StockPartType }) {
  const data = part.bins.map((b) => ({
    key: b.code ?? OUTSIDE_BINS_CODE,
    quantity: b.quantity,
    fill: binColour(b.code === null ? null : b.index).fill,
    tag: `${b.code ?? OUTSIDE_BINS_CODE} · ${b.quantity.toLocaleString()}`,
    label: b.label,
    interval: binInterval(b),
  }));
  const max = Math.max(1, ...data.map((d) => d.quantity));
  return (
    <figure aria-label={`Stock of ${part.partNumber} per gain bin`} className="w-full">
      <div className="h-56 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={data} margin={{ top: 24, right: 12, bottom: 4, left: 0 }}>
            <CartesianGrid stroke="#e6e3da" vertical={false} />
            <XAxis dataKey="key" tick={{ fontSize: 13, fontWeight: 700 }} />
            <YAxis allowDecimals={false} domain={[0, Math.ceil(max * 1.15)]} tick={{ fontSize: 12 }} width={48} />
            <Tooltip
              formatter={(value) => [`${String(value)} parts`, 'in stock']}
              labelFormatter={(_l, payload) => {
                const p = payload?.[0]?.payload as { key: string; label: string; interval: string } | undefined;
                return p ? `${p.key} — ${p.label} (${p.interval})` : '';
              }}
            />
            <Bar dataKey="quantity" isAnimationActive={false} stroke="#1f2a33" strokeWidth={0.5}>
              {data.map((d) => (
                <Cell key={d.key} fill={d.fill} />
              ))}
              <LabelList dataKey="tag" position="top" style={{ fontSize: 12, fontWeight: 700, fill: '#1f2a33' }} />
            </Bar>
          </BarChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-soft">
        {part.bins.map((b) => (
          <span key={b.code ?? OUTSIDE_BINS_CODE} className="inline-flex items-center gap-1">
            <BinChip bin={b} showLabel={false} />
            {b.label}: <span className="num font-semibold text-ink">{b.quantity.toLocaleString()}</span> in {b.containers.length} container{b.containers.length === 1 ? '' : 's'}
          </span>
        ))}
      </figcaption>
    </figure>
  );
}
