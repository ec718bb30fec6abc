import { CartesianGrid, Legend, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { PartScorecard } from '../../../../shared/api/supplier-quality.ts';

/** Each lot gets its own line style as well as its own shade, so the lots stay apart without colour. */
const STYLES = [
  { stroke: '#1f2a33', dash: undefined, width: 2.5 },
  { stroke: '#b5652b', dash: '8 4', width: 2 },
  { stroke: '#2b5f8f', dash: '2 3', width: 2 },
  { stroke: '#6b4f8f', dash: '10 3 2 3', width: 2 },
];

/**
 * hFE distributions of the last lots overlaid as step lines on common classes (% of each lot's
 * readings), with the part's hFE limits.
 */
export function DistributionChart({ distributions, limits }: { distributions: NonNullable<PartScorecard['distributions']>; limits: { hfeMin: number | null; hfeMax: number | null } }) {
  const { edges, lots } = distributions;
  // One row per class edge; the step line holds each class's value from its lower edge on.
  const data = edges.map((e, i) => {
    const row: Record<string, number> = { x: Math.round(e * 10) / 10 };
    lots.forEach((l, j) => (row[`l${j}`] = i < l.percent.length ? l.percent[i]! : (l.percent[l.percent.length - 1] ?? 0)));
    return row;
  });
  return (
    <figure aria-label={`hFE distribution of the last ${lots.length} lots`} className="w-full">
      <div className="h-64 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ top: 10, right: 16, bottom: 8, left: 0 }}>
            <CartesianGrid stroke="#e6e3da" vertical={false} />
            <XAxis type="number" dataKey="x" domain={['dataMin', 'dataMax']} tick={{ fontSize: 12 }} />
            <YAxis unit=" %" tick={{ fontSize: 12 }} width={48} />
            <Tooltip formatter={(v) => (typeof v === 'number' ? `${v.toFixed(1)} %` : String(v))} labelFormatter={(l) => `hFE from ${l}`} />
            <Legend
              wrapperStyle={{ fontSize: 12 }}
              content={() => (
                <ul className="flex flex-wrap justify-center gap-x-4 gap-y-1 text-xs text-ink">
                  {lots.map((l, j) => {
                    const st = STYLES[j % STYLES.length]!;
                    return (
                      <li key={l.lotId} className="flex items-center gap-1.5">
                        <svg width="30" height="8" aria-hidden>
                          <line x1="0" y1="4" x2="30" y2="4" stroke={st.stroke} strokeWidth={st.width} strokeDasharray={st.dash} />
                        </svg>
                        {l.code} (n {l.n})
                      </li>
                    );
                  })}
                </ul>
              )}
            />
            {([limits.hfeMin, limits.hfeMax] as const).map((v, i) =>
              v === null ? null : (
                <ReferenceLine key={v} x={v} stroke="#b3261e" strokeDasharray="6 4" ifOverflow="extendDomain" label={{ value: `${i === 0 ? 'min' : 'max'} ${v}`, fontSize: 11, fill: '#b3261e', position: i === 0 ? 'insideTopLeft' : 'insideTopRight' }} />
              ),
            )}
            {lots.map((l, j) => {
              const s = STYLES[j % STYLES.length]!;
              return (
                <Line
                  key={l.lotId}
                  name={`${l.code} (n ${l.n})`}
                  type="stepAfter"
                  dataKey={`l${j}`}
                  stroke={s.stroke}
                  strokeDasharray={s.dash}
                  strokeWidth={s.width}
                  dot={false}
                  isAnimationActive={false}
                />
              );
            })}
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 text-xs text-ink-soft">Share of each lot’s sampled parts per hFE class (at 25 °C); the lines differ in pattern as well as shade.</figcaption>
    </figure>
  );
}
