import { solveAssignment } from './assignment.ts';
import { solveMaxWeightMatching } from './blossom.ts';
import { type PairItems, forEachCompatiblePair, forEachNeighbour, itemsMismatch } from './items.ts';

/** Nearest compatible neighbours (by mismatch) each item brings into the first, sparse graph. */
const NEAREST = 8;

export interface PairSolution {
  /** Matched item pairs [a, b] with a < b. */
  readonly pairs: [number, number][];
  /** Solve–certify rounds needed (1 when the sparse graph already held the optimum). */
  readonly rounds: number;
  /** Edges in the last graph solved / compatible pairs in the full graph. */
  readonly edgesSolved: number;
  readonly edgesCompatible: number;
}

/** Scale of the integer mismatch used as edge cost: q = round(mismatch · S), mismatch ∈ [0, 2]. */
export function mismatchScale(n: number): number {
  // Keeps every dual below 2^53 (they stay under ~8·n·S): exact integer arithmetic in doubles.
  return 2 ** Math.max(10, Math.min(26, 47 - Math.ceil(Math.log2(n + 2))));
}

/**
 * The largest number of disjoint compatible pairs of items and, among those, the smallest total
 * mismatch (exact for the mismatch rounded to 1/S, S = mismatchScale(n), i.e. ≈ 1.5·10⁻⁸).
 *
 * Method, and why it is exact:
 * 1. Cost of edge a–b: q = round(mismatch · S) ∈ [0, 2S]; weight W = 2(K − q) with K = n·S + 1.
 *    One more pair gains K, more than any difference in Σq (≤ (n/2)·2S), so a maximum-weight
 *    matching has maximum cardinality first and minimum Σq second.
 * 2. Doubled graph: a copy G′ of the graph and an edge v–v′ of weight 0 for each v. It has a
 *    perfect matching; a maximum-weight perfect matching of it restricts to an optimal matching
 *    of G (if the G half were worse than the G′ half, mirroring the better half would beat it).
 *    For perfect matching the primal–dual method accepts any feasible start, so each vertex can
 *    start with its own dual and the obvious pairs are matched greedily before the blossom stages
 *    (the free vertices of the non-perfect problem would all need the same dual).
 * 3. Sparse graph with certificate: G holds only each item's NEAREST cheapest compatible edges.
 *    After solving, every left-out edge a–b is checked against the duals: its slack is at least
 *    4q − g_a − g_b with g = 2K − y (blossom duals only add), and q ≥ d_a, d_b, the NEAREST-th
 *    cheapest cost at a and b; so an item with g ≤ 2d (in both copies) needs no edge check.
 *    Edges that may violate the bound are added and the graph is solved again. When none is left
 *    the duals are feasible on the full graph and the matching is optimal there by LP duality
 *    (Edmonds' matching polytope theorem), not only on the sparse graph.
 */
export function solveMaxPairs(it: PairItems): PairSolution {
  const n = it.n;
  if (n < 2) return { pairs: [], rounds: 0, edgesSolved: 0, edgesCompatible: 0 };
  const S = mismatchScale(n);
  const P = n * S + 1;
  const costOf = (a: number, b: number): number => Math.round(itemsMismatch(it, a, b) * S);

  // The NEAREST cheapest compatible edges of every item.
  const topQ = new Float64Array(n * NEAREST).fill(Infinity);
  const topJ = new Int32Array(n * NEAREST).fill(-1);
  const count = new Int32Array(n);
  const worstQ = new Float64Array(n).fill(Infinity);
  const worstAt = new Int32Array(n);
  let edgesCompatible = 0;
  const offer = (a: number, b: number, q: number): void => {
    const base = a * NEAREST;
    const c = count[a] as number;
    if (c < NEAREST) {
      topQ[base + c] = q;
      topJ[base + c] = b;
      count[a] = c + 1;
      if (c + 1 < NEAREST) return;
    } else {
      if (q >= (worstQ[a] as number)) return;
      topQ[base + (worstAt[a] as number)] = q;
      topJ[base + (worstAt[a] as number)] = b;
    }
    let w = 0;
    for (let s = 1; s < NEAREST; s++) if ((topQ[base + s] as number) > (topQ[base + w] as number)) w = s;
    worstAt[a] = w;
    worstQ[a] = topQ[base + w] as number;
  };
  forEachCompatiblePair(it, (a, b) => {
    edgesCompatible++;
    const q = costOf(a, b);
    offer(a, b, q);
    offer(b, a, q);
  });
  // d_a: cost every left-out edge at a is at least (Infinity when a keeps all its edges).
  const bound = new Float64Array(n);
  for (let a = 0; a < n; a++) bound[a] = (count[a] as number) < NEAREST ? Infinity : (worstQ[a] as number);

  const keyOf = (a: number, b: number): number => (a < b ? a * n + b : b * n + a);
  let keys: number[] = [];
  for (let a = 0; a < n; a++) {
    const base = a * NEAREST;
    for (let s = 0; s < (count[a] as number); s++) keys.push(keyOf(a, topJ[base + s] as number));
  }
  keys.sort((x, y) => x - y);
  keys = keys.filter((k, i) => i === 0 || k !== keys[i - 1]);
  let inGraph: Set<number> | null = null;

  let rounds = 0;
  for (;;) {
    rounds++;
    const m = keys.length;
    const edgeA = new Int32Array(m);
    const edgeB = new Int32Array(m);
    const cost = new Float64Array(m);
    for (let e = 0; e < m; e++) {
      const key = keys[e] as number;
      const a = Math.floor(key / n);
      const b = key - a * n;
      edgeA[e] = a;
      edgeB[e] = b;
      cost[e] = costOf(a, b);
    }
    const { mate, pi } = solveSparse(n, edgeA, edgeB, cost, P);

    // Certificate (point 4 above): pi[a] + pi[b] ≤ q on every left-out edge, in both copies.
    const added: number[] = [];
    for (let a = 0; a < n; a++) {
      const limit = (bound[a] as number) / 2;
      if ((pi[a] as number) <= limit) continue;
      if (inGraph === null) inGraph = new Set(keys);
      const set = inGraph;
      forEachNeighbour(it, a, (b) => {
        const key = keyOf(a, b);
        if (set.has(key)) return;
        const q = costOf(a, b);
        if (q < (pi[a] as number) + (pi[b] as number)) {
          set.add(key);
          added.push(key);
        }
      });
    }
    if (added.length === 0) {
      const pairs: [number, number][] = [];
      for (let a = 0; a < n; a++) {
        const b = mate[a] as number;
        if (b > a) pairs.push([a, b]);
      }
      return { pairs, rounds, edgesSolved: m, edgesCompatible };
    }
    keys = keys.concat(added).sort((x, y) => x - y);
  }
}

/**
 * Optimal matching of the sparse graph (edges a–b with integer cost q, penalty P per unmatched
 * item) and min-cost duals pi for the 2n vertices of the doubled graph (copy G′ at n…2n−1):
 * pi[a] + pi[b] ≤ q on every edge of either copy, pi[v] + pi[v′] ≤ 2P, equality on the matching.
 * mate[a] is the partner in G or −1.
 */
function solveSparse(n: number, edgeA: Int32Array, edgeB: Int32Array, cost: Float64Array, P: number) {
  const m = edgeA.length;
  const self = 2 * P;
  // Bipartite double cover: row a → column b for each edge in both directions, row a → column a
  // (a left unmatched) at cost 2P.
  const rowStart = new Int32Array(n + 1);
  for (let e = 0; e < m; e++) {
    rowStart[(edgeA[e] as number) + 1]++;
    rowStart[(edgeB[e] as number) + 1]++;
  }
  for (let a = 0; a < n; a++) rowStart[a + 1] = (rowStart[a + 1] as number) + (rowStart[a] as number) + 1;
  const arcCol = new Int32Array(2 * m + n);
  const arcCost = new Float64Array(2 * m + n);
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
  const T0 = performance.now();
  const { colOf, u, v } = solveAssignment({ n, rowStart, arcCol, arcCost });
  console.log('assign ms', (performance.now() - T0).toFixed(1), 'm', m);
  const pi = new Float64Array(n);
  for (let a = 0; a < n; a++) pi[a] = ((u[a] as number) + (v[a] as number)) / 2;

  // Cycles of the assignment: fixed points stay unmatched, 2-cycles are pairs, longer cycles are
  // matched alternately (an odd one leaves one item free).
  const mate = new Int32Array(n).fill(-1);
  const seen = new Uint8Array(n);
  const oddFree: number[] = [];
  const cycle: number[] = [];
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
    if (cycle.length % 2 === 1 && cycle.length > 1) oddFree.push(cycle[cycle.length - 1] as number);
  }
  console.log('oddFree', oddFree.length);
  if (oddFree.length === 0) return { mate, pi };

  // Odd cycles: finish with the blossom algorithm, started from this matching and these duals.
  // Max-weight form, all doubled so the duals are even: w = 2(2P − q), y = 2(2P − 2·pi) ≥ 0.
  const edgeI = new Int32Array(edgeA);
  const edgeJ = new Int32Array(edgeB);
  const weight = new Float64Array(m);
  const edgeOf = new Map<number, number>();
  for (let e = 0; e < m; e++) {
    weight[e] = 2 * (self - (cost[e] as number));
    edgeOf.set((edgeA[e] as number) * n + (edgeB[e] as number), e);
  }
  const mateEdge = new Int32Array(n).fill(-1);
  const dual = new Float64Array(n);
  for (let a = 0; a < n; a++) {
    dual[a] = 2 * (self - 2 * (pi[a] as number));
    const b = mate[a] as number;
    if (b > a) {
      const e = edgeOf.get(a * n + b) as number;
      mateEdge[a] = e;
      mateEdge[b] = e;
    }
  }
  const T1 = performance.now();
  const res = solveMaxWeightMatching({ nVertex: n, edgeI, edgeJ, weight }, { start: { mateEdge, dual } });
  console.log('blossom ms', (performance.now() - T1).toFixed(1), res.augmentations);
  for (let a = 0; a < n; a++) pi[a] = (2 * self - (res.dual[a] as number)) / 4;
  return { mate: res.mate, pi };
}
