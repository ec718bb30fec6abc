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
 * A starting point: matched edges (per vertex, the edge index or −1) and the vertex duals in the
 * doubled convention of the formulation (slack of edge k = dual[i] + dual[j] − 2·w[k]). The
 * caller guarantees: every slack ≥ 0, every matched edge has slack 0, and — for exact integer
 * arithmetic — every dual even and every weight an integer. In max-cardinality mode on a graph
 * with a perfect matching these are all the algorithm needs; otherwise the free vertices must
 * also share the smallest dual, which holds for the default start (all duals = max weight).
 */
export interface BlossomStart {
  readonly mateEdge: Int32Array;
  readonly dual: Float64Array;
}

export interface BlossomOptions {
  /** Maximum weight among the matchings of maximum cardinality. */
  readonly maxCardinality?: boolean;
  readonly start?: BlossomStart;
  /**
   * Grow one alternating tree per stage, from one free vertex whose dual is still positive,
   * instead of a forest from all free vertices; not with maxCardinality. A stage ends when the
   * tree reaches any free vertex by a tight edge (augment), or when the dual of one of its outer
   * vertices x reaches 0 (the even path from the root to x is flipped: the root is matched and x
   * left free, with dual 0 as complementary slackness asks — x is the root itself when no partner
   * is worth having). Every step keeps the duals feasible and the matched edges tight, and the
   * stages end when every free vertex has dual 0, which is the optimality condition; so the
   * result is the same maximum weight as the forest version, but each stage costs the size of one
   * tree, and any feasible start (duals ≥ 0, matched edges tight, no blossoms) is accepted.
   */
  readonly singleTree?: boolean;
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
  const maxCardinality = options.maxCardinality === true;
  const singleTree = options.singleTree === true;
  const start = options.start;
  if (singleTree && maxCardinality) throw new Error('solveMaxWeightMatching: singleTree does not combine with maxCardinality');
  const n = graph.nVertex;
  const ei = graph.edgeI;
  const ej = graph.edgeJ;
  const wt = graph.weight;
  const m = ei.length;

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

  let maxWeight = 0;
  for (let k = 0; k < m; k++) if ((wt[k] as number) > maxWeight) maxWeight = wt[k] as number;

  const mate = new Int32Array(n).fill(-1);
  const label = new Int8Array(2 * n);
  const labelEnd = new Int32Array(2 * n).fill(-1);
  const inBlossom = new Int32Array(n);
  for (let v = 0; v < n; v++) inBlossom[v] = v;
  const blossomParent = new Int32Array(2 * n).fill(-1);
  const blossomChilds: (number[] | null)[] = new Array<number[] | null>(2 * n).fill(null);
  const blossomBase = new Int32Array(2 * n).fill(-1);
  for (let v = 0; v < n; v++) blossomBase[v] = v;
  const blossomEndps: (number[] | null)[] = new Array<number[] | null>(2 * n).fill(null);
  const bestEdge = new Int32Array(2 * n).fill(-1);
  const blossomBestEdges: (number[] | null)[] = new Array<number[] | null>(2 * n).fill(null);
  const unusedBlossoms: number[] = [];
  for (let b = 2 * n - 1; b >= n; b--) unusedBlossoms.push(b);
  const dualVar = new Float64Array(2 * n);
  const allowEdge = new Uint8Array(m);
  const queue: number[] = [];

  if (start) {
    for (let v = 0; v < n; v++) {
      dualVar[v] = start.dual[v] as number;
      const k = start.mateEdge[v] as number;
      if (k >= 0) mate[v] = ei[k] === v ? 2 * k + 1 : 2 * k;
    }
  } else {
    for (let v = 0; v < n; v++) dualVar[v] = maxWeight;
  }

  // Per-stage bookkeeping: what was set this stage, so the reset and the scans touch only that.
  let stage = 0;
  const labelMark = new Int32Array(2 * n).fill(-1);
  const labelled: number[] = [];
  const bestMark = new Int32Array(2 * n).fill(-1);
  const bestSet: number[] = [];
  const allowed: number[] = [];
  const bbeSet: number[] = [];
  const bestEdgeTo = new Int32Array(2 * n).fill(-1);

  const setLabel = (x: number, t: number): void => {
    label[x] = t;
    if (labelMark[x] !== stage) {
      labelMark[x] = stage;
      labelled.push(x);
    }
  };
  const setBest = (x: number, k: number): void => {
    bestEdge[x] = k;
    if (bestMark[x] !== stage) {
      bestMark[x] = stage;
      bestSet.push(x);
    }
  };
  const allow = (k: number): void => {
    if (allowEdge[k] === 0) {
      allowEdge[k] = 1;
      allowed.push(k);
    }
  };
  const slack = (k: number): number =>
    (dualVar[ei[k] as number] as number) + (dualVar[ej[k] as number] as number) - 2 * (wt[k] as number);

  /** Leaves (vertices) of blossom b, depth first in child order. */
  const leaves = (b: number, out: number[]): number[] => {
    if (b < n) {
      out.push(b);
      return out;
    }
    const stack = [b];
    while (stack.length > 0) {
      const x = stack.pop() as number;
      if (x < n) {
        out.push(x);
        continue;
      }
      const ch = blossomChilds[x] as number[];
      for (let c = ch.length - 1; c >= 0; c--) stack.push(ch[c] as number);
    }
    return out;
  };

  const assignLabel = (w: number, t: number, p: number): void => {
    const b = inBlossom[w] as number;
    setLabel(w, t);
    setLabel(b, t);
    labelEnd[w] = p;
    labelEnd[b] = p;
    bestEdge[w] = -1;
    bestEdge[b] = -1;
    if (t === 1) {
      const lv = leaves(b, []);
      for (const v of lv) queue.push(v);
    } else {
      const base = blossomBase[b] as number;
      const mb = mate[base] as number;
      assignLabel(endpoint[mb] as number, 1, mb ^ 1);
    }
  };

  /** Traces back from v and w to find a new blossom (returns its base) or an augmenting path (−1). */
  const scanBlossom = (v0: number, w0: number): number => {
    let v = v0;
    let w = w0;
    const path: number[] = [];
    let base = -1;
    while (v !== -1 || w !== -1) {
      let b = inBlossom[v] as number;
      if ((label[b] as number) & 4) {
        base = blossomBase[b] as number;
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
  };

  const addBlossom = (base: number, k: number): void => {
    let v = ei[k] as number;
    let w = ej[k] as number;
    const bb = inBlossom[base] as number;
    let bv = inBlossom[v] as number;
    let bw = inBlossom[w] as number;
    const b = unusedBlossoms.pop() as number;
    blossomBase[b] = base;
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
    blossomChilds[b] = path;
    blossomEndps[b] = endps;
    setLabel(b, 1);
    labelEnd[b] = labelEnd[bb] as number;
    dualVar[b] = 0;
    for (const x of leaves(b, [])) {
      if (label[inBlossom[x] as number] === 2) queue.push(x);
      inBlossom[x] = b;
    }
    const touched: number[] = [];
    const consider = (k2: number): void => {
      let j = ej[k2] as number;
      if (inBlossom[j] === b) j = ei[k2] as number;
      const bj = inBlossom[j] as number;
      if (bj !== b && label[bj] === 1) {
        const cur = bestEdgeTo[bj] as number;
        if (cur === -1) {
          touched.push(bj);
          bestEdgeTo[bj] = k2;
        } else if (slack(k2) < slack(cur)) {
          bestEdgeTo[bj] = k2;
        }
      }
    };
    for (const sub of path) {
      const own = blossomBestEdges[sub];
      if (own === null || own === undefined) {
        for (const x of leaves(sub, [])) {
          const end = nbStart[x + 1] as number;
          for (let a = nbStart[x] as number; a < end; a++) consider((nbList[a] as number) >> 1);
        }
      } else {
        for (const k2 of own) consider(k2);
      }
      blossomBestEdges[sub] = null;
      bestEdge[sub] = -1;
    }
    touched.sort((x, y) => x - y);
    const be: number[] = [];
    for (const bj of touched) {
      be.push(bestEdgeTo[bj] as number);
      bestEdgeTo[bj] = -1;
    }
    blossomBestEdges[b] = be;
    bbeSet.push(b);
    bestEdge[b] = -1;
    for (const k2 of be) {
      if (bestEdge[b] === -1 || slack(k2) < slack(bestEdge[b] as number)) setBest(b, k2);
    }
  };

  const at = (arr: number[], idx: number): number => arr[idx < 0 ? idx + arr.length : idx] as number;

  const expandBlossom = (b: number, endStage: boolean): void => {
    const childs = blossomChilds[b] as number[];
    for (const s of childs) {
      blossomParent[s] = -1;
      if (s < n) {
        inBlossom[s] = s;
      } else if (endStage && dualVar[s] === 0) {
        expandBlossom(s, endStage);
      } else {
        for (const x of leaves(s, [])) inBlossom[x] = s;
      }
    }
    if (!endStage && label[b] === 2) {
      const endps = blossomEndps[b] as number[];
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
        setLabel(endpoint[p ^ 1] as number, 0);
        setLabel(endpoint[at(endps, j - endpTrick) ^ endpTrick ^ 1] as number, 0);
        assignLabel(endpoint[p ^ 1] as number, 2, p);
        allow(at(endps, j - endpTrick) >> 1);
        j += jStep;
        p = at(endps, j - endpTrick) ^ endpTrick;
        allow(p >> 1);
        j += jStep;
      }
      const bv0 = at(childs, j);
      setLabel(endpoint[p ^ 1] as number, 2);
      setLabel(bv0, 2);
      labelEnd[endpoint[p ^ 1] as number] = p;
      labelEnd[bv0] = p;
      bestEdge[bv0] = -1;
      j += jStep;
      while (at(childs, j) !== entryChild) {
        const bv = at(childs, j);
        if (label[bv] === 1) {
          j += jStep;
          continue;
        }
        const lv = leaves(bv, []);
        let v = -1;
        for (const x of lv) {
          v = x;
          if (label[x] !== 0) break;
        }
        if (v >= 0 && label[v] !== 0) {
          setLabel(v, 0);
          setLabel(endpoint[mate[blossomBase[bv] as number] as number] as number, 0);
          assignLabel(v, 2, labelEnd[v] as number);
        }
        j += jStep;
      }
    }
    setLabel(b, -1);
    labelEnd[b] = -1;
    blossomChilds[b] = null;
    blossomEndps[b] = null;
    blossomBase[b] = -1;
    blossomBestEdges[b] = null;
    bestEdge[b] = -1;
    unusedBlossoms.push(b);
  };

  /** Swaps matched and unmatched edges on the even path from vertex v to the base of blossom b. */
  const augmentBlossom = (b: number, v: number): void => {
    let t = v;
    while (blossomParent[t] !== b) t = blossomParent[t] as number;
    if (t >= n) augmentBlossom(t, v);
    let childs = blossomChilds[b] as number[];
    let endps = blossomEndps[b] as number[];
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
      if (t >= n) augmentBlossom(t, endpoint[p] as number);
      j += jStep;
      t = at(childs, j);
      if (t >= n) augmentBlossom(t, endpoint[p ^ 1] as number);
      mate[endpoint[p] as number] = p ^ 1;
      mate[endpoint[p ^ 1] as number] = p;
    }
    childs = childs.slice(i).concat(childs.slice(0, i));
    endps = endps.slice(i).concat(endps.slice(0, i));
    blossomChilds[b] = childs;
    blossomEndps[b] = endps;
    blossomBase[b] = blossomBase[childs[0] as number] as number;
  };

  /** Swaps matched and unmatched edges along the augmenting path through edge k. */
  const augmentMatching = (k: number): void => {
    for (let side = 0; side < 2; side++) {
      let s = side === 0 ? (ei[k] as number) : (ej[k] as number);
      let p = side === 0 ? 2 * k + 1 : 2 * k;
      for (;;) {
        const bs = inBlossom[s] as number;
        if (bs >= n) augmentBlossom(bs, s);
        mate[s] = p;
        if (labelEnd[bs] === -1) break;
        const t = endpoint[labelEnd[bs] as number] as number;
        const bt = inBlossom[t] as number;
        s = endpoint[labelEnd[bt] as number] as number;
        const j = endpoint[(labelEnd[bt] as number) ^ 1] as number;
        if (bt >= n) augmentBlossom(bt, j);
        mate[j] = labelEnd[bt] as number;
        p = (labelEnd[bt] as number) ^ 1;
      }
    }
  };

  /** Flips the even tree path from the root to outer vertex x: the root is matched, x left free. */
  const releaseVertex = (x: number): void => {
    let s = x;
    let p = -1;
    for (;;) {
      const bs = inBlossom[s] as number;
      if (bs >= n) augmentBlossom(bs, s);
      mate[s] = p;
      if (labelEnd[bs] === -1) break;
      const t = endpoint[labelEnd[bs] as number] as number;
      const bt = inBlossom[t] as number;
      s = endpoint[labelEnd[bt] as number] as number;
      const j = endpoint[(labelEnd[bt] as number) ^ 1] as number;
      if (bt >= n) augmentBlossom(bt, j);
      mate[j] = labelEnd[bt] as number;
      p = (labelEnd[bt] as number) ^ 1;
    }
  };

  const minVertexDual = (): number => {
    let d = Infinity;
    for (let v = 0; v < n; v++) if ((dualVar[v] as number) < d) d = dualVar[v] as number;
    return d;
  };

  let free: number[] = [];
  for (let v = 0; v < n; v++) if (mate[v] === -1) free.push(v);
  let augmentations = 0;

  for (;;) {
    // Start of a stage: forget last stage's labels, best edges and allowed edges.
    stage++;
    for (const x of labelled) label[x] = 0;
    labelled.length = 0;
    for (const x of bestSet) bestEdge[x] = -1;
    bestSet.length = 0;
    for (const k of allowed) allowEdge[k] = 0;
    allowed.length = 0;
    for (const b of bbeSet) blossomBestEdges[b] = null;
    bbeSet.length = 0;
    queue.length = 0;

    const stillFree: number[] = [];
    let rooted = false;
    for (const v of free) {
      if (mate[v] !== -1) continue;
      if (singleTree) {
        // A free vertex with dual 0 already satisfies complementary slackness and stays as it is.
        if (dualVar[v] === 0) continue;
        stillFree.push(v);
        if (rooted) continue;
        rooted = true;
      } else {
        stillFree.push(v);
      }
      if (label[inBlossom[v] as number] === 0) assignLabel(v, 1, -1);
    }
    free = stillFree;
    if (singleTree && !rooted) break;

    let augmented = false;
    for (;;) {
      while (queue.length > 0 && !augmented) {
        const v = queue.pop() as number;
        const end = nbStart[v + 1] as number;
        for (let a = nbStart[v] as number; a < end; a++) {
          const p = nbList[a] as number;
          const k = p >> 1;
          const w = endpoint[p] as number;
          if (inBlossom[v] === inBlossom[w]) continue;
          let kSlack = 0;
          if (allowEdge[k] === 0) {
            kSlack = slack(k);
            if (kSlack <= 0) allow(k);
          }
          if (allowEdge[k] === 1) {
            const lw = label[inBlossom[w] as number];
            if (lw === 0) {
              const bw = inBlossom[w] as number;
              if (singleTree && mate[blossomBase[bw] as number] === -1) {
                // The tree reached a free vertex outside it: that vertex is the other end of the path.
                setLabel(bw, 1);
                labelEnd[bw] = -1;
                augmentMatching(k);
                augmented = true;
                break;
              }
              assignLabel(w, 2, p ^ 1);
            } else if (lw === 1) {
              const base = scanBlossom(v, w);
              if (base >= 0) {
                addBlossom(base, k);
              } else {
                augmentMatching(k);
                augmented = true;
                break;
              }
            } else if (label[w] === 0) {
              setLabel(w, 2);
              labelEnd[w] = p ^ 1;
            }
          } else if (label[inBlossom[w] as number] === 1) {
            const b = inBlossom[v] as number;
            if (bestEdge[b] === -1 || kSlack < slack(bestEdge[b] as number)) setBest(b, k);
          } else if (label[w] === 0) {
            if (bestEdge[w] === -1 || kSlack < slack(bestEdge[w] as number)) setBest(w, k);
          }
        }
      }
      if (augmented) break;

      // No tight edge left to follow: change the duals by the largest step that keeps them feasible.
      let deltaType = -1;
      let delta = 0;
      let deltaEdge = -1;
      let deltaBlossom = -1;
      let zeroVertex = -1;
      if (singleTree) {
        // Smallest dual among the tree's outer (S) vertices.
        deltaType = 1;
        delta = Infinity;
        const lv: number[] = [];
        for (const x of labelled) {
          if (blossomParent[x] !== -1 || label[x] !== 1) continue;
          if (x >= n && (blossomBase[x] as number) < 0) continue;
          lv.length = 0;
          for (const v of leaves(x, lv)) {
            if ((dualVar[v] as number) < delta) {
              delta = dualVar[v] as number;
              zeroVertex = v;
            }
          }
        }
      } else if (!maxCardinality) {
        deltaType = 1;
        delta = minVertexDual();
      }
      for (const v of bestSet) {
        if (v < n && label[inBlossom[v] as number] === 0 && bestEdge[v] !== -1) {
          const d = slack(bestEdge[v] as number);
          if (deltaType === -1 || d < delta) {
            delta = d;
            deltaType = 2;
            deltaEdge = bestEdge[v] as number;
          }
        }
      }
      for (const b of labelled) {
        if (blossomParent[b] === -1 && label[b] === 1 && bestEdge[b] !== -1) {
          const d = slack(bestEdge[b] as number) / 2;
          if (deltaType === -1 || d < delta) {
            delta = d;
            deltaType = 3;
            deltaEdge = bestEdge[b] as number;
          }
        }
      }
      for (const b of labelled) {
        if (
          b >= n &&
          (blossomBase[b] as number) >= 0 &&
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
        delta = Math.max(0, minVertexDual());
      }

      const scratch: number[] = [];
      for (const x of labelled) {
        if (blossomParent[x] !== -1) continue;
        if (x >= n && (blossomBase[x] as number) < 0) continue;
        const lx = label[x];
        if (lx !== 1 && lx !== 2) continue;
        scratch.length = 0;
        const sign = lx === 1 ? -1 : 1;
        for (const v of leaves(x, scratch)) dualVar[v] = (dualVar[v] as number) + sign * delta;
        if (x >= n) dualVar[x] = (dualVar[x] as number) - sign * delta;
      }

      if (deltaType === 1) {
        if (singleTree && zeroVertex >= 0) {
          const wasMatched = mate[zeroVertex] !== -1;
          if (wasMatched || inBlossom[zeroVertex] !== zeroVertex) releaseVertex(zeroVertex);
          if (wasMatched) free.push(zeroVertex);
          augmented = true;
        }
        break;
      }
      if (deltaType === 2) {
        allow(deltaEdge);
        let i = ei[deltaEdge] as number;
        if (label[inBlossom[i] as number] === 0) i = ej[deltaEdge] as number;
        queue.push(i);
      } else if (deltaType === 3) {
        allow(deltaEdge);
        queue.push(ei[deltaEdge] as number);
      } else {
        expandBlossom(deltaBlossom, false);
      }
    }
    if (!augmented) break;
    augmentations++;

    // End of stage: expand S-blossoms whose dual reached zero.
    for (const b of labelled.slice()) {
      if (b >= n && blossomParent[b] === -1 && (blossomBase[b] as number) >= 0 && label[b] === 1 && dualVar[b] === 0) {
        expandBlossom(b, true);
      }
    }
  }

  const mateVertex = new Int32Array(n).fill(-1);
  for (let v = 0; v < n; v++) if ((mate[v] as number) >= 0) mateVertex[v] = endpoint[mate[v] as number] as number;
  return { mate: mateVertex, dual: dualVar, blossomParent, augmentations };
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
