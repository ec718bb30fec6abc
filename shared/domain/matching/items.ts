import { hfeSpreadPct, hfeWithinTolerance, setMismatch, vbeWithinTolerance } from './tolerance.ts';

/**
 * Things to be paired: single parts (lo = hi) or already-formed pairs (the range of their two
 * parts), sorted by hLo ascending. Two items are compatible when the union of their readings is
 * within both tolerances — for single parts that is the pair test, for two pairs it is "every one
 * of the six pairs of the four parts is within tolerance", because the largest pairwise spread of a
 * set is the one between its extremes.
 */
export interface PairItems {
  readonly n: number;
  readonly hLo: Float64Array;
  readonly hHi: Float64Array;
  readonly vLo: Float64Array;
  readonly vHi: Float64Array;
  /** For bipartite problems: an item may only pair with an item of the other group. */
  readonly group: Uint8Array | null;
  readonly hfeTolerancePct: number;
  readonly vbeToleranceMv: number;
}

export function itemsCompatible(it: PairItems, a: number, b: number): boolean {
  if (it.group !== null && it.group[a] === it.group[b]) return false;
  const lo = Math.min(it.hLo[a] as number, it.hLo[b] as number);
  const hi = Math.max(it.hHi[a] as number, it.hHi[b] as number);
  if (!hfeWithinTolerance(lo, hi, it.hfeTolerancePct)) return false;
  const vlo = Math.min(it.vLo[a] as number, it.vLo[b] as number);
  const vhi = Math.max(it.vHi[a] as number, it.vHi[b] as number);
  return vbeWithinTolerance(vlo, vhi, it.vbeToleranceMv);
}

/** Dimensionless mismatch (setMismatch) of the union of items a and b. */
export function itemsMismatch(it: PairItems, a: number, b: number): number {
  const lo = Math.min(it.hLo[a] as number, it.hLo[b] as number);
  const hi = Math.max(it.hHi[a] as number, it.hHi[b] as number);
  const vlo = Math.min(it.vLo[a] as number, it.vLo[b] as number);
  const vhi = Math.max(it.vHi[a] as number, it.vHi[b] as number);
  return setMismatch(hfeSpreadPct(lo, hi), vhi - vlo, it.hfeTolerancePct, it.vbeToleranceMv);
}

/**
 * Appends to out every item b compatible with item a. Items are sorted by hLo, so each scan
 * stops at the first item whose hLo is already out of hFE tolerance (the ratio test grows
 * monotonically away from a); only the hFE window is visited, not all n items.
 */
export function collectNeighbours(it: PairItems, a: number, out: number[]): number[] {
  const t = it.hfeTolerancePct;
  const ha = it.hLo[a] as number;
  const hha = it.hHi[a] as number;
  for (let b = a + 1; b < it.n; b++) {
    if (!hfeWithinTolerance(ha, it.hLo[b] as number, t)) break;
    if (itemsCompatible(it, a, b)) out.push(b);
  }
  for (let b = a - 1; b >= 0; b--) {
    if (!hfeWithinTolerance(it.hLo[b] as number, hha, t)) break;
    if (itemsCompatible(it, a, b)) out.push(b);
  }
  return out;
}

/** Calls visit(a, b) once for every compatible pair a < b, scanning only hFE windows. */
export function forEachCompatiblePair(it: PairItems, visit: (a: number, b: number) => void): void {
  const t = it.hfeTolerancePct;
  for (let a = 0; a < it.n; a++) {
    const ha = it.hLo[a] as number;
    for (let b = a + 1; b < it.n; b++) {
      if (!hfeWithinTolerance(ha, it.hLo[b] as number, t)) break;
      if (itemsCompatible(it, a, b)) visit(a, b);
    }
  }
}
