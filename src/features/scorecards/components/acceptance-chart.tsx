import { Bar, CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { PartScorecard } from '../../../../shared/api/supplier-quality.ts';

/** Lots disposed per month of receipt (bars) and the share accepted (line with points, right axis). */
export function AcceptanceChart({ acceptance }: { acceptance: PartScorecard['acceptance'] }) {
  const data = acceptance.map((m) => ({ ...m, ratePct: m.rate === null ? null : Math.round(m.rate * 1000) / 10 }));
  return (
    <figure aria-label="Lot acceptance rate per month" className="w-full">
      <div className="h-56 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ top: 10, right: 8, bottom: 8, left: 0 }}>
            <CartesianGrid stroke="#e6e3da" vertical={false} />
            <XAxis dataKey="month" tick={{ fontSize: 11 }} />
            <YAxis yAxisId="n" allowDecimals={false} tick={{ fontSize: 12 }} width={32} />
            <YAxis yAxisId="pct" orientation="right" domain={[0, 100]} unit=" %" tick={{ fontSize: 12 }} width={48} />
            <Tooltip />
            <Legend wrapperStyle={{ fontSize: 12 }} formatter={(value) => <span style={{ color: '#1f2a33' }}>{value}</span>} />
            <Bar yAxisId="n" name="Lots disposed" dataKey="disposed" fill="#c9c4b5" isAnimationActive={false} />
            <Line yAxisId="pct" name="Accepted (%)" dataKey="ratePct" stroke="#2f7a47" strokeWidth={2} dot={{ r: 4 }} isAnimationActive={false} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
