import type { GainBin, PartHfeLimits } from '../../../../shared/domain/binning/index.ts';

const SHADES = ['bg-copper/80', 'bg-copper/55', 'bg-copper/35'];

/**
 * The bins drawn on an hFE axis between the part's limits (or the bins' own ends when a limit
 * is open), so gaps and overlaps show at a glance. Decorative: the table carries the numbers.
 */
export function BinStrip({ bins, limits }: { bins: readonly GainBin[]; limits: PartHfeLimits }) {
  const finite = bins.filter((b) => Number.isFinite(b.hfeMin) && Number.isFinite(b.hfeMax) && b.hfeMax > b.hfeMin);
  if (finite.length === 0) return null;
  const lo = Math.min(limits.hfeMin ?? Infinity, ...finite.map((b) => b.hfeMin));
  const hi = Math.max(limits.hfeMax ?? -Infinity, ...finite.map((b) => b.hfeMax));
  const span = hi - lo || 1;
  const pct = (v: number) => `${((v - lo) / span) * 100}%`;
  return (
    <div aria-hidden className="select-none">
      <div className="relative h-7 rounded border border-rule bg-paper">
        {limits.hfeMin !== null && <div className="absolute inset-y-0 w-0.5 bg-ink" style={{ left: pct(limits.hfeMin) }} />}
        {limits.hfeMax !== null && <div className="absolute inset-y-0 w-0.5 bg-ink" style={{ left: `calc(${pct(limits.hfeMax)} - 2px)` }} />}
        {finite.map((b, i) => {
          const overlaps = finite.some((o, j) => j !== i && b.hfeMin < o.hfeMax && o.hfeMin < b.hfeMax);
          return (
            <div
              key={`${b.code}-${i}`}
              title={`${b.code}: ${b.hfeMin}–${b.hfeMax}`}
              className={`absolute inset-y-1 flex items-center justify-center overflow-hidden rounded-sm border border-panel text-[11px] font-bold text-white ${overlaps ? 'bg-fail/80' : SHADES[i % SHADES.length]}`}
              style={{ left: pct(b.hfeMin), width: `calc(${pct(b.hfeMax)} - ${pct(b.hfeMin)})` }}
            >
              {b.code}
            </div>
          );
        })}
      </div>
      <div className="num mt-0.5 flex justify-between text-[11px] text-ink-faint">
        <span>hFE {lo}</span>
        <span>{hi}</span>
      </div>
    </div>
  );
}
