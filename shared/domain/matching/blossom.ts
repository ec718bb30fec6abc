import { scratchFloat64, scratchInt32, scratchUint8 } from './buffers.ts';
import { IndexedMinHeap } from './min-heap.ts';

/**
 * Maximum-weight matching on a general graph: Edmonds' blossom algorithm with the primal–dual
 * weight method, O(n³), as described in Z. Galil, "Efficient algorithms for finding maximum
 * matching in graphs", ACM Computing Surveys 18 (1986) 23–38, and following the structure of
 * Joris van Rantwijk's public-domain implementation (mwmatching.py, 2008). Variable names and the
 * order of the steps follow that formulation so the two can be read side by side.
 *
 * The steps (grow, blossom, augment, expand; the four kinds of dual step δ1…δ4) are those of the
 * formulation; the bookkeeping around them is organised for large sparse graphs (see
 * BlossomSolver). The caller may also start from a matching and duals of its own (BlossomStart)
 * and let the graph grow while the algorithm runs (LazyEdges).
 */

/** A graph for the solver: vertices 0…nVertex−1, edge k joins edgeI[k] and edgeJ[k] with weight[k]. */
export interface BlossomGraph {
  readonly nVertex: number;
  readonly edgeI: Int32Array;
  readonly edgeJ: Int32Array;
  /** Integer weights keep every dual value an integer, so all comparisons are exact. */
  readonly weight: Float64Array;
}

/**
 * A starting point: matched edges (per vertex, the edge index or −1, no blossoms) and the vertex
 * duals in the doubled convention of the formulation (slack of edge k = dual[i] + dual[j] − 2·w[k]).
 * The caller guarantees every slack ≥ 0 and every matched edge at slack 0; integer weights and
 * even duals keep every later step an integer (vertices joined by tight edges share a parity).
 * Without maxCardinality the duals must also be ≥ 0, and nothing else is needed: the roots are
 * the free vertices whose dual is still positive (a free vertex at 0 already meets complementary
 * slackness), and the type-1 step becomes the smallest dual among the outer vertices — when it
 * reaches 0 at an outer vertex x, the tree path from its root to x is flipped, leaving x free at
 * dual 0. With the default start (all duals equal) this is exactly the classic algorithm.
 * With maxCardinality, a start must keep the classic condition: the free vertices share the
 * smallest dual.
 */
export interface BlossomStart {
  readonly mateEdge: Int32Array;
  readonly dual: Float64Array;
}

/**
 * Edges the graph does not hold yet, fetched when needed (without maxCardinality). The caller
 * vouches that every missing edge u–v has slack ≥ 0 as long as dual[u] ≥ level[u] and
 * dual[v] ≥ level[v] (e.g. level from an upper bound on the weight of u's missing edges). When an
 * outer vertex's dual falls to its level, fetch(v) returns some of v's missing edges (other end
 * and weight, none already in the graph) and v's new level (−Infinity once none is missing);
 * they are added. Then every missing edge keeps a non-negative slack, so the result is the
 * optimum of the full graph.
 */
export interface LazyEdges {
  readonly level: Float64Array;
  /** The returned arrays are read at once and may be reused by the caller. */
  fetch(v: number): { to: number[]; weight: number[]; level: number };
  /** Expected total number of edges, to size the edge arrays once (optional). */
  readonly capacity?: number;
}

export interface BlossomOptions {
  /** Maximum weight among the matchings of maximum cardinality. */
  readonly maxCardinality?: boolean;
  readonly start?: BlossomStart;
  readonly lazyEdges?: LazyEdges;
}

export interface BlossomSolution {
  /** mate[v] is the vertex matched to v, or −1. */
  readonly mate: Int32Array;
  /** Duals in the doubled convention: vertices 0…n−1, then blossoms n…2n−1 (z, ≥ 0). */
  readonly dual: Float64Array;
  /** Parent blossom of each vertex or blossom at the end, −1 at the top. */
  readonly blossomParent: Int32Array;
  /** Number of augmentations (stages that found a path). */
  readonly augmentations: number;
}

/**
 * Maximum-weight matching of `graph`; with maxCardinality, the maximum-weight matching among the
 * matchings of maximum cardinality. Galil (1986) §3 / van Rantwijk mwmatching.py. With integer
 * weights every dual value stays an integer and the result is exact. Weights have no unit.
 */
export function solveMaxWeightMatching(graph: BlossomGraph, options: BlossomOptions = {}): BlossomSolution {
  return new BlossomSolver(graph, options.maxCardinality === true, options.start, options.lazyEdges).run();
}

// Events, keyed by the time they happen; id = 8·x + kind.
const KIND_VERTEX = 0; // δ1: outer vertex x's dual reaches 0
const KIND_FREE = 1; // δ2: the best edge from an outer vertex to unlabelled vertex x becomes tight
const KIND_BLOSSOM = 2; // δ4: inner blossom x's dual reaches 0
const KIND_LEVEL = 3; // outer vertex x's dual reaches its lazy-edge level
const KIND_OUTER = 4; // δ3: the best edge from outer vertex x to another outer blossom becomes tight

/**
 * The state of one run; one method per step of the formulation. Four refinements, none of
 * which changes what a step does:
 * - Dual changes are applied lazily, as in the O(nm log n) versions of the algorithm (Galil,
 *   Micali & Gabow, SIAM J. Comput. 15 (1986) 120–130): `now` is the total dual change so far, a
 *   vertex's dual is dualVar[v] ∓ (now − timeRef[v]) while its top-level blossom is S (−) or
 *   T (+) (a blossom's: ± (now − labelTime[b])), and the next δ comes from a heap of the times at
 *   which each candidate event happens (an outer vertex's dual reaching 0, an edge becoming
 *   tight, an inner blossom's dual reaching 0). Stored values are brought up to date whenever a
 *   vertex's rate changes; an outer blossom absorbed into a new outer blossom keeps its rate, so
 *   forming a blossom touches only its inner parts, and its vertices find their new top-level
 *   blossom through the parent links (cached).
 * - The alternating forest is kept across augmentations: only the trees whose roots were just
 *   matched are taken apart (the formulation restarts every tree each stage). The other trees are
 *   still alternating trees of tight edges rooted at free vertices, which is all a stage needs.
 * - Inner blossoms remember no per-vertex labels; when one is expanded, a child off the new path
 *   is labelled T if a tight edge joins it to an outer vertex, which is what those labels recorded.
 * - The formulation's least-slack edges (bestedge) are kept per vertex: to each unlabelled vertex
 *   from the outer vertices, and from each outer vertex to other outer blossoms, each with one
 *   heap entry; when such an edge stops qualifying, the vertex's edges are scanned again.
 */
class BlossomSolver {
  private readonly n: number;
  private ei: Int32Array;
  private ej: Int32Array;
  private wt: Float64Array;
  private endpoint: Int32Array;
  private m: number;
  /**
   * Per vertex, its edges in the order they were added, as a row of adjacent slots in three
   * typed arrays: the endpoint index p (the other end is endpoint[p]), that other end, and the
   * edge weight — rows adjStart[v] … adjStart[v] + adjLen[v] − 1, so the hot loops read memory in
   * order. A row that outgrows its room (edges fetched later) moves to the end, with twice the room.
   */
  private readonly adjStart: Int32Array;
  private readonly adjLen: Int32Array;
  private readonly adjRoom: Int32Array;
  private adjP: Int32Array;
  private adjW: Int32Array;
  private adjWt: Float64Array;
  private adjUsed = 0;
  /** Times the rows outgrew their arrays in this run (each growth takes its own scratch key). */
  private adjGrowths = 0;
  private readonly level: Float64Array | null;
  private readonly mate: Int32Array;
  /** Of top-level blossoms: 0 outside the forest, 1 outer (S), 2 inner (T); meaningless below the top. */
  private readonly label: Int8Array;
  private readonly labelEnd: Int32Array;
  private readonly inBlossom: Int32Array;
  /** Generation of the blossom cached in inBlossom[v], and of each blossom id (bumped on expansion). */
  private readonly inBlossomGen: Int32Array;
  private readonly blossomGen: Int32Array;
  private readonly blossomParent: Int32Array;
  private readonly blossomChilds: (number[] | null)[];
  private readonly blossomBase: Int32Array;
  private readonly blossomEndps: (number[] | null)[];
  private readonly unusedBlossoms: number[] = [];
  private readonly dualVar: Float64Array;
  /** z-clock start of each labelled top-level blossom. */
  private readonly labelTime: Float64Array;
  /** Time since which each vertex's dual has moved at the rate its top-level label gives. */
  private readonly timeRef: Float64Array;
  private allowEdge: Uint8Array;
  /**
   * Best (least-slack) recorded edge from an outer vertex to each unlabelled vertex, and from each
   * outer vertex to another outer blossom — the formulation's bestedge, kept per vertex. All such
   * slacks fall at the same rate, so a best edge stays best until it stops qualifying; then the
   * vertex's edges are scanned again when its event comes up.
   */
  private readonly bestFree: Int32Array;
  private readonly bestOuter: Int32Array;
  /** When bestFree's event comes due (valid while the edge still qualifies). */
  private readonly bestFreeAt: Float64Array;
  private readonly queue: number[] = [];
  /** Pending events, at most one per (vertex or blossom, kind): id = 8·x + kind. */
  private readonly events: IndexedMinHeap;
  private now = 0;
  /** Root vertex of the tree each labelled top-level blossom belongs to. */
  private readonly treeOf: Int32Array;
  /** Top-level blossoms labelled in each tree (by root; may hold stale entries). */
  private readonly treeTops: (number[] | null)[];
  private liveTrees = 0;
  private readonly visitMark: Int32Array;
  private visit = 0;
  private readonly leafStack: Int32Array;
  private readonly leafBuf: Int32Array;

  constructor(
    graph: BlossomGraph,
    private readonly maxCardinality: boolean,
    start: BlossomStart | undefined,
    private readonly lazy: LazyEdges | undefined,
  ) {
    const n = graph.nVertex;
    const ei = graph.edgeI;
    const ej = graph.edgeJ;
    const m = ei.length;
    this.n = n;
    this.m = m;
    const cap = Math.max(m, Math.min(lazy?.capacity ?? 0, 1 << 24));
    // The per-edge arrays are scratch buffers kept between runs (see buffers.ts); every slot is
    // written before it is read.
    this.ei = scratchInt32('blossom.ei', cap);
    this.ei.set(ei);
    this.ej = scratchInt32('blossom.ej', cap);
    this.ej.set(ej);
    this.wt = scratchFloat64('blossom.wt', cap);
    this.wt.set(graph.weight);
    this.endpoint = scratchInt32('blossom.endpoint', 2 * cap);
    this.adjStart = new Int32Array(n);
    this.adjLen = new Int32Array(n);
    this.adjRoom = new Int32Array(n);
    for (let k = 0; k < m; k++) {
      this.adjRoom[ei[k] as number]++;
      this.adjRoom[ej[k] as number]++;
    }
    for (let v = 0; v < n; v++) {
      this.adjRoom[v] = (this.adjRoom[v] as number) + 4;
      this.adjStart[v] = this.adjUsed;
      this.adjUsed += this.adjRoom[v] as number;
    }
    // Room for the edges still to come and for rows that move when they fill up (a moved row
    // leaves its old slots behind).
    const room = 2 * this.adjUsed + 2 * (cap - m);
    this.adjP = scratchInt32('blossom.adjP', room);
    this.adjW = scratchInt32('blossom.adjW', room);
    this.adjWt = scratchFloat64('blossom.adjWt', room);
    for (let k = 0; k < m; k++) {
      const i = ei[k] as number;
      const j = ej[k] as number;
      const w = graph.weight[k] as number;
      let at = (this.adjStart[i] as number) + (this.adjLen[i]++ as number);
      this.adjP[at] = 2 * k + 1;
      this.adjW[at] = j;
      this.adjWt[at] = w;
      at = (this.adjStart[j] as number) + (this.adjLen[j]++ as number);
      this.adjP[at] = 2 * k;
      this.adjW[at] = i;
      this.adjWt[at] = w;
    }
    for (let k = 0; k < m; k++) {
      this.endpoint[2 * k] = ei[k] as number;
      this.endpoint[2 * k + 1] = ej[k] as number;
    }
    this.level = lazy ? lazy.level.slice() : null;

    this.mate = new Int32Array(n).fill(-1);
    this.label = new Int8Array(2 * n);
    this.labelEnd = new Int32Array(2 * n).fill(-1);
    this.inBlossom = new Int32Array(n);
    for (let v = 0; v < n; v++) this.inBlossom[v] = v;
    this.inBlossomGen = new Int32Array(n);
    this.blossomGen = new Int32Array(2 * n);
    // Every blossom node is on the stack at most once: 2n bounds it.
    this.leafStack = new Int32Array(2 * n);
    this.leafBuf = new Int32Array(n);
    this.blossomParent = new Int32Array(2 * n).fill(-1);
    this.blossomChilds = new Array<number[] | null>(2 * n).fill(null);
    this.blossomBase = new Int32Array(2 * n).fill(-1);
    for (let v = 0; v < n; v++) this.blossomBase[v] = v;
    this.blossomEndps = new Array<number[] | null>(2 * n).fill(null);
    for (let b = 2 * n - 1; b >= n; b--) this.unusedBlossoms.push(b);
    this.dualVar = new Float64Array(2 * n);
    this.labelTime = new Float64Array(2 * n);
    this.timeRef = new Float64Array(n);
    this.allowEdge = scratchUint8('blossom.allowEdge', cap).fill(0);
    this.bestFree = new Int32Array(n).fill(-1);
    this.bestOuter = new Int32Array(n).fill(-1);
    this.bestFreeAt = new Float64Array(n);
    this.treeOf = new Int32Array(2 * n).fill(-1);
    this.treeTops = new Array<number[] | null>(n).fill(null);
    this.visitMark = new Int32Array(2 * n);
    this.events = new IndexedMinHeap(16 * n, 'blossom.events');

    if (start) {
      for (let v = 0; v < n; v++) {
        this.dualVar[v] = start.dual[v] as number;
        const k = start.mateEdge[v] as number;
        if (k >= 0) this.mate[v] = ei[k] === v ? 2 * k + 1 : 2 * k;
      }
    } else {
      let maxWeight = 0;
      for (let k = 0; k < m; k++) if ((this.wt[k] as number) > maxWeight) maxWeight = this.wt[k] as number;
      for (let v = 0; v < n; v++) this.dualVar[v] = maxWeight;
    }
  }

  /**
   * Top-level blossom containing vertex v. inBlossom[v] may point to any blossom that still
   * contains v, or to one expanded since (recognised by its generation, blossomGen), so an
   * expansion does not have to visit the leaves of its children;
   * contains v (forming a blossom does not touch its leaves); the climb is cached.
   */
  private top(v: number): number {
    let b = this.inBlossom[v] as number;
    // A cached blossom that has been expanded since (its generation moved on) says nothing:
    // climb from the vertex itself.
    if (this.blossomGen[b] !== this.inBlossomGen[v]) b = v;
    else if (this.blossomParent[b] === -1) return b;
    while (this.blossomParent[b] !== -1) b = this.blossomParent[b] as number;
    this.inBlossom[v] = b;
    this.inBlossomGen[v] = this.blossomGen[b] as number;
    return b;
  }

  /** Current dual of vertex v. */
  private vDual(v: number): number {
    const l = this.label[this.top(v)];
    const base = this.dualVar[v] as number;
    if (l === 1) return base - (this.now - (this.timeRef[v] as number));
    if (l === 2) return base + (this.now - (this.timeRef[v] as number));
    return base;
  }

  /** Current dual of top-level blossom b (b ≥ n). */
  private zDual(b: number): number {
    const l = this.label[b];
    const base = this.dualVar[b] as number;
    if (l === 1) return base + (this.now - (this.labelTime[b] as number));
    if (l === 2) return base - (this.now - (this.labelTime[b] as number));
    return base;
  }

  /** Stores the current duals of top-level b and its leaves (before b stops being top-level or labelled). */
  private settle(b: number): void {
    if (b < this.n) {
      this.dualVar[b] = this.vDual(b);
      this.timeRef[b] = this.now;
      return;
    }
    // Every leaf of top-level b moves at the rate b's label gives.
    const { dualVar, timeRef } = this;
    const l = this.label[b];
    const now = this.now;
    const { leafBuf } = this;
    for (let i = 0, c = this.leavesInto(b); i < c; i++) {
      const v = leafBuf[i] as number;
      const moved = now - (timeRef[v] as number);
      if (l === 1) dualVar[v] = (dualVar[v] as number) - moved;
      else if (l === 2) dualVar[v] = (dualVar[v] as number) + moved;
      timeRef[v] = now;
    }
    if (b >= this.n) {
      this.dualVar[b] = this.zDual(b);
      this.labelTime[b] = this.now;
    }
  }

  private allow(k: number): void {
    this.allowEdge[k] = 1;
  }

  private growEdges(cap: number): void {
    const ei = new Int32Array(cap);
    ei.set(this.ei);
    this.ei = ei;
    const ej = new Int32Array(cap);
    ej.set(this.ej);
    this.ej = ej;
    const wt = new Float64Array(cap);
    wt.set(this.wt);
    this.wt = wt;
    const allow = new Uint8Array(cap);
    allow.set(this.allowEdge);
    this.allowEdge = allow;
    const endpoint = new Int32Array(2 * cap);
    endpoint.set(this.endpoint);
    this.endpoint = endpoint;

  }

  /** Appends endpoint p (an edge of v) to v's row. */
  private link(v: number, p: number): void {
    let len = this.adjLen[v] as number;
    if (len === this.adjRoom[v]) this.moveRow(v, 2 * len + 4);
    const at = (this.adjStart[v] as number) + len++;
    this.adjP[at] = p;
    this.adjW[at] = this.endpoint[p] as number;
    this.adjWt[at] = this.wt[p >> 1] as number;
    this.adjLen[v] = len;
  }

  /** Moves v's row to the end of the arrays with room for `room` edges. */
  private moveRow(v: number, room: number): void {
    const len = this.adjLen[v] as number;
    if (this.adjUsed + room > this.adjP.length) {
      const size = 2 * (this.adjUsed + room);
      const g = ++this.adjGrowths;
      const adjP = scratchInt32(`blossom.adjP.${g}`, size);
      adjP.set(this.adjP);
      this.adjP = adjP;
      const adjW = scratchInt32(`blossom.adjW.${g}`, size);
      adjW.set(this.adjW);
      this.adjW = adjW;
      const adjWt = scratchFloat64(`blossom.adjWt.${g}`, size);
      adjWt.set(this.adjWt);
      this.adjWt = adjWt;
    }
    const from = this.adjStart[v] as number;
    const to = this.adjUsed;
    const { adjP, adjW, adjWt } = this;
    for (let x = 0; x < len; x++) {
      adjP[to + x] = adjP[from + x] as number;
      adjW[to + x] = adjW[from + x] as number;
      adjWt[to + x] = adjWt[from + x] as number;
    }
    this.adjStart[v] = to;
    this.adjRoom[v] = room;
    this.adjUsed += room;
  }


  private addEdge(i: number, j: number, w: number): number {
    const k = this.m++;
    if (k >= this.ei.length) this.growEdges(Math.max(16, 2 * this.ei.length));
    this.ei[k] = i;
    this.ej[k] = j;
    this.wt[k] = w;
    this.endpoint[2 * k] = i;
    this.endpoint[2 * k + 1] = j;
    this.link(i, 2 * k + 1);
    this.link(j, 2 * k);
    return k;
  }

  private slack(k: number): number {
    return this.vDual(this.ei[k] as number) + this.vDual(this.ej[k] as number) - 2 * (this.wt[k] as number);
  }

  /** Appends the leaves (vertices) of blossom b to out, depth first in child order. */
  /**
   * Writes the leaves of blossom b into leafBuf (in the order of leaves()) and returns how many.
   * For loops that read them at once, before anything else asks for leaves: typed buffers, so the
   * 1–2 million leaf visits of a large matching allocate nothing (emptying a JS array with
   * `length = 0` gives its storage back, and refilling it reallocates).
   */
  private leavesInto(b: number): number {
    const { leafBuf, leafStack, blossomChilds } = this;
    const n = this.n;
    let count = 0;
    let sp = 0;
    leafStack[sp++] = b;
    while (sp > 0) {
      const x = leafStack[--sp] as number;
      if (x < n) {
        leafBuf[count++] = x;
        continue;
      }
      const ch = blossomChilds[x] as number[];
      for (let c = ch.length - 1; c >= 0; c--) leafStack[sp++] = ch[c] as number;
    }
    return count;
  }

  private leaves(b: number, out: number[]): number[] {
    if (b < this.n) {
      out.push(b);
      return out;
    }
    const stack = [b];
    while (stack.length > 0) {
      const x = stack.pop() as number;
      if (x < this.n) {
        out.push(x);
        continue;
      }
      const ch = this.blossomChilds[x] as number[];
      for (let c = ch.length - 1; c >= 0; c--) stack.push(ch[c] as number);
    }
    return out;
  }

  /** Labels top-level b with t in tree `root` and starts the clock of its blossom dual. */
  private setTopLabel(b: number, t: number, root: number): void {
    this.label[b] = t;
    this.labelTime[b] = this.now;
    this.treeOf[b] = root;
    (this.treeTops[root] as number[]).push(b);
  }

  /** Queues S-vertex v for scanning and, without maxCardinality, the time its dual reaches 0. */
  private becameOuter(v: number): void {
    this.queue.push(v);
    this.bestOuter[v] = -1;
    if (!this.maxCardinality) this.events.set(this.now + this.vDual(v), 8 * v + KIND_VERTEX);
    const level = this.level;
    if (level !== null && (level[v] as number) > -Infinity) {
      this.events.set(this.now + this.vDual(v) - (level[v] as number), 8 * v + KIND_LEVEL);
    }
  }

  private assignLabel(w: number, t: number, p: number): void {
    const b = this.top(w);
    const root = p === -1 ? w : (this.treeOf[this.top(this.endpoint[p] as number)] as number);
    if (p === -1) {
      this.treeTops[w] = [];
      this.liveTrees++;
    }
    // b was unlabelled, so its duals did not move: starting the clocks needs no settling.
    this.setTopLabel(b, t, root);
    this.labelEnd[w] = p;
    this.labelEnd[b] = p;
    if (b < this.n) {
      this.timeRef[b] = this.now;
      if (t === 1) this.becameOuter(b);
    } else {
      // becameOuter asks for no leaves, so leafBuf stays intact through both loops.
      const { leafBuf } = this;
      const c = this.leavesInto(b);
      for (let i = 0; i < c; i++) this.timeRef[leafBuf[i] as number] = this.now;
      if (t === 1) for (let i = 0; i < c; i++) this.becameOuter(leafBuf[i] as number);
    }
    if (t !== 1) {
      if (b >= this.n) this.events.set(this.now + (this.dualVar[b] as number), 8 * b + KIND_BLOSSOM);
      const mb = this.mate[this.blossomBase[b] as number] as number;
      this.assignLabel(this.endpoint[mb] as number, 1, mb ^ 1);
    }
  }

  /** Traces back from v and w to find a new blossom (returns its base) or an augmenting path (−1). */
  private scanBlossom(v0: number, w0: number): number {
    const { label, labelEnd, endpoint } = this;
    let v = v0;
    let w = w0;
    const path: number[] = [];
    let base = -1;
    while (v !== -1 || w !== -1) {
      let b = this.top(v);
      if ((label[b] as number) & 4) {
        base = this.blossomBase[b] as number;
        break;
      }
      path.push(b);
      label[b] = 5;
      if (labelEnd[b] === -1) {
        v = -1;
      } else {
        v = endpoint[labelEnd[b] as number] as number;
        b = this.top(v);
        v = endpoint[labelEnd[b] as number] as number;
      }
      if (w !== -1) {
        const tmp = v;
        v = w;
        w = tmp;
      }
    }
    for (const b of path) label[b] = 1;
    return base;
  }

  private addBlossom(base: number, k: number): void {
    const { labelEnd, endpoint, blossomParent } = this;
    let v = this.ei[k] as number;
    let w = this.ej[k] as number;
    const bb = this.top(base);
    let bv = this.top(v);
    let bw = this.top(w);
    const b = this.unusedBlossoms.pop() as number;
    this.blossomBase[b] = base;
    const path: number[] = [];
    const endps: number[] = [];
    while (bv !== bb) {
      path.push(bv);
      endps.push(labelEnd[bv] as number);
      v = endpoint[labelEnd[bv] as number] as number;
      bv = this.top(v);
    }
    path.push(bb);
    path.reverse();
    endps.reverse();
    endps.push(2 * k);
    while (bw !== bb) {
      path.push(bw);
      endps.push((labelEnd[bw] as number) ^ 1);
      w = endpoint[labelEnd[bw] as number] as number;
      bw = this.top(w);
    }
    // The sub-blossoms stop being top-level. Outer ones keep their vertices' dual clocks (the
    // rate stays −1); inner ones are settled, and their vertices become outer.
    const wasInner: number[] = [];
    const root = this.treeOf[bb] as number;
    for (const sub of path) {
      if (this.label[sub] === 2) {
        this.settle(sub);
        this.leaves(sub, wasInner);
      } else if (sub >= this.n) {
        this.dualVar[sub] = this.zDual(sub);
      }
      blossomParent[sub] = b;
    }
    blossomParent[b] = -1;
    this.blossomChilds[b] = path;
    this.blossomEndps[b] = endps;
    this.setTopLabel(b, 1, root);
    labelEnd[b] = labelEnd[bb] as number;
    this.dualVar[b] = 0;
    for (const x of wasInner) this.becameOuter(x);
  }

  /**
   * Expands top-level blossom b. endStage: b is unlabelled (its tree was taken apart) and
   * children with dual 0 are expanded too; otherwise b is an inner blossom whose dual reached 0,
   * and its children are relabelled along the even path as in the formulation.
   */
  private expandBlossom(b: number, endStage: boolean): void {
    const { inBlossom, label, labelEnd, endpoint } = this;
    const n = this.n;
    if (!endStage) this.settle(b);
    const childs = this.blossomChilds[b] as number[];
    // From here on, leaves cached as inside b find their new top-level blossom by climbing.
    this.blossomGen[b]++;
    for (const s of childs) {
      this.blossomParent[s] = -1;
      label[s] = 0;
      this.labelTime[s] = this.now;
      if (s < n) {
        inBlossom[s] = s;
        this.inBlossomGen[s] = 0;
      } else if (endStage && this.dualVar[s] === 0) {
        this.expandBlossom(s, endStage);
      }
    }
    if (!endStage && label[b] === 2) {
      const root = this.treeOf[b] as number;
      const endps = this.blossomEndps[b] as number[];
      const entryChild = this.top(endpoint[(labelEnd[b] as number) ^ 1] as number);
      let j = childs.indexOf(entryChild);
      let jStep: number;
      let endpTrick: number;
      if (j & 1) {
        j -= childs.length;
        jStep = 1;
        endpTrick = 0;
      } else {
        jStep = -1;
        endpTrick = 1;
      }
      let p = labelEnd[b] as number;
      while (j !== 0) {
        this.assignLabel(endpoint[p ^ 1] as number, 2, p);
        this.allow(at(endps, j - endpTrick) >> 1);
        j += jStep;
        p = at(endps, j - endpTrick) ^ endpTrick;
        this.allow(p >> 1);
        j += jStep;
      }
      const bv0 = at(childs, j);
      this.setTopLabel(bv0, 2, root);
      if (bv0 >= n) this.events.set(this.now + (this.dualVar[bv0] as number), 8 * bv0 + KIND_BLOSSOM);
      labelEnd[endpoint[p ^ 1] as number] = p;
      labelEnd[bv0] = p;
      j += jStep;
      while (at(childs, j) !== entryChild) {
        const bv = at(childs, j);
        if (label[bv] === 0) this.labelFromOuter(bv);
        j += jStep;
      }
      // Children left unlabelled: their edges to S-vertices become δ2 candidates again.
      for (const c of childs) {
        if (label[c] !== 0) continue;
        for (const x of this.leaves(c, [])) this.recomputeFree(x);
      }
    }
    label[b] = 0;
    labelEnd[b] = -1;
    this.treeOf[b] = -1;
    this.blossomChilds[b] = null;
    this.blossomEndps[b] = null;
    this.blossomBase[b] = -1;
    this.unusedBlossoms.push(b);
  }

  /** Labels unlabelled top-level bv as T when a tight edge joins one of its leaves to an S-vertex. */
  private labelFromOuter(bv: number): void {
    const { endpoint, label } = this;
    const { adjP } = this;
    for (const x of this.leaves(bv, [])) {
      for (let i = this.adjStart[x] as number, e = i + (this.adjLen[x] as number); i < e; i++) {
        const p = adjP[i] as number;
        const bu = this.top(endpoint[p] as number);
        if (bu !== bv && label[bu] === 1 && this.slack(p >> 1) === 0) {
          this.allow(p >> 1);
          this.assignLabel(x, 2, p);
          return;
        }
      }
    }
  }

  /** Swaps matched and unmatched edges on the even path from vertex v to the base of blossom b. */
  private augmentBlossom(b: number, v: number): void {
    const { endpoint, mate } = this;
    const n = this.n;
    let t = v;
    while (this.blossomParent[t] !== b) t = this.blossomParent[t] as number;
    if (t >= n) this.augmentBlossom(t, v);
    const childs = this.blossomChilds[b] as number[];
    const endps = this.blossomEndps[b] as number[];
    const i = childs.indexOf(t);
    let j = i;
    let jStep: number;
    let endpTrick: number;
    if (i & 1) {
      j -= childs.length;
      jStep = 1;
      endpTrick = 0;
    } else {
      jStep = -1;
      endpTrick = 1;
    }
    while (j !== 0) {
      j += jStep;
      t = at(childs, j);
      const p = at(endps, j - endpTrick) ^ endpTrick;
      if (t >= n) this.augmentBlossom(t, endpoint[p] as number);
      j += jStep;
      t = at(childs, j);
      if (t >= n) this.augmentBlossom(t, endpoint[p ^ 1] as number);
      mate[endpoint[p] as number] = p ^ 1;
      mate[endpoint[p ^ 1] as number] = p;
    }
    const rotated = childs.slice(i).concat(childs.slice(0, i));
    this.blossomChilds[b] = rotated;
    this.blossomEndps[b] = endps.slice(i).concat(endps.slice(0, i));
    this.blossomBase[b] = this.blossomBase[rotated[0] as number] as number;
  }

  /**
   * Flips the alternating tree path from S-vertex s up to its root; s is then matched through
   * endpoint p (p = −1 leaves s free). Both halves of an augmentation use it.
   */
  private flipToRoot(s0: number, p0: number): void {
    const { labelEnd, endpoint, mate } = this;
    let s = s0;
    let p = p0;
    for (;;) {
      const bs = this.top(s);
      if (bs >= this.n) this.augmentBlossom(bs, s);
      mate[s] = p;
      if (labelEnd[bs] === -1) break;
      const t = endpoint[labelEnd[bs] as number] as number;
      const bt = this.top(t);
      s = endpoint[labelEnd[bt] as number] as number;
      const j = endpoint[(labelEnd[bt] as number) ^ 1] as number;
      if (bt >= this.n) this.augmentBlossom(bt, j);
      mate[j] = labelEnd[bt] as number;
      p = (labelEnd[bt] as number) ^ 1;
    }
  }

  /**
   * Takes the tree rooted at `root` apart: its blossoms become unlabelled (duals stored, S-blossoms
   * with dual 0 expanded as at the end of a stage), and its vertices' edges to the remaining outer
   * vertices become δ2 candidates.
   */
  private dissolveTree(root: number): void {
    const list = this.treeTops[root];
    if (list === null || list === undefined) return;
    this.treeTops[root] = null;
    this.liveTrees--;
    const stamp = ++this.visit;
    const tops: number[] = [];
    for (const x of list) {
      if (this.visitMark[x] === stamp) continue;
      this.visitMark[x] = stamp;
      if (this.blossomParent[x] !== -1 || this.treeOf[x] !== root || this.label[x] === 0) continue;
      if (x >= this.n && (this.blossomBase[x] as number) < 0) continue;
      tops.push(x);
    }
    const wasOuterZero: number[] = [];
    for (const x of tops) {
      const outer = this.label[x] === 1;
      this.settle(x);
      this.label[x] = 0;
      this.labelEnd[x] = -1;
      this.treeOf[x] = -1;
      if (outer && x >= this.n && this.dualVar[x] === 0) wasOuterZero.push(x);
    }
    const vertices: number[] = [];
    for (const x of tops) this.leaves(x, vertices);
    for (const b of wasOuterZero) this.expandBlossom(b, true);
    const { allowEdge, adjP, adjW, label, visitMark } = this;
    // Each vertex to look at again is recomputed once (labels do not change in this loop).
    const again = ++this.visit;
    const redo: number[] = [];
    for (const x of vertices) {
      visitMark[x] = again;
      redo.push(x);
    }
    for (const x of vertices) {
      const bx = this.top(x);
      for (let i = this.adjStart[x] as number, e = i + (this.adjLen[x] as number); i < e; i++) {
        allowEdge[(adjP[i] as number) >> 1] = 0;
        // An unlabelled neighbour whose best edge came from x: x no longer moves its dual, so
        // that edge's event time is stale and another edge may now be first.
        const w = adjW[i] as number;
        if (visitMark[w] === again) continue;
        const bw = this.top(w);
        if (label[bw] !== 0 || bw === bx) continue;
        const k = this.bestFree[w] as number;
        if (k !== -1 && !this.isFreeEdge(w, k)) {
          visitMark[w] = again;
          redo.push(w);
        }
      }
    }
    for (const x of redo) this.recomputeFree(x);
  }

  /** Swaps matched and unmatched edges along the augmenting path through edge k. */
  private augmentMatching(k: number): void {
    const ti = this.treeOf[this.top(this.ei[k] as number)] as number;
    const tj = this.treeOf[this.top(this.ej[k] as number)] as number;
    this.flipToRoot(this.ei[k] as number, 2 * k + 1);
    this.flipToRoot(this.ej[k] as number, 2 * k);
    this.dissolveTree(ti);
    if (tj !== ti) this.dissolveTree(tj);
  }

  /** The end of edge k (incident to v) that is not v. */
  private other(k: number, v: number): number {
    const i = this.ei[k] as number;
    return i === v ? (this.ej[k] as number) : i;
  }

  /** Edge k from unlabelled vertex w still counts for w's δ2: its other end is outer. */
  private isFreeEdge(w: number, k: number): boolean {
    const bu = this.top(this.other(k, w));
    return bu !== this.top(w) && this.label[bu] === 1;
  }

  /** Edge k from outer vertex v still counts for v's δ3: its other end is in another outer blossom. */
  private isOuterEdge(v: number, k: number): boolean {
    const bu = this.top(this.other(k, v));
    return bu !== this.top(v) && this.label[bu] === 1;
  }

  /**
   * Edge k (slack s now) from an outer vertex to unlabelled w. The time an edge's event comes
   * due does not move while it keeps qualifying (all such slacks fall at the same rate), so the
   * recorded best is compared by that time.
   */
  private offerFree(w: number, k: number, s: number): void {
    const cur = this.bestFree[w] as number;
    const at = this.now + s;
    if (cur === -1 || at < (this.bestFreeAt[w] as number) || !this.isFreeEdge(w, cur)) {
      this.bestFree[w] = k;
      this.bestFreeAt[w] = at;
      this.events.set(at, 8 * w + KIND_FREE);
    }
  }

  /**
   * Edge k (slack s now) from outer vertex v to another outer blossom. Unlike offerFree, the
   * recorded best is compared by its current slack: its far end may have left the forest and come
   * back since it was recorded (v is not looked at again when that end's tree is taken apart).
   */
  private offerOuter(v: number, k: number, s: number): void {
    const cur = this.bestOuter[v] as number;
    if (cur === -1 || !this.isOuterEdge(v, cur) || s < this.slack(cur)) {
      this.bestOuter[v] = k;
      this.events.set(this.now + s / 2, 8 * v + KIND_OUTER);
    }
  }

  /** Finds unlabelled vertex w's least-slack edge to an outer vertex again. */
  private recomputeFree(w: number): void {
    let best = -1;
    let bestSlack = Infinity;
    const { adjP, adjW, adjWt, label, dualVar, timeRef } = this;
    const now = this.now;
    const bx = this.top(w);
    const dx = this.vDual(w);
    for (let i = this.adjStart[w] as number, e = i + (this.adjLen[w] as number); i < e; i++) {
      const u = adjW[i] as number;
      const bu = this.top(u);
      if (bu === bx || label[bu] !== 1) continue;
      const k = (adjP[i] as number) >> 1;
      const s = dx + (dualVar[u] as number) - (now - (timeRef[u] as number)) - 2 * (adjWt[i] as number);
      if (s < bestSlack) {
        bestSlack = s;
        best = k;
      }
    }
    this.bestFree[w] = best;
    if (best >= 0) {
      this.bestFreeAt[w] = this.now + bestSlack;
      this.events.set(this.now + bestSlack, 8 * w + KIND_FREE);
    }
  }

  /** Finds outer vertex v's least-slack edge to another outer blossom again. */
  private recomputeOuter(v: number): void {
    let best = -1;
    let bestSlack = Infinity;
    const { adjP, adjW, adjWt, label, dualVar, timeRef } = this;
    const now = this.now;
    const bx = this.top(v);
    const dx = this.vDual(v);
    for (let i = this.adjStart[v] as number, e = i + (this.adjLen[v] as number); i < e; i++) {
      const u = adjW[i] as number;
      const bu = this.top(u);
      if (bu === bx || label[bu] !== 1) continue;
      const k = (adjP[i] as number) >> 1;
      const s = dx + (dualVar[u] as number) - (now - (timeRef[u] as number)) - 2 * (adjWt[i] as number);
      if (s < bestSlack) {
        bestSlack = s;
        best = k;
      }
    }
    this.bestOuter[v] = best;
    if (best >= 0) this.events.set(this.now + bestSlack / 2, 8 * v + KIND_OUTER);
  }

  /** Follows tight edges from the queued S-vertices; true when the matching was augmented. */
  private scanQueue(): boolean {
    const { queue, label } = this;
    while (queue.length > 0) {
      const v = queue.pop() as number;
      let bv = this.top(v);
      if (label[bv] !== 1) continue;
      // v is outer while it is scanned (a blossom formed meanwhile is outer too), so its dual
      // is fixed until the next dual step.
      const dv = this.vDual(v);
      const { adjP, adjW, adjWt, allowEdge, dualVar, timeRef } = this;
      const now = this.now;
      for (let i = this.adjStart[v] as number, e = i + (this.adjLen[v] as number); i < e; i++) {
        const w = adjW[i] as number;
        const bw = this.top(w);
        if (bv === bw) continue;
        const p = adjP[i] as number;
        const k = p >> 1;
        if (allowEdge[k] === 0) {
          const lw = label[bw];
          const dw = lw === 1 ? (dualVar[w] as number) - (now - (timeRef[w] as number)) : lw === 2 ? (dualVar[w] as number) + (now - (timeRef[w] as number)) : (dualVar[w] as number);
          const sk = dv + dw - 2 * (adjWt[i] as number);
          if (sk > 0) {
            if (lw === 1) this.offerOuter(v, k, sk);
            else if (lw === 0) this.offerFree(w, k, sk);
            continue;
          }
          allowEdge[k] = 1;
        }
        if (this.useTightEdge(v, p)) return true;
        bv = this.top(v);
      }
    }
    return false;
  }

  /**
   * Tight edge from S-vertex v to w = endpoint[p]: label w's blossom T (and its mate S), close a
   * blossom, or augment (returns true).
   */
  private useTightEdge(v: number, p: number): boolean {
    const { label, labelEnd } = this;
    const k = p >> 1;
    const w = this.endpoint[p] as number;
    const bw = this.top(w);
    const lw = label[bw];
    if (lw === 0) {
      const base = this.blossomBase[bw] as number;
      if (this.mate[base] === -1) {
        // A free vertex that is no root (dual 0): the other end of an augmenting path.
        this.treeTops[base] = [];
        this.liveTrees++;
        this.setTopLabel(bw, 1, base);
        for (const x of this.leaves(bw, [])) this.timeRef[x] = this.now;
        labelEnd[bw] = -1;
        this.augmentMatching(k);
        return true;
      }
      this.assignLabel(w, 2, p ^ 1);
    } else if (lw === 1) {
      const base = this.scanBlossom(v, w);
      if (base < 0) {
        this.augmentMatching(k);
        return true;
      }
      this.addBlossom(base, k);
    }
    return false;
  }

  /**
   * One dual step (Galil's δ1…δ4): the earliest valid event decides δ. 'changed' when the matching
   * changed (an augmentation, or an outer vertex released at dual 0), 'stop' when no step is possible.
   */
  private dualStep(): 'continue' | 'stop' | 'changed' {
    const events = this.events;
    const { label } = this;
    while (events.size > 0) {
      const time = events.topKey;
      const id = events.topId;
      events.pop();
      const kind = id & 7;
      const x = id >> 3;
      let due: number;
      if (kind === KIND_VERTEX) {
        if (label[this.top(x)] !== 1) continue;
        due = this.now + this.vDual(x);
      } else if (kind === KIND_FREE) {
        if (label[this.top(x)] !== 0) continue;
        const k = this.bestFree[x] as number;
        if (k === -1) continue;
        if (!this.isFreeEdge(x, k)) {
          this.recomputeFree(x);
          continue;
        }
        due = this.now + this.slack(k);
      } else if (kind === KIND_OUTER) {
        if (label[this.top(x)] !== 1) continue;
        const k = this.bestOuter[x] as number;
        if (k === -1) continue;
        if (!this.isOuterEdge(x, k)) {
          this.recomputeOuter(x);
          continue;
        }
        due = this.now + this.slack(k) / 2;
      } else if (kind === KIND_BLOSSOM) {
        if ((this.blossomBase[x] as number) < 0 || this.blossomParent[x] !== -1 || label[x] !== 2) continue;
        due = this.now + this.zDual(x);
      } else {
        const lv = (this.level as Float64Array)[x] as number;
        if (lv === -Infinity || label[this.top(x)] !== 1) continue;
        due = this.now + this.vDual(x) - lv;
      }
      if (due !== time) {
        events.set(due, id);
        continue;
      }
      this.now = time;
      if (kind === KIND_VERTEX) {
        // The single-tree form of δ1: flip the tree path so x is left free at dual 0.
        const root = this.treeOf[this.top(x)] as number;
        this.flipToRoot(x, -1);
        this.dissolveTree(root);
        return 'changed';
      }
      if (kind === KIND_LEVEL) {
        this.fetchEdges(x);
        return 'continue';
      }
      if (kind === KIND_FREE || kind === KIND_OUTER) {
        // The edge is tight now: use it directly (the formulation re-scans its outer end).
        const k = (kind === KIND_FREE ? this.bestFree[x] : this.bestOuter[x]) as number;
        this.allow(k);
        const v = kind === KIND_FREE ? this.other(k, x) : x;
        const p = this.ei[k] === v ? 2 * k + 1 : 2 * k;
        if (this.useTightEdge(v, p)) return 'changed';
        if (kind === KIND_OUTER && label[this.top(x)] === 1) this.recomputeOuter(x);
      } else {
        this.expandBlossom(x, false);
      }
      return 'continue';
    }
    return 'stop';
  }

  /** Adds v's missing edges (its dual just reached its level); each new edge may be an event. */
  private fetchEdges(v: number, during = true): void {
    const { to, weight, level } = (this.lazy as LazyEdges).fetch(v);
    (this.level as Float64Array)[v] = level;
    const need = (this.adjLen[v] as number) + to.length;
    if (need > (this.adjRoom[v] as number)) this.moveRow(v, need + 4);
    if (during && level > -Infinity) this.events.set(this.now + this.vDual(v) - level, 8 * v + KIND_LEVEL);
    for (let i = 0; i < to.length; i++) {
      const u = to[i] as number;
      const k = this.addEdge(v, u, weight[i] as number);
      if (this.slack(k) < 0) throw new Error('solveMaxWeightMatching: a fetched edge violates its level');
      if (!during) continue;
      const bu = this.top(u);
      if (bu === this.top(v)) continue;
      if (this.label[bu] === 1) this.offerOuter(v, k, this.slack(k));
      else if (this.label[bu] === 0) this.offerFree(u, k, this.slack(k));
    }
  }

  run(): BlossomSolution {
    const n = this.n;
    // A vertex that starts below its level gets its edges before anything moves.
    const level = this.level;
    if (level !== null) {
      for (let v = 0; v < n; v++) {
        while ((this.dualVar[v] as number) < (level[v] as number)) this.fetchEdges(v, false);
      }
    }
    for (let v = 0; v < n; v++) {
      if (this.mate[v] !== -1) continue;
      // Without maxCardinality a free vertex with dual 0 already satisfies complementary
      // slackness; it is no root, but a tree may still end at it.
      if (!this.maxCardinality && this.dualVar[v] === 0) continue;
      this.assignLabel(v, 1, -1);
    }
    let augmentations = 0;
    while (this.liveTrees > 0) {
      if (this.scanQueue()) {
        augmentations++;
        continue;
      }
      const step = this.dualStep();
      if (step === 'changed') augmentations++;
      if (step === 'stop') break;
    }
    if (this.liveTrees > 0) {
      // Max-cardinality optimum reached; a final step makes it verifiable (as in the formulation).
      let d = Infinity;
      for (let v = 0; v < n; v++) d = Math.min(d, this.vDual(v));
      this.now += Math.max(0, d);
      for (let b = 0; b < 2 * n; b++) {
        if (this.blossomParent[b] === -1 && (b < n || (this.blossomBase[b] as number) >= 0) && this.label[b] !== 0) this.settle(b);
      }
    }
    const mateVertex = new Int32Array(n).fill(-1);
    for (let v = 0; v < n; v++) {
      if ((this.mate[v] as number) >= 0) mateVertex[v] = this.endpoint[this.mate[v] as number] as number;
    }
    return { mate: mateVertex, dual: this.dualVar, blossomParent: this.blossomParent, augmentations };
  }
}

/** Python-style index into a cyclic list: negative idx counts from the end (|idx| < length). */
function at(arr: number[], idx: number): number {
  return arr[idx < 0 ? idx + arr.length : idx] as number;
}

/**
 * Convenience form with the same input as van Rantwijk's maxWeightMatching: a list of
 * [i, j, weight] edges on vertices 0…max index. Returns mate (vertex or −1) per vertex.
 * Use integer weights for an exact result.
 */
export function maxWeightMatching(
  edges: readonly (readonly [number, number, number])[],
  options: { maxCardinality?: boolean } = {},
): number[] {
  let n = 0;
  for (const [i, j] of edges) n = Math.max(n, i + 1, j + 1);
  const edgeI = new Int32Array(edges.length);
  const edgeJ = new Int32Array(edges.length);
  const weight = new Float64Array(edges.length);
  edges.forEach(([i, j, w], k) => {
    edgeI[k] = i;
    edgeJ[k] = j;
    weight[k] = w;
  });
  const { mate } = solveMaxWeightMatching({ nVertex: n, edgeI, edgeJ, weight }, { maxCardinality: options.maxCardinality === true });
  return Array.from(mate);
}
