import { VBE_SLACK_MV, hfeSpreadPct, hfeWithinTolerance, setMismatch, vbeWithinTolerance } from './tolerance.ts';

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

/**
 * round(itemsMismatch · scale) of items a and b, or −1 when they are not compatible: the two
 * calls in one, for the scans that test many candidates (the same arithmetic, so the same costs).
 */
export function itemsCost(it: PairItems, a: number, b: number, scale: number): number {
  if (it.group !== null && it.group[a] === it.group[b]) return -1;
  const vlo = Math.min(it.vLo[a] as number, it.vLo[b] as number);
  const vhi = Math.max(it.vHi[a] as number, it.vHi[b] as number);
  if (!vbeWithinTolerance(vlo, vhi, it.vbeToleranceMv)) return -1;
  const lo = Math.min(it.hLo[a] as number, it.hLo[b] as number);
  const hi = Math.max(it.hHi[a] as number, it.hHi[b] as number);
  if (!hfeWithinTolerance(lo, hi, it.hfeTolerancePct)) return -1;
  return Math.round(setMismatch(hfeSpreadPct(lo, hi), vhi - vlo, it.hfeTolerancePct, it.vbeToleranceMv) * scale);
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
 * Items grouped by Vbe: bucket i holds the items whose vLo lies in [key·w, (key+1)·w) with
 * w = vbeToleranceMv + 4·VBE_SLACK_MV, each bucket's items in ascending index (= ascending hLo).
 * Two compatible items have |vLo_a − vLo_b| ≤ vbeToleranceMv + VBE_SLACK_MV < w, so they sit in
 * the same or adjacent buckets: a neighbour search visits three buckets' hFE windows instead of
 * the whole hFE window (with 1 mV tolerance on a 5 mV spread, about a sixth of it).
 */
export interface VbeBuckets {
  /** Items of bucket i: members[start[i]] … members[start[i + 1] − 1]. */
  readonly start: Int32Array;
  readonly members: Int32Array;
  /** Per item: its bucket, and its position in members. */
  readonly bucketOf: Int32Array;
  readonly slot: Int32Array;
  /** Per bucket: the bucket holding key − 1 and key + 1, or −1. */
  readonly below: Int32Array;
  readonly above: Int32Array;
}

export function vbeBuckets(it: PairItems): VbeBuckets {
  const n = it.n;
  const width = it.vbeToleranceMv + 4 * VBE_SLACK_MV;
  const key = new Float64Array(n);
  for (let a = 0; a < n; a++) key[a] = Math.floor((it.vLo[a] as number) / width);
  // Items in key order, ties by index: a counting sort when the keys span a modest range (the usual
  // case: tens of millivolts in 1 mV buckets), a comparison sort otherwise.
  let kMin = Infinity;
  let kMax = -Infinity;
  for (let a = 0; a < n; a++) {
    const k = key[a] as number;
    if (k < kMin) kMin = k;
    if (k > kMax) kMax = k;
  }
  let byKey: Int32Array;
  if (n > 0 && kMax - kMin < 4 * n + 1024) {
    const span = kMax - kMin + 1;
    const at = new Int32Array(span + 1);
    for (let a = 0; a < n; a++) at[(key[a] as number) - kMin + 1]++;
    for (let k = 0; k < span; k++) at[k + 1] = (at[k + 1] as number) + (at[k] as number);
    byKey = new Int32Array(n);
    for (let a = 0; a < n; a++) byKey[at[(key[a] as number) - kMin]++ as number] = a;
  } else {
    byKey = Int32Array.from({ length: n }, (_, a) => a).sort((x, y) => (key[x] as number) - (key[y] as number) || x - y);
  }
  const bucketOf = new Int32Array(n);
  const slot = new Int32Array(n);
  const starts: number[] = [];
  const keys: number[] = [];
  for (let s = 0; s < n; s++) {
    const a = byKey[s] as number;
    if (s === 0 || key[a] !== key[byKey[s - 1] as number]) {
      starts.push(s);
      keys.push(key[a] as number);
    }
    bucketOf[a] = starts.length - 1;
    slot[a] = s;
  }
  starts.push(n);
  const nb = keys.length;
  const below = new Int32Array(nb).fill(-1);
  const above = new Int32Array(nb).fill(-1);
  for (let i = 0; i + 1 < nb; i++) {
    if (keys[i + 1] === (keys[i] as number) + 1) {
      above[i] = i + 1;
      below[i + 1] = i;
    }
  }
  return { start: Int32Array.from(starts), members: byKey, bucketOf, slot, below, above };
}

/** First position in bucket i (of bk) whose item index is greater than a. */
export function firstAfter(bk: VbeBuckets, i: number, a: number): number {
  let lo = bk.start[i] as number;
  let hi = bk.start[i + 1] as number;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((bk.members[mid] as number) > a) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

/**
 * Appends to out every item b compatible with item a. Items are sorted by hLo, so each scan
 * stops at the first item whose hLo is already out of hFE tolerance (the ratio test grows
 * monotonically away from a); only the hFE windows of a's Vbe bucket and its two neighbours are
 * visited (vbeBuckets), never all n items.
 */
export function collectNeighbours(it: PairItems, bk: VbeBuckets, a: number, out: number[]): number[] {
  const t = it.hfeTolerancePct;
  const ha = it.hLo[a] as number;
  const hha = it.hHi[a] as number;
  const own = bk.bucketOf[a] as number;
  for (const i of [bk.below[own] as number, own, bk.above[own] as number]) {
    if (i < 0) continue;
    const from = firstAfter(bk, i, a);
    const end = bk.start[i + 1] as number;
    for (let s = from; s < end; s++) {
      const b = bk.members[s] as number;
      if (!hfeWithinTolerance(ha, it.hLo[b] as number, t)) break;
      if (itemsCompatible(it, a, b)) out.push(b);
    }
    const first = bk.start[i] as number;
    for (let s = (i === own ? (bk.slot[a] as number) : from) - 1; s >= first; s--) {
      const b = bk.members[s] as number;
      if (!hfeWithinTolerance(it.hLo[b] as number, hha, t)) break;
      if (itemsCompatible(it, a, b)) out.push(b);
    }
  }
  return out;
}

/** Calls visit(a, b) once for every compatible pair a < b, scanning only the buckets' hFE windows. */
export function forEachCompatiblePair(it: PairItems, visit: (a: number, b: number) => void, bk: VbeBuckets = vbeBuckets(it)): void {
  const t = it.hfeTolerancePct;
  for (let a = 0; a < it.n; a++) {
    const ha = it.hLo[a] as number;
    const own = bk.bucketOf[a] as number;
    for (let r = 0; r < 3; r++) {
      const i = r === 0 ? own : r === 1 ? (bk.below[own] as number) : (bk.above[own] as number);
      if (i < 0) continue;
      const end = bk.start[i + 1] as number;
      for (let s = i === own ? (bk.slot[a] as number) + 1 : firstAfter(bk, i, a); s < end; s++) {
        const b = bk.members[s] as number;
        if (!hfeWithinTolerance(ha, it.hLo[b] as number, t)) break;
        if (itemsCompatible(it, a, b)) visit(a, b);
      }
    }
  }
}
