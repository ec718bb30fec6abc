/**
 * Maximum-weight matching on a general graph: Edmonds' blossom algorithm with the primal–dual
 * weight method, O(n³), as described in Z. Galil, "Efficient algorithms for finding maximum
 * matching in graphs", ACM Computing Surveys 18 (1986) 23–38, and following the structure of
 * Joris van Rantwijk's public-domain implementation (mwmatching.py, 2008). Variable names and the
 * order of the steps follow that formulation so the two can be read side by side.
 *
 * Differences that change speed but not results: typed arrays, neighbour lists in CSR form, and
 * per-stage bookkeeping that resets and scans only what the stage touched (labels, best edges,
 * allowed edges, labelled blossoms) instead of every vertex; the caller may start from a matching
 * and vertex duals of its own (a "warm start", see BlossomStart).
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

export interface BlossomOptions {
  /** Maximum weight among the matchings of maximum cardinality. */
  readonly maxCardinality?: boolean;
  readonly start?: BlossomStart;
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
  return new BlossomSolver(graph, options.maxCardinality === true, options.start).run();
}

/** The state of one run; one method per step of the formulation, so each stays small and fast. */
class BlossomSolver {
  private readonly n: number;
  private readonly ei: Int32Array;
  private readonly ej: Int32Array;
  private readonly wt: Float64Array;
  private readonly endpoint: Int32Array;
  private readonly nbStart: Int32Array;
  private readonly nbList: Int32Array;
  private readonly mate: Int32Array;
  private readonly label: Int8Array;
  private readonly labelEnd: Int32Array;
  private readonly inBlossom: Int32Array;
  private readonly blossomParent: Int32Array;
  private readonly blossomChilds: (number[] | null)[];
  private readonly blossomBase: Int32Array;
  private readonly blossomEndps: (number[] | null)[];
  private readonly bestEdge: Int32Array;
  private readonly blossomBestEdges: (number[] | null)[];
  private readonly unusedBlossoms: number[] = [];
  private readonly dualVar: Float64Array;
  private readonly allowEdge: Uint8Array;
  private readonly queue: number[] = [];
  // Per-stage bookkeeping: what was set this stage, so the reset and the scans touch only that.
  private stage = 0;
  private readonly labelMark: Int32Array;
  private readonly labelled: number[] = [];
  private readonly bestMark: Int32Array;
  private readonly bestSet: number[] = [];
  private readonly allowed: number[] = [];
  private readonly bbeSet: number[] = [];
  private readonly bestEdgeTo: Int32Array;
  private readonly scratch: number[] = [];
  private free: number[] = [];

  constructor(
    graph: BlossomGraph,
    private readonly maxCardinality: boolean,
    start: BlossomStart | undefined,
  ) {
    const n = graph.nVertex;
    const ei = graph.edgeI;
    const ej = graph.edgeJ;
    const m = ei.length;
    this.n = n;
    this.ei = ei;
    this.ej = ej;
    this.wt = graph.weight;
    const endpoint = new Int32Array(2 * m);
    const nbStart = new Int32Array(n + 1);
    for (let k = 0; k < m; k++) {
      endpoint[2 * k] = ei[k] as number;
      endpoint[2 * k + 1] = ej[k] as number;
      nbStart[(ei[k] as number) + 1]++;
      nbStart[(ej[k] as number) + 1]++;
    }
    for (let v = 0; v < n; v++) nbStart[v + 1] = (nbStart[v + 1] as number) + (nbStart[v] as number);
    const nbList = new Int32Array(2 * m);
    const fill = nbStart.slice(0, n);
    for (let k = 0; k < m; k++) {
      const i = ei[k] as number;
      const j = ej[k] as number;
      nbList[fill[i]++ as number] = 2 * k + 1;
      nbList[fill[j]++ as number] = 2 * k;
    }
    this.endpoint = endpoint;
    this.nbStart = nbStart;
    this.nbList = nbList;

    this.mate = new Int32Array(n).fill(-1);
    this.label = new Int8Array(2 * n);
    this.labelEnd = new Int32Array(2 * n).fill(-1);
    this.inBlossom = new Int32Array(n);
    for (let v = 0; v < n; v++) this.inBlossom[v] = v;
    this.blossomParent = new Int32Array(2 * n).fill(-1);
    this.blossomChilds = new Array<number[] | null>(2 * n).fill(null);
    this.blossomBase = new Int32Array(2 * n).fill(-1);
    for (let v = 0; v < n; v++) this.blossomBase[v] = v;
    this.blossomEndps = new Array<number[] | null>(2 * n).fill(null);
    this.bestEdge = new Int32Array(2 * n).fill(-1);
    this.blossomBestEdges = new Array<number[] | null>(2 * n).fill(null);
    for (let b = 2 * n - 1; b >= n; b--) this.unusedBlossoms.push(b);
    this.dualVar = new Float64Array(2 * n);
    this.allowEdge = new Uint8Array(m);
    this.labelMark = new Int32Array(2 * n).fill(-1);
    this.bestMark = new Int32Array(2 * n).fill(-1);
    this.bestEdgeTo = new Int32Array(2 * n).fill(-1);

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
    for (let v = 0; v < n; v++) if (this.mate[v] === -1) this.free.push(v);
  }

  private setLabel(x: number, t: number): void {
    this.label[x] = t;
    if (this.labelMark[x] !== this.stage) {
      this.labelMark[x] = this.stage;
      this.labelled.push(x);
    }
  }

  private setBest(x: number, k: number): void {
    this.bestEdge[x] = k;
    if (this.bestMark[x] !== this.stage) {
      this.bestMark[x] = this.stage;
      this.bestSet.push(x);
    }
  }

  private allow(k: number): void {
    if (this.allowEdge[k] === 0) {
      this.allowEdge[k] = 1;
      this.allowed.push(k);
    }
  }

  private slack(k: number): number {
    return (this.dualVar[this.ei[k] as number] as number) + (this.dualVar[this.ej[k] as number] as number) - 2 * (this.wt[k] as number);
  }

  /** Appends the leaves (vertices) of blossom b to out, depth first in child order. */
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

  private assignLabel(w: number, t: number, p: number): void {
    const b = this.inBlossom[w] as number;
    this.setLabel(w, t);
    this.setLabel(b, t);
    this.labelEnd[w] = p;
    this.labelEnd[b] = p;
    this.bestEdge[w] = -1;
    this.bestEdge[b] = -1;
    if (t === 1) {
      this.leaves(b, this.queue);
    } else {
      const mb = this.mate[this.blossomBase[b] as number] as number;
      this.assignLabel(this.endpoint[mb] as number, 1, mb ^ 1);
    }
  }

  /** Traces back from v and w to find a new blossom (returns its base) or an augmenting path (−1). */
  private scanBlossom(v0: number, w0: number): number {
    const { inBlossom, label, labelEnd, endpoint } = this;
    let v = v0;
    let w = w0;
    const path: number[] = [];
    let base = -1;
    while (v !== -1 || w !== -1) {
      let b = inBlossom[v] as number;
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
        b = inBlossom[v] as number;
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
    const { inBlossom, labelEnd, endpoint, blossomParent } = this;
    let v = this.ei[k] as number;
    let w = this.ej[k] as number;
    const bb = inBlossom[base] as number;
    let bv = inBlossom[v] as number;
    let bw = inBlossom[w] as number;
    const b = this.unusedBlossoms.pop() as number;
    this.blossomBase[b] = base;
    blossomParent[b] = -1;
    blossomParent[bb] = b;
    const path: number[] = [];
    const endps: number[] = [];
    while (bv !== bb) {
      blossomParent[bv] = b;
      path.push(bv);
      endps.push(labelEnd[bv] as number);
      v = endpoint[labelEnd[bv] as number] as number;
      bv = inBlossom[v] as number;
    }
    path.push(bb);
    path.reverse();
    endps.reverse();
    endps.push(2 * k);
    while (bw !== bb) {
      blossomParent[bw] = b;
      path.push(bw);
      endps.push((labelEnd[bw] as number) ^ 1);
      w = endpoint[labelEnd[bw] as number] as number;
      bw = inBlossom[w] as number;
    }
    this.blossomChilds[b] = path;
    this.blossomEndps[b] = endps;
    this.setLabel(b, 1);
    labelEnd[b] = labelEnd[bb] as number;
    this.dualVar[b] = 0;
    for (const x of this.leaves(b, [])) {
      if (this.label[inBlossom[x] as number] === 2) this.queue.push(x);
      inBlossom[x] = b;
    }
    // Least-slack edge from the new blossom to each other S-blossom.
    const touched: number[] = [];
    for (const sub of path) {
      const own = this.blossomBestEdges[sub];
      if (own === null || own === undefined) {
        for (const x of this.leaves(sub, [])) {
          const end = this.nbStart[x + 1] as number;
          for (let a = this.nbStart[x] as number; a < end; a++) this.considerBest(b, (this.nbList[a] as number) >> 1, touched);
        }
      } else {
        for (const k2 of own) this.considerBest(b, k2, touched);
      }
      this.blossomBestEdges[sub] = null;
      this.bestEdge[sub] = -1;
    }
    touched.sort((x, y) => x - y);
    const be: number[] = [];
    for (const bj of touched) {
      be.push(this.bestEdgeTo[bj] as number);
      this.bestEdgeTo[bj] = -1;
    }
    this.blossomBestEdges[b] = be;
    this.bbeSet.push(b);
    this.bestEdge[b] = -1;
    for (const k2 of be) {
      if (this.bestEdge[b] === -1 || this.slack(k2) < this.slack(this.bestEdge[b] as number)) this.setBest(b, k2);
    }
  }

  private considerBest(b: number, k2: number, touched: number[]): void {
    let j = this.ej[k2] as number;
    if (this.inBlossom[j] === b) j = this.ei[k2] as number;
    const bj = this.inBlossom[j] as number;
    if (bj !== b && this.label[bj] === 1) {
      const cur = this.bestEdgeTo[bj] as number;
      if (cur === -1) {
        touched.push(bj);
        this.bestEdgeTo[bj] = k2;
      } else if (this.slack(k2) < this.slack(cur)) {
        this.bestEdgeTo[bj] = k2;
      }
    }
  }

  private expandBlossom(b: number, endStage: boolean): void {
    const { inBlossom, label, labelEnd, endpoint } = this;
    const n = this.n;
    const childs = this.blossomChilds[b] as number[];
    for (const s of childs) {
      this.blossomParent[s] = -1;
      if (s < n) {
        inBlossom[s] = s;
      } else if (endStage && this.dualVar[s] === 0) {
        this.expandBlossom(s, endStage);
      } else {
        for (const x of this.leaves(s, [])) inBlossom[x] = s;
      }
    }
    if (!endStage && label[b] === 2) {
      const endps = this.blossomEndps[b] as number[];
      const entryChild = inBlossom[endpoint[(labelEnd[b] as number) ^ 1] as number] as number;
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
        this.setLabel(endpoint[p ^ 1] as number, 0);
        this.setLabel(endpoint[at(endps, j - endpTrick) ^ endpTrick ^ 1] as number, 0);
        this.assignLabel(endpoint[p ^ 1] as number, 2, p);
        this.allow(at(endps, j - endpTrick) >> 1);
        j += jStep;
        p = at(endps, j - endpTrick) ^ endpTrick;
        this.allow(p >> 1);
        j += jStep;
      }
      const bv0 = at(childs, j);
      this.setLabel(endpoint[p ^ 1] as number, 2);
      this.setLabel(bv0, 2);
      labelEnd[endpoint[p ^ 1] as number] = p;
      labelEnd[bv0] = p;
      this.bestEdge[bv0] = -1;
      j += jStep;
      while (at(childs, j) !== entryChild) {
        const bv = at(childs, j);
        if (label[bv] === 1) {
          j += jStep;
          continue;
        }
        let v = -1;
        for (const x of this.leaves(bv, [])) {
          v = x;
          if (label[x] !== 0) break;
        }
        if (v >= 0 && label[v] !== 0) {
          this.setLabel(v, 0);
          this.setLabel(endpoint[this.mate[this.blossomBase[bv] as number] as number] as number, 0);
          this.assignLabel(v, 2, labelEnd[v] as number);
        }
        j += jStep;
      }
    }
    this.setLabel(b, -1);
    labelEnd[b] = -1;
    this.blossomChilds[b] = null;
    this.blossomEndps[b] = null;
    this.blossomBase[b] = -1;
    this.blossomBestEdges[b] = null;
    this.bestEdge[b] = -1;
    this.unusedBlossoms.push(b);
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
    const { inBlossom, labelEnd, endpoint, mate } = this;
    let s = s0;
    let p = p0;
    for (;;) {
      const bs = inBlossom[s] as number;
      if (bs >= this.n) this.augmentBlossom(bs, s);
      mate[s] = p;
      if (labelEnd[bs] === -1) break;
      const t = endpoint[labelEnd[bs] as number] as number;
      const bt = inBlossom[t] as number;
      s = endpoint[labelEnd[bt] as number] as number;
      const j = endpoint[(labelEnd[bt] as number) ^ 1] as number;
      if (bt >= this.n) this.augmentBlossom(bt, j);
      mate[j] = labelEnd[bt] as number;
      p = (labelEnd[bt] as number) ^ 1;
    }
  }

  /** Swaps matched and unmatched edges along the augmenting path through edge k. */
  private augmentMatching(k: number): void {
    this.flipToRoot(this.ei[k] as number, 2 * k + 1);
    this.flipToRoot(this.ej[k] as number, 2 * k);
  }

  private minVertexDual(): number {
    let d = Infinity;
    for (let v = 0; v < this.n; v++) if ((this.dualVar[v] as number) < d) d = this.dualVar[v] as number;
    return d;
  }

  /** Resets what the last stage set and labels the root(s); false when no root is left. */
  private startStage(): boolean {
    this.stage++;
    for (const x of this.labelled) this.label[x] = 0;
    this.labelled.length = 0;
    for (const x of this.bestSet) this.bestEdge[x] = -1;
    this.bestSet.length = 0;
    for (const k of this.allowed) this.allowEdge[k] = 0;
    this.allowed.length = 0;
    for (const b of this.bbeSet) this.blossomBestEdges[b] = null;
    this.bbeSet.length = 0;
    this.queue.length = 0;

    const stillFree: number[] = [];
    for (const v of this.free) {
      if (this.mate[v] !== -1) continue;
      // Without maxCardinality a free vertex with dual 0 already satisfies complementary
      // slackness; it is no root, but a tree may still end at it.
      if (!this.maxCardinality && this.dualVar[v] === 0) continue;
      stillFree.push(v);
      if (this.label[this.inBlossom[v] as number] === 0) this.assignLabel(v, 1, -1);
    }
    this.free = stillFree;
    return this.maxCardinality || stillFree.length > 0;
  }

  /** Follows tight edges from the queued S-vertices; true when the matching was augmented. */
  private scanQueue(): boolean {
    const { inBlossom, label, labelEnd, endpoint, allowEdge, bestEdge, nbStart, nbList, queue } = this;
    while (queue.length > 0) {
      const v = queue.pop() as number;
      const end = nbStart[v + 1] as number;
      for (let a = nbStart[v] as number; a < end; a++) {
        const p = nbList[a] as number;
        const k = p >> 1;
        const w = endpoint[p] as number;
        if (inBlossom[v] === inBlossom[w]) continue;
        let kSlack = 0;
        if (allowEdge[k] === 0) {
          kSlack = this.slack(k);
          if (kSlack <= 0) this.allow(k);
        }
        if (allowEdge[k] === 1) {
          const bw = inBlossom[w] as number;
          const lw = label[bw];
          if (lw === 0) {
            if (this.mate[this.blossomBase[bw] as number] === -1) {
              // A free vertex that is no root (dual 0): the other end of an augmenting path.
              this.setLabel(bw, 1);
              labelEnd[bw] = -1;
              this.augmentMatching(k);
              return true;
            }
            this.assignLabel(w, 2, p ^ 1);
          } else if (lw === 1) {
            const base = this.scanBlossom(v, w);
            if (base >= 0) {
              this.addBlossom(base, k);
            } else {
              this.augmentMatching(k);
              return true;
            }
          } else if (label[w] === 0) {
            this.setLabel(w, 2);
            labelEnd[w] = p ^ 1;
          }
        } else if (label[inBlossom[w] as number] === 1) {
          const b = inBlossom[v] as number;
          if (bestEdge[b] === -1 || kSlack < this.slack(bestEdge[b] as number)) this.setBest(b, k);
        } else if (label[w] === 0) {
          if (bestEdge[w] === -1 || kSlack < this.slack(bestEdge[w] as number)) this.setBest(w, k);
        }
      }
    }
    return false;
  }

  /** Adds delta to the duals of the labelled top-level blossoms (S: −, T: + for vertices). */
  private applyDelta(delta: number): void {
    const n = this.n;
    const scratch = this.scratch;
    for (const x of this.labelled) {
      if (this.blossomParent[x] !== -1) continue;
      if (x >= n && (this.blossomBase[x] as number) < 0) continue;
      const lx = this.label[x];
      if (lx !== 1 && lx !== 2) continue;
      const d = lx === 1 ? -delta : delta;
      if (x < n) {
        this.dualVar[x] = (this.dualVar[x] as number) + d;
      } else {
        scratch.length = 0;
        for (const v of this.leaves(x, scratch)) this.dualVar[v] = (this.dualVar[v] as number) + d;
        this.dualVar[x] = (this.dualVar[x] as number) - d;
      }
    }
  }

  /**
   * One dual step (Galil's δ1…δ4). Returns true when the stage is over: by a "δ1" event
   * (single tree: an outer vertex reached dual 0 and was released; forest: optimum reached).
   */
  private dualStep(): 'continue' | 'stop' | 'released' {
    const n = this.n;
    const { label, inBlossom, bestEdge, blossomParent, dualVar } = this;
    let deltaType = -1;
    let delta = 0;
    let deltaEdge = -1;
    let deltaBlossom = -1;
    let zeroVertex = -1;
    if (!this.maxCardinality) {
      // Smallest dual among the outer (S) vertices; the classic form takes the minimum over all
      // vertices, which is the same when every free vertex starts with the same dual.
      deltaType = 1;
      delta = Infinity;
      const lv = this.scratch;
      for (const x of this.labelled) {
        if (blossomParent[x] !== -1 || label[x] !== 1) continue;
        if (x >= n && (this.blossomBase[x] as number) < 0) continue;
        lv.length = 0;
        for (const v of this.leaves(x, lv)) {
          if ((dualVar[v] as number) < delta) {
            delta = dualVar[v] as number;
            zeroVertex = v;
          }
        }
      }
    }
    for (const v of this.bestSet) {
      if (v < n && label[inBlossom[v] as number] === 0 && bestEdge[v] !== -1) {
        const d = this.slack(bestEdge[v] as number);
        if (deltaType === -1 || d < delta) {
          delta = d;
          deltaType = 2;
          deltaEdge = bestEdge[v] as number;
        }
      }
    }
    for (const b of this.labelled) {
      if (blossomParent[b] === -1 && label[b] === 1 && bestEdge[b] !== -1) {
        const d = this.slack(bestEdge[b] as number) / 2;
        if (deltaType === -1 || d < delta) {
          delta = d;
          deltaType = 3;
          deltaEdge = bestEdge[b] as number;
        }
      }
    }
    for (const b of this.labelled) {
      if (
        b >= n &&
        (this.blossomBase[b] as number) >= 0 &&
        blossomParent[b] === -1 &&
        label[b] === 2 &&
        (deltaType === -1 || (dualVar[b] as number) < delta)
      ) {
        delta = dualVar[b] as number;
        deltaType = 4;
        deltaBlossom = b;
      }
    }
    if (deltaType === -1) {
      // Max-cardinality optimum reached; a final step makes it verifiable (as in the formulation).
      deltaType = 1;
      delta = Math.max(0, this.minVertexDual());
    }
    this.applyDelta(delta);

    if (deltaType === 1) {
      if (!this.maxCardinality && zeroVertex >= 0) {
        const wasMatched = this.mate[zeroVertex] !== -1;
        if (wasMatched || inBlossom[zeroVertex] !== zeroVertex) this.flipToRoot(zeroVertex, -1);
        if (wasMatched) this.free.push(zeroVertex);
        return 'released';
      }
      return 'stop';
    }
    if (deltaType === 2) {
      this.allow(deltaEdge);
      let i = this.ei[deltaEdge] as number;
      if (label[inBlossom[i] as number] === 0) i = this.ej[deltaEdge] as number;
      this.queue.push(i);
    } else if (deltaType === 3) {
      this.allow(deltaEdge);
      this.queue.push(this.ei[deltaEdge] as number);
    } else {
      this.expandBlossom(deltaBlossom, false);
    }
    return 'continue';
  }

  run(): BlossomSolution {
    const n = this.n;
    let augmentations = 0;
    while (this.startStage()) {
      let changed = false;
      for (;;) {
        if (this.scanQueue()) {
          changed = true;
          break;
        }
        const step = this.dualStep();
        if (step === 'released') changed = true;
        if (step !== 'continue') break;
      }
      if (!changed) break;
      augmentations++;
      // End of stage: expand S-blossoms whose dual reached zero.
      for (const b of this.labelled.slice()) {
        if (
          b >= n &&
          this.blossomParent[b] === -1 &&
          (this.blossomBase[b] as number) >= 0 &&
          this.label[b] === 1 &&
          this.dualVar[b] === 0
        ) {
          this.expandBlossom(b, true);
        }
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
