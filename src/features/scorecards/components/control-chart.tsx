import { CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { PartScorecard } from '../../../../shared/api/supplier-quality.ts';

const INK = '#1f2a33';
const COPPER = '#b5652b';
const FAIL = '#b3261e';
const INFO = '#2b5f8f';

type Chart = NonNullable<PartScorecard['chart']>;

/** A lot's point: a filled circle; hollow when the lot was not accepted; a red square when outside the limits. */
function LotDot(props: { cx?: number; cy?: number; payload?: { outside: boolean; accepted: boolean } }) {
  const { cx, cy, payload } = props;
  if (cx === undefined || cy === undefined || !payload) return null;
  if (payload.outside) return <rect x={cx - 4.5} y={cy - 4.5} width={9} height={9} fill={FAIL} stroke={FAIL} />;
  return <circle cx={cx} cy={cy} r={4} fill={payload.accepted ? COPPER : '#fff'} stroke={COPPER} strokeWidth={2} />;
}

/**
 * X̄ or s chart of a part's lots in time order: the lot values, the centre line and the control
 * limits (per lot when the sample sizes differ).
 */
export function ControlChart({ chart, which }: { chart: Chart; which: 'xbar' | 's' }) {
  const data = chart.points.map((p) => {
    const lim = which === 'xbar' ? p.xbar : p.s;
    const value = which === 'xbar' ? p.mean : p.sd;
    return { code: p.code, value, ucl: lim.ucl, lcl: lim.lcl, centre: lim.centre, n: p.n, accepted: p.accepted, outside: which === 'xbar' ? p.outsideXbar : p.outsideS };
  });
  const label = which === 'xbar' ? 'Lot mean hFE' : 'Lot standard deviation of hFE';
  return (
    <figure aria-label={`${label} with control limits, ${data.length} lots`} className="w-full">
      <div className="h-64 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ top: 10, right: 16, bottom: 8, left: 0 }}>
            <CartesianGrid stroke="#e6e3da" vertical={false} />
            <XAxis dataKey="code" tick={{ fontSize: 10 }} interval="preserveStartEnd" />
            <YAxis tick={{ fontSize: 12 }} width={52} domain={['auto', 'auto']} />
            <Tooltip formatter={(v) => (typeof v === 'number' ? v.toFixed(1) : String(v))} />
            <Legend wrapperStyle={{ fontSize: 12 }} formatter={(value) => <span style={{ color: '#1f2a33' }}>{value}</span>} />
            <Line name="UCL" type="stepAfter" dataKey="ucl" stroke={FAIL} strokeDasharray="6 4" dot={false} isAnimationActive={false} />
            <Line name="Centre" type="stepAfter" dataKey="centre" stroke={INFO} strokeDasharray="2 3" dot={false} isAnimationActive={false} />
            <Line name="LCL" type="stepAfter" dataKey="lcl" stroke={FAIL} strokeDasharray="6 4" dot={false} isAnimationActive={false} />
            <Line name={label} type="linear" dataKey="value" stroke={INK} strokeWidth={1.5} dot={<LotDot />} isAnimationActive={false} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 text-xs text-ink-soft">
        {which === 'xbar' ? 'X̄ chart' : 's chart'}: limits from the {chart.referenceLots} accepted lots of the period
        {chart.method === 'variable-n' ? ' (sample sizes differ: limits per lot from the pooled σ̂ and each lot’s n)' : ' (NIST/SEMATECH §6.3.2 constants)'}. ● accepted lot, ○ lot not accepted, ■ outside the limits.
      </figcaption>
    </figure>
  );
}
