import { type PairItems, forEachCompatiblePair, itemsCompatible } from './items.ts';
import { mismatchScale, solveMaxPairs } from './pair-solver.ts';
import { hfeSpreadPct, setMismatch } from './tolerance.ts';

/** Components up to this many parts are solved exactly by search over subsets (2^16 states). */
export const EXACT_QUAD_COMPONENT = 16;

export interface QuadSolution {
  /** Sets of four item indices. */
  readonly quads: [number, number, number, number][];
  /** True when every component was solved exactly. */
  readonly optimal: boolean;
  /** Proven upper bound on the number of quads (equals quads.length when optimal). */
  readonly upperBound: number;
  readonly exactComponents: number;
  readonly heuristicComponents: number;
}

/**
 * Sets of four parts, every one of their six pairs within tolerance: as many as possible, then the
 * smallest total mismatch. Components of the compatibility graph are independent, so each is
 * solved on its own.
 *
 * - Components of at most EXACT_QUAD_COMPONENT parts: exact, by dynamic programming over subsets —
 *   the lowest remaining part is either left over or placed in one of the valid quads among the
 *   remaining parts; best = most quads, then least total (rounded) mismatch.
 * - Larger components: a stated heuristic. Pair the parts with the exact pair solver (maximum
 *   cardinality, least mismatch); treat each pair as an item spanning its two readings and pair
 *   those items with the same solver, two pairs being compatible when all four parts are
 *   (the largest pairwise spread of a set is the one between its extremes); repeat on the parts
 *   left over while it still finds quads. Not proven optimal.
 * - Upper bound for a heuristic component, min(⌊ν/2⌋, ⌊r/4⌋): ν is the maximum number of disjoint
 *   compatible pairs (computed exactly by the pair solver) — every quad holds two disjoint
 *   compatible pairs, so q quads give a matching of 2q pairs and 2q ≤ ν; r is the number of parts
 *   with at least three compatible neighbours — every part of a quad has the other three as
 *   neighbours, so 4q ≤ r.
 */
export function solveQuads(it: PairItems): QuadSolution {
  const n = it.n;
  const parent = new Int32Array(n);
  for (let i = 0; i < n; i++) parent[i] = i;
  const find = (x: number): number => {
    let r = x;
    while (parent[r] !== r) r = parent[r] as number;
    while (parent[x] !== r) {
      const next = parent[x] as number;
      parent[x] = r;
      x = next;
    }
    return r;
  };
  const degree = new Int32Array(n);
  forEachCompatiblePair(it, (a, b) => {
    degree[a]++;
    degree[b]++;
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
  });
  const members = new Map<number, number[]>();
  for (let i = 0; i < n; i++) {
    const r = find(i);
    const list = members.get(r);
    if (list) list.push(i);
    else members.set(r, [i]);
  }

  const quads: [number, number, number, number][] = [];
  let upperBound = 0;
  let exactComponents = 0;
  let heuristicComponents = 0;
  for (const comp of members.values()) {
    if (comp.length < 4) continue;
    if (comp.length <= EXACT_QUAD_COMPONENT) {
      const found = exactQuads(it, comp);
      quads.push(...found);
      upperBound += found.length;
      exactComponents++;
    } else {
      const { found, bound } = heuristicQuads(it, comp, degree);
      quads.push(...found);
      upperBound += bound;
      heuristicComponents++;
    }
  }
  return { quads, optimal: heuristicComponents === 0, upperBound, exactComponents, heuristicComponents };
}

/** Integer (rounded) mismatch of the union of the given items, as the pair solver rounds it. */
function unionCost(it: PairItems, idx: readonly number[], scale: number): number {
  let hlo = Infinity;
  let hhi = -Infinity;
  let vlo = Infinity;
  let vhi = -Infinity;
  for (const i of idx) {
    hlo = Math.min(hlo, it.hLo[i] as number);
    hhi = Math.max(hhi, it.hHi[i] as number);
    vlo = Math.min(vlo, it.vLo[i] as number);
    vhi = Math.max(vhi, it.vHi[i] as number);
  }
  return Math.round(setMismatch(hfeSpreadPct(hlo, hhi), vhi - vlo, it.hfeTolerancePct, it.vbeToleranceMv) * scale);
}

function exactQuads(it: PairItems, comp: readonly number[]): [number, number, number, number][] {
  const m = comp.length;
  const scale = mismatchScale(it.n);
  const adj = new Int32Array(m);
  for (let i = 0; i < m; i++) {
    for (let j = i + 1; j < m; j++) {
      if (itemsCompatible(it, comp[i] as number, comp[j] as number)) {
        adj[i] = (adj[i] as number) | (1 << j);
        adj[j] = (adj[j] as number) | (1 << i);
      }
    }
  }
  // Valid quads, listed under their lowest member.
  const byLowest: { mask: number; cost: number }[][] = [];
  for (let i = 0; i < m; i++) {
    const list: { mask: number; cost: number }[] = [];
    for (let j = i + 1; j < m; j++) {
      if (!((adj[i] as number) & (1 << j))) continue;
      for (let k = j + 1; k < m; k++) {
        if (!((adj[i] as number) & (adj[j] as number) & (1 << k))) continue;
        for (let l = k + 1; l < m; l++) {
          if (!((adj[i] as number) & (adj[j] as number) & (adj[k] as number) & (1 << l))) continue;
          const members = [comp[i], comp[j], comp[k], comp[l]] as number[];
          list.push({ mask: (1 << i) | (1 << j) | (1 << k) | (1 << l), cost: unionCost(it, members, scale) });
        }
      }
    }
    byLowest.push(list);
  }
  // value = quads · BIG − Σcost, maximised; BIG exceeds any total cost (≤ (m/4)·2·scale).
  const BIG = 16 * scale;
  const size = 1 << m;
  const value = new Float64Array(size).fill(NaN);
  const choice = new Int32Array(size);
  value[0] = 0;
  const solve = (mask: number): number => {
    const known = value[mask] as number;
    if (!Number.isNaN(known)) return known;
    const low = 31 - Math.clz32(mask & -mask);
    let best = solve(mask & ~(1 << low));
    let pick = 0;
    for (const q of byLowest[low] as { mask: number; cost: number }[]) {
      if ((q.mask & mask) !== q.mask) continue;
      const v = solve(mask & ~q.mask) + BIG - q.cost;
      if (v > best) {
        best = v;
        pick = q.mask;
      }
    }
    value[mask] = best;
    choice[mask] = pick;
    return best;
  };
  let mask = size - 1;
  solve(mask);
  const out: [number, number, number, number][] = [];
  while (mask !== 0) {
    const low = 31 - Math.clz32(mask & -mask);
    const pick = choice[mask] as number;
    if (pick === 0) {
      mask &= ~(1 << low);
      continue;
    }
    const members: number[] = [];
    for (let i = 0; i < m; i++) if (pick & (1 << i)) members.push(comp[i] as number);
    out.push(members as [number, number, number, number]);
    mask &= ~pick;
  }
  return out;
}

function subItems(it: PairItems, idx: readonly number[]): PairItems {
  // idx ascending keeps the hLo order of the parent.
  const pick = (a: Float64Array): Float64Array => Float64Array.from(idx, (i) => a[i] as number);
  return {
    n: idx.length,
    hLo: pick(it.hLo),
    hHi: pick(it.hHi),
    vLo: pick(it.vLo),
    vHi: pick(it.vHi),
    group: null,
    hfeTolerancePct: it.hfeTolerancePct,
    vbeToleranceMv: it.vbeToleranceMv,
  };
}

function heuristicQuads(
  it: PairItems,
  comp: readonly number[],
  degree: Int32Array,
): { found: [number, number, number, number][]; bound: number } {
  let rich = 0;
  for (const i of comp) if ((degree[i] as number) >= 3) rich++;
  const found: [number, number, number, number][] = [];
  let left = comp.slice();
  let nu = -1;
  for (;;) {
    const parts = subItems(it, left);
    const pairs = solveMaxPairs(parts).pairs;
    if (nu < 0) nu = pairs.length;
    // Each pair as one item spanning its two parts, sorted by its lower hFE.
    const spans = pairs
      .map(([a, b]) => ({
        a: left[a] as number,
        b: left[b] as number,
        hLo: Math.min(parts.hLo[a] as number, parts.hLo[b] as number),
        hHi: Math.max(parts.hHi[a] as number, parts.hHi[b] as number),
        vLo: Math.min(parts.vLo[a] as number, parts.vLo[b] as number),
        vHi: Math.max(parts.vHi[a] as number, parts.vHi[b] as number),
      }))
      .sort((x, y) => x.hLo - y.hLo);
    const pairItems: PairItems = {
      n: spans.length,
      hLo: Float64Array.from(spans, (s) => s.hLo),
      hHi: Float64Array.from(spans, (s) => s.hHi),
      vLo: Float64Array.from(spans, (s) => s.vLo),
      vHi: Float64Array.from(spans, (s) => s.vHi),
      group: null,
      hfeTolerancePct: it.hfeTolerancePct,
      vbeToleranceMv: it.vbeToleranceMv,
    };
    const quadPairs = solveMaxPairs(pairItems).pairs;
    if (quadPairs.length === 0) break;
    const used = new Set<number>();
    for (const [x, y] of quadPairs) {
      const p = spans[x] as { a: number; b: number };
      const q = spans[y] as { a: number; b: number };
      const quad = [p.a, p.b, q.a, q.b].sort((u, v) => u - v) as [number, number, number, number];
      found.push(quad);
      for (const i of quad) used.add(i);
    }
    left = left.filter((i) => !used.has(i));
    if (left.length < 4) break;
  }
  return { found, bound: Math.min(Math.floor(nu / 2), Math.floor(rich / 4)) };
}
