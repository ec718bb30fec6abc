import { type AssignmentSolution, solveAssignment } from './assignment.ts';
import { scratchFloat64, scratchInt32 } from './buffers.ts';
import { type LazyEdges, solveMaxWeightMatching } from './blossom.ts';
import { type PairItems, collectNeighbours, firstAfter, itemsCost, itemsMismatch, vbeBuckets } from './items.ts';
import { hfeWithinTolerance } from './tolerance.ts';

/** Cheapest compatible edges per item in the graph of the LP relaxation (step 3). */
const NARROW = 8;
/** … and in the graph the blossom algorithm starts from (step 4). */
const WIDE = 16;

export interface PairSolution {
  /** Matched item pairs [a, b] with a < b. */
  readonly pairs: [number, number][];
  /** LP rounds (sparse graph grown until the relaxation's duals held on the full graph). */
  readonly rounds: number;
  /** Edges the solver ended up holding. */
  readonly edgesSolved: number;
}

/** Scale of the integer mismatch used as edge cost: q = round(mismatch · S), mismatch ∈ [0, 2]. */
export function mismatchScale(n: number): number {
  // Keeps every dual below 2^53 (they stay under ~16·n·S): exact integer arithmetic in doubles.
  return 2 ** Math.max(10, Math.min(26, 47 - Math.ceil(Math.log2(n + 2))));
}

/**
 * The largest number of disjoint compatible pairs of items and, among those, the smallest total
 * mismatch — exact for the mismatch rounded to 1/S (S = mismatchScale(n), 2^-26 ≈ 1.5·10⁻⁸ up to
 * two million items).
 *
 * Method, and why it is exact:
 * 1. Objective: minimise Σq + P·(unmatched items), q = round(mismatch · S) ∈ [0, 2S], P = n·S + 1.
 *    Matching one more pair saves 2P, more than any difference in Σq (≤ (n/2)·2S), so the optimum
 *    has maximum cardinality first and minimum Σq second.
 * 2. Sparse graphs: every item's NARROW (for step 3) or WIDE (step 4) cheapest compatible edges;
 *    d_a, the k-th cheapest cost at a, bounds every left-out edge at a from below.
 * 3. LP relaxation (solveRelaxation): an optimal half-integral matching and duals pi from a
 *    bipartite assignment. The duals are checked on every left-out edge (pi_a + pi_b ≤ q; an item
 *    with pi_a ≤ d_a/2 needs no check) and failing edges are added until they hold, so the
 *    relaxation is optimal for the full graph.
 * 4. If it has odd cycles, the blossom algorithm continues from its matching and duals
 *    (solveFromRelaxation), fetching an item's remaining edges when its dual passes d/2 — before
 *    that every missing edge a–b has pi_a + pi_b ≤ (d_a + d_b)/2 ≤ q. The algorithm ends with a
 *    matching and duals that satisfy the optimality conditions on the full graph (Edmonds'
 *    matching polytope theorem), so the matching is optimal there.
 * Compatible pairs are found by scanning hFE windows of the hFE-sorted items, never all n² pairs.
 */
export function solveMaxPairs(it: PairItems): PairSolution {
  const n = it.n;
  if (n < 2) return { pairs: [], rounds: 0, edgesSolved: 0 };
  const S = mismatchScale(n);
  const P = n * S + 1;
  const costOf = (a: number, b: number): number => Math.round(itemsMismatch(it, a, b) * S);
  // (itemsCost below is the same arithmetic with the compatibility test folded in.)

  // 2. The WIDE cheapest compatible edges of every item (a bounded max-heap per item), then
  //    sorted by cost.
  // Scratch buffers kept between runs (buffers.ts): slot s of item a is read only below count[a].
  const topQ = scratchFloat64('pairs.topQ', n * WIDE);
  const topJ = scratchInt32('pairs.topJ', n * WIDE);
  const count = new Int32Array(n);
  const offer = (a: number, b: number, q: number): void => {
    const base = a * WIDE;
    let c = count[a] as number;
    let i: number;
    if (c < WIDE) {
      i = c;
      count[a] = ++c;
      while (i > 0) {
        const parent = (i - 1) >> 1;
        if ((topQ[base + parent] as number) >= q) break;
        topQ[base + i] = topQ[base + parent] as number;
        topJ[base + i] = topJ[base + parent] as number;
        i = parent;
      }
    } else {
      if (q >= (topQ[base] as number)) return;
      i = 0;
      for (;;) {
        const l = 2 * i + 1;
        if (l >= WIDE) break;
        const r = l + 1;
        const child = r < WIDE && (topQ[base + r] as number) > (topQ[base + l] as number) ? r : l;
        if ((topQ[base + child] as number) <= q) break;
        topQ[base + i] = topQ[base + child] as number;
        topJ[base + i] = topJ[base + child] as number;
        i = child;
      }
    }
    topQ[base + i] = q;
    topJ[base + i] = b;
  };
  // Each item scans its own hFE windows in its Vbe bucket and the two next to it (vbeBuckets),
  // outward from itself. Along a scan the hFE part of the mismatch only grows, and it alone
  // bounds the cost from below: once it passes the item's current WIDE-th cheapest (with one unit
  // to spare for rounding), nothing further along that scan can enter the list.
  const t = it.hfeTolerancePct;
  const hScale = t > 0 ? (100 / t) * S : 0;
  const bk = vbeBuckets(it);
  const { hLo, hHi } = it;
  for (let a = 0; a < n; a++) {
    const ha = hLo[a] as number;
    const hha = hHi[a] as number;
    const base = a * WIDE;
    const own = bk.bucketOf[a] as number;
    for (let r = 0; r < 3; r++) {
      const i = r === 0 ? own : r === 1 ? (bk.below[own] as number) : (bk.above[own] as number);
      if (i < 0) continue;
      const after = i === own ? (bk.slot[a] as number) + 1 : firstAfter(bk, i, a);
      const end = bk.start[i + 1] as number;
      for (let s = after; s < end; s++) {
        const b = bk.members[s] as number;
        const hb = hLo[b] as number;
        if (!hfeWithinTolerance(ha, hb, t)) break;
        if (count[a] === WIDE && ((hb - ha) / ha) * hScale > (topQ[base] as number) + 1) break;
        const q = itemsCost(it, a, b, S);
        if (q >= 0) offer(a, b, q);
      }
      const first = bk.start[i] as number;
      for (let s = (i === own ? after - 1 : after) - 1; s >= first; s--) {
        const b = bk.members[s] as number;
        const hb = hLo[b] as number;
        if (!hfeWithinTolerance(hb, hha, t)) break;
        if (count[a] === WIDE && ((hha - hb) / hb) * hScale > (topQ[base] as number) + 1) break;
        const q = itemsCost(it, a, b, S);
        if (q >= 0) offer(a, b, q);
      }
    }
  }
  // d_k(a) = k-th cheapest cost (Infinity if a has fewer edges), read once the lists are sorted.
  const boundOf = (k: number): Float64Array => {
    const d = new Float64Array(n);
    for (let a = 0; a < n; a++) d[a] = (count[a] as number) < k ? Infinity : (topQ[a * WIDE + k - 1] as number);
    return d;
  };
  // Each list is a max-heap: popping the largest to the end, one by one, leaves it ascending.
  for (let a = 0; a < n; a++) {
    const base = a * WIDE;
    for (let size = count[a] as number; size > 1; ) {
      size--;
      const q = topQ[base + size] as number;
      const j = topJ[base + size] as number;
      topQ[base + size] = topQ[base] as number;
      topJ[base + size] = topJ[base] as number;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        if (l >= size) break;
        const r = l + 1;
        const child = r < size && (topQ[base + r] as number) > (topQ[base + l] as number) ? r : l;
        if ((topQ[base + child] as number) <= q) break;
        topQ[base + i] = topQ[base + child] as number;
        topJ[base + i] = topJ[base + child] as number;
        i = child;
      }
      topQ[base + i] = q;
      topJ[base + i] = j;
    }
  }

  // The graph the solvers hold: its edge list (with costs), and per item the list of its
  // neighbours for membership tests.
  const held = new HeldGraph(n, n * (WIDE + 4));
  const mark = new Int32Array(n).fill(-1);
  let stamp = 0;
  const hold = (a: number, b: number): void => held.add(a, b, costOf(a, b));
  /** Marks a's held neighbours with a new stamp and returns it. */
  const markHeld = (a: number): number => {
    const st = ++stamp;
    for (let s = held.head[a] as number; s !== -1; s = held.next[s] as number) mark[held.other(s)] = st;
    return st;
  };
  /** Holds the first k entries of every item's sorted list. */
  const holdNearest = (k: number): void => {
    for (let a = 0; a < n; a++) {
      const base = a * WIDE;
      const st = markHeld(a);
      const c = Math.min(k, count[a] as number);
      for (let s = 0; s < c; s++) {
        const b = topJ[base + s] as number;
        if (mark[b] === st) continue;
        mark[b] = st;
        hold(a, b);
      }
    }
  };
  const scratch: number[] = [];
  const missingBuf: number[] = [];
  /** Compatible neighbours of a that the graph does not hold yet (a reused array). */
  const missing = (a: number): number[] => {
    const st = markHeld(a);
    scratch.length = 0;
    collectNeighbours(it, bk, a, scratch);
    missingBuf.length = 0;
    for (const b of scratch) if (mark[b] !== st) missingBuf.push(b);
    return missingBuf;
  };

  // 3. The LP relaxation on the NARROW graph, until its duals hold on the full graph.
  holdNearest(NARROW);
  let bound = boundOf(NARROW);
  let rounds = 0;
  let lp: Relaxation;
  let previous: AssignmentSolution | undefined;
  for (;;) {
    rounds++;
    lp = solveRelaxation(n, held.edgeA(), held.edgeB(), held.costs(), P, previous);
    previous = lp.assignment;
    const before = held.m;
    for (let a = 0; a < n; a++) {
      const pa = lp.pi[a] as number;
      if (pa <= (bound[a] as number) / 2) continue;
      for (const b of missing(a)) {
        if (costOf(a, b) < pa + (lp.pi[b] as number)) hold(a, b);
      }
    }
    if (held.m === before) break;
  }
  if (lp.oddCycles === 0) return result(lp.mate, held.m);

  // 4. Odd cycles left: blossom algorithm on the WIDE graph with lazily fetched edges (an item
  //    whose dual already exceeds d/2 gets them before the start). In max-weight form
  //    y = 4P − 4·pi, so the level pi = d/2 is y = 4P − 2d.
  holdNearest(WIDE);
  bound = boundOf(WIDE);
  const level = new Float64Array(n);
  for (let a = 0; a < n; a++) {
    const d = bound[a] as number;
    level[a] = d === Infinity ? -Infinity : 4 * P - 2 * d;
  }
  const weightBuf: number[] = [];
  const exact = solveFromRelaxation(n, held.edgeA(), held.edgeB(), held.costs(), P, lp, {
    level,
    // Room for the fetched edges too; the solver grows its arrays if they need more.
    capacity: 2 * held.m,
    fetch(a) {
      const to = missing(a);
      weightBuf.length = 0;
      for (const b of to) {
        hold(a, b);
        weightBuf.push(2 * (2 * P - costOf(a, b)));
      }
      return { to, weight: weightBuf, level: -Infinity };
    },
  });
  return result(exact.mate, held.m);

  function result(mate: Int32Array, edgesSolved: number): PairSolution {
    const pairs: [number, number][] = [];
    for (let a = 0; a < n; a++) {
      const b = mate[a] as number;
      if (b > a) pairs.push([a, b]);
    }
    return { pairs, rounds, edgesSolved };
  }
}

/**
 * The edges held so far: edge e joins ea[e] and eb[e] at cost q[e]; its two ends are slots 2e
 * (at ea[e]) and 2e + 1 (at eb[e]), chained per item from head[item] through next[slot].
 */
class HeldGraph {
  m = 0;
  readonly head: Int32Array;
  next: Int32Array;
  private ea: Int32Array;
  private eb: Int32Array;
  private q: Float64Array;

  constructor(n: number, capacity: number) {
    const cap = Math.max(16, capacity);
    this.head = new Int32Array(n).fill(-1);
    // Scratch buffers kept between runs (buffers.ts); slots are written before they are read.
    this.next = scratchInt32('held.next', 2 * cap);
    this.ea = scratchInt32('held.ea', cap);
    this.eb = scratchInt32('held.eb', cap);
    this.q = scratchFloat64('held.q', cap);
  }

  add(a: number, b: number, cost: number): void {
    const e = this.m++;
    if (e === this.ea.length) this.grow(2 * e);
    this.ea[e] = a < b ? a : b;
    this.eb[e] = a < b ? b : a;
    this.q[e] = cost;
    const sa = 2 * e + (a < b ? 0 : 1);
    this.next[sa] = this.head[a] as number;
    this.head[a] = sa;
    this.next[sa ^ 1] = this.head[b] as number;
    this.head[b] = sa ^ 1;
  }

  /** The item at the other end of slot s. */
  other(s: number): number {
    return (s & 1 ? this.ea[s >> 1] : this.eb[s >> 1]) as number;
  }

  edgeA(): Int32Array {
    return this.ea.subarray(0, this.m);
  }

  edgeB(): Int32Array {
    return this.eb.subarray(0, this.m);
  }

  costs(): Float64Array {
    return this.q.subarray(0, this.m);
  }

  private grow(cap: number): void {
    const ea = new Int32Array(cap);
    ea.set(this.ea);
    this.ea = ea;
    const eb = new Int32Array(cap);
    eb.set(this.eb);
    this.eb = eb;
    const q = new Float64Array(cap);
    q.set(this.q);
    this.q = q;
    const next = new Int32Array(2 * cap);
    next.set(this.next);
    this.next = next;
  }
}

interface Relaxation {
  /** Partner from the assignment's 2-cycles and even cycles (and odd cycles but one item), or −1. */
  readonly mate: Int32Array;
  /** Min-cost duals: pi[a] + pi[b] ≤ q on every edge, pi[a] ≤ P, equality on the support. */
  readonly pi: Float64Array;
  readonly oddCycles: number;
  /** The assignment behind it, to start the next round from. */
  readonly assignment: AssignmentSolution;
}

/**
 * The LP relaxation of the sparse problem (edges a–b with integer cost q, penalty P per
 * unmatched item): a minimum-cost perfect assignment on the bipartite double cover (row a →
 * column b for each edge both ways, row a → column a at 2P for "a unmatched"). Its optimum is an
 * optimal half-integral fractional matching: 2-cycles of the assignment are pairs, longer cycles
 * carry ½ on each edge. With pi = (u + v)/2 (symmetrised optimal duals) every edge of every cycle
 * is tight (complementary slackness), so alternate edges of each cycle can be taken as pairs;
 * an odd cycle leaves one item over.
 */
function solveRelaxation(n: number, edgeA: Int32Array, edgeB: Int32Array, cost: Float64Array, P: number, start?: AssignmentSolution): Relaxation {
  const m = edgeA.length;
  const self = 2 * P;
  const rowStart = new Int32Array(n + 1);
  for (let e = 0; e < m; e++) {
    rowStart[(edgeA[e] as number) + 1]++;
    rowStart[(edgeB[e] as number) + 1]++;
  }
  for (let a = 0; a < n; a++) rowStart[a + 1] = (rowStart[a + 1] as number) + (rowStart[a] as number) + 1;
  const arcCol = scratchInt32('relaxation.arcCol', 2 * m + n);
  const arcCost = scratchFloat64('relaxation.arcCost', 2 * m + n);
  const fill = rowStart.slice(0, n);
  for (let a = 0; a < n; a++) {
    arcCol[fill[a] as number] = a;
    arcCost[fill[a]++ as number] = self;
  }
  for (let e = 0; e < m; e++) {
    const a = edgeA[e] as number;
    const b = edgeB[e] as number;
    arcCol[fill[a] as number] = b;
    arcCost[fill[a]++ as number] = cost[e] as number;
    arcCol[fill[b] as number] = a;
    arcCost[fill[b]++ as number] = cost[e] as number;
  }
  const assignment = solveAssignment({ n, rowStart, arcCol, arcCost }, start);
  const { colOf, u, v } = assignment;
  const pi = new Float64Array(n);
  for (let a = 0; a < n; a++) pi[a] = ((u[a] as number) + (v[a] as number)) / 2;

  const mate = new Int32Array(n).fill(-1);
  const seen = new Uint8Array(n);
  const cycle: number[] = [];
  let oddCycles = 0;
  for (let a0 = 0; a0 < n; a0++) {
    if (seen[a0]) continue;
    cycle.length = 0;
    for (let a = a0; !seen[a]; a = colOf[a] as number) {
      seen[a] = 1;
      cycle.push(a);
    }
    for (let i = 0; i + 1 < cycle.length; i += 2) {
      mate[cycle[i] as number] = cycle[i + 1] as number;
      mate[cycle[i + 1] as number] = cycle[i] as number;
    }
    if (cycle.length % 2 === 1 && cycle.length > 1) oddCycles++;
  }
  return { mate, pi, oddCycles, assignment };
}

/**
 * The exact optimum: the blossom algorithm started from the relaxation's matching and duals
 * (max-weight form, all doubled so the duals are even: w = 2(2P − q), y = 2(2P − 2·pi) ≥ 0; the
 * items left over by odd cycles are the free vertices with y > 0).
 */
function solveFromRelaxation(
  n: number,
  edgeA: Int32Array,
  edgeB: Int32Array,
  cost: Float64Array,
  P: number,
  lp: Relaxation,
  lazyEdges: LazyEdges,
): { mate: Int32Array } {
  const m = edgeA.length;
  const weight = new Float64Array(m);
  const mateEdge = new Int32Array(n).fill(-1);
  for (let e = 0; e < m; e++) {
    weight[e] = 2 * (2 * P - (cost[e] as number));
    const a = edgeA[e] as number;
    const b = edgeB[e] as number;
    if (lp.mate[a] === b) {
      mateEdge[a] = e;
      mateEdge[b] = e;
    }
  }
  const dual = new Float64Array(n);
  for (let a = 0; a < n; a++) dual[a] = 2 * (2 * P - 2 * (lp.pi[a] as number));
  const res = solveMaxWeightMatching(
    { nVertex: n, edgeI: edgeA, edgeJ: edgeB, weight },
    { start: { mateEdge, dual }, lazyEdges },
  );
  return { mate: res.mate };
}
