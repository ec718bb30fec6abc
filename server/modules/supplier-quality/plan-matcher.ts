import { solveMaxPairs } from '../../../shared/domain/matching/pair-solver.ts';
import type { PlanPart, SetMatcher } from '../../../shared/domain/planning/index.ts';

/**
 * The matching that order-quantity planning runs on every simulated lot.
 * INTERIM: pairs use the exact pair solver of shared/domain/matching directly; quads pair the
 * pairs (a two-stage approximation). To be replaced by matchSets once it is exported.
 */
export const planMatcher: SetMatcher = (parts, t) => {
  const order = parts.map((_, i) => i).sort((a, b) => (parts[a] as PlanPart).hfe - (parts[b] as PlanPart).hfe);
  const h = Float64Array.from(order, (i) => (parts[i] as PlanPart).hfe);
  const v = Float64Array.from(order, (i) => (parts[i] as PlanPart).vbeMv);
  const first = solveMaxPairs({ n: h.length, hLo: h, hHi: h, vLo: v, vHi: v, group: null, hfeTolerancePct: t.hfeTolerancePct, vbeToleranceMv: t.vbeToleranceMv });
  const used = new Uint8Array(parts.length);
  if (t.setSize === 2) {
    for (const [a, b] of first.pairs) used[a] = used[b] = 1;
    const leftover: number[] = [];
    for (let i = 0; i < order.length; i++) if (!used[i]) leftover.push(order[i] as number);
    return { sets: first.pairs.length, leftover };
  }
  const pairs = first.pairs
    .map(([a, b]) => ({ a, b, hLo: Math.min(h[a] as number, h[b] as number), hHi: Math.max(h[a] as number, h[b] as number), vLo: Math.min(v[a] as number, v[b] as number), vHi: Math.max(v[a] as number, v[b] as number) }))
    .sort((x, y) => x.hLo - y.hLo);
  const second = solveMaxPairs({
    n: pairs.length,
    hLo: Float64Array.from(pairs, (p) => p.hLo),
    hHi: Float64Array.from(pairs, (p) => p.hHi),
    vLo: Float64Array.from(pairs, (p) => p.vLo),
    vHi: Float64Array.from(pairs, (p) => p.vHi),
    group: null,
    hfeTolerancePct: t.hfeTolerancePct,
    vbeToleranceMv: t.vbeToleranceMv,
  });
  for (const [x, y] of second.pairs) {
    for (const p of [pairs[x], pairs[y]]) used[p!.a] = used[p!.b] = 1;
  }
  const leftover: number[] = [];
  for (let i = 0; i < order.length; i++) if (!used[i]) leftover.push(order[i] as number);
  return { sets: second.pairs.length, leftover };
};
