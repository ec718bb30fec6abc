import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { OrderPlanJob } from '../../../../shared/api/supplier-quality.ts';
import { Notice } from '../../../components/ui/notice.tsx';
import { Loading } from '../../../components/ui/page.tsx';

/** Progress while the simulation runs; then the quantity, the confidence curve and the leftovers per gain bin. */
export function OrderPlanResult({ job }: { job: OrderPlanJob }) {
  const req = job.request;
  if (job.status === 'running') {
    const fraction = job.progress.total ? job.progress.done / job.progress.total : 0;
    return (
      <div className="flex flex-col gap-2" data-testid="plan-progress">
        <Loading label={job.progress.phase === 'simulating' ? `Simulating lot ${job.progress.done} of ${job.progress.total}…` : `Counting leftovers: ${job.progress.done} of ${job.progress.total}…`} />
        <progress className="h-2 w-full accent-copper" max={1} value={fraction} aria-label="Simulation progress" />
      </div>
    );
  }
  if (job.status === 'failed') return <Notice tone="fail" title="The plan failed">{job.error}</Notice>;
  const r = job.result!;
  const setWord = req.setSize === 2 ? 'pairs' : 'quads';
  const curve = r.curve.map((c) => ({ quantity: c.quantity, pct: Math.round(c.probability * 1000) / 10 }));
  const leftoverTotal = r.leftovers.reduce((a, l) => a + l.expected, 0);
  return (
    <div className="flex flex-col gap-4" data-testid="plan-result">
      {r.quantity !== null ? (
        <div className="rounded-lg border-l-4 border-pass bg-pass-light px-4 py-3">
          <p className="text-2xl font-bold text-ink">
            Buy <span className="num">{r.quantity}</span> parts
          </p>
          <p className="text-sm text-ink-soft">
            for at least {r.setsWanted} {setWord} within {req.hfeTolerancePct} % hFE and {req.vbeToleranceMv} mV Vbe with {(r.probability! * 100).toFixed(1)} % of simulated lots (asked: {req.confidencePct} %). Expected {setWord} from that quantity: {r.expectedSets?.toFixed(1)}.
          </p>
        </div>
      ) : (
        <Notice tone="hold" title="Not reachable">
          Even {r.maxQuantity} parts do not give {r.setsWanted} {setWord} in {req.confidencePct} % of simulated lots ({r.unreachable} of {r.simulations} simulated lots fell short). Loosen the tolerance or split the order.
        </Notice>
      )}
      {curve.length > 0 && (
        <figure aria-label="Probability of at least N sets against the quantity bought">
          <div className="h-64 w-full">
            <ResponsiveContainer width="100%" height="100%">
              <LineChart data={curve} margin={{ top: 22, right: 16, bottom: 16, left: 0 }}>
                <CartesianGrid stroke="#e6e3da" />
                <XAxis type="number" dataKey="quantity" domain={['dataMin', 'dataMax']} tick={{ fontSize: 12 }} label={{ value: 'parts bought', position: 'insideBottom', offset: -8, fontSize: 12 }} />
                <YAxis domain={[0, 100]} unit=" %" tick={{ fontSize: 12 }} width={52} />
                <Tooltip formatter={(v) => [`${v} %`, `P(≥ ${r.setsWanted} ${setWord})`]} labelFormatter={(l) => `${l} parts`} />
                <ReferenceLine y={req.confidencePct} stroke="#2b5f8f" strokeDasharray="2 3" label={{ value: `${req.confidencePct} %`, fontSize: 11, fill: '#2b5f8f', position: 'insideTopLeft' }} />
                {r.quantity !== null && <ReferenceLine x={r.quantity} stroke="#2f7a47" strokeDasharray="6 4" label={{ value: `${r.quantity}`, fontSize: 11, fill: '#2f7a47', position: 'top' }} />}
                <Line type="stepAfter" dataKey="pct" stroke="#b5652b" strokeWidth={2} dot={false} isAnimationActive={false} />
              </LineChart>
            </ResponsiveContainer>
          </div>
          <figcaption className="text-xs text-ink-soft">
            Share of {r.simulations} simulated lots that reach {r.setsWanted} {setWord} at each quantity (step curve). Dotted: the confidence asked; dashed: the answer.
          </figcaption>
        </figure>
      )}
      {r.leftovers.length > 0 && (
        <table className="w-full max-w-md text-sm">
          <caption className="mb-1 text-left font-semibold text-ink">Expected parts left over, per gain bin</caption>
          <thead className="text-left text-xs uppercase tracking-wide text-ink-soft">
            <tr>
              <th scope="col" className="py-1 pr-3">Bin</th>
              <th scope="col" className="py-1 text-right">Parts (mean)</th>
            </tr>
          </thead>
          <tbody>
            {r.leftovers.map((l) => (
              <tr key={l.code ?? 'outside'} className="border-t border-rule/70">
                <td className="py-1 pr-3">{l.label}</td>
                <td className="num py-1 text-right">{l.expected.toFixed(1)}</td>
              </tr>
            ))}
            <tr className="border-t border-rule font-semibold">
              <td className="py-1 pr-3">All</td>
              <td className="num py-1 text-right">{leftoverTotal.toFixed(1)}</td>
            </tr>
          </tbody>
        </table>
      )}
      <p className="text-xs text-ink-faint">
        Method: {r.simulations} lots simulated from {job.history?.parts} measured parts of {job.history?.lots} accepted lots (smoothed bootstrap, bandwidth {r.bandwidth.hfe.toFixed(1)} hFE / {r.bandwidth.vbeMv.toFixed(2)} mV), each matched with the real matching; {r.matcherCalls} matchings in {(job.elapsedMs / 1000).toFixed(1)} s. Seed {req.seed ?? 1}.
      </p>
    </div>
  );
}
