/**
 * Minimum-cost perfect assignment on a sparse bipartite graph (rows and columns 0…n−1) by
 * shortest augmenting paths with dual variables: R. Jonker and A. Volgenant, "A shortest
 * augmenting path algorithm for dense and sparse linear assignment problems", Computing 38
 * (1987) 325–340 — Dijkstra from one free row over reduced costs c − u − v, stopped at the first
 * free column, then the duals of the scanned part are moved so the path is tight.
 */
import { MinHeap } from './min-heap.ts';

/** Row r's arcs are arcCol/arcCost[rowStart[r] … rowStart[r+1]−1]. Costs are integers. */
export interface SparseAssignment {
  readonly n: number;
  readonly rowStart: Int32Array;
  readonly arcCol: Int32Array;
  readonly arcCost: Float64Array;
}

export interface AssignmentSolution {
  /** Column assigned to each row. */
  readonly colOf: Int32Array;
  /** Row and column duals: u[r] + v[c] ≤ cost on every arc, equal on assigned arcs. */
  readonly u: Float64Array;
  readonly v: Float64Array;
}

/**
 * A minimum-cost perfect assignment and an optimal dual (LP duality certifies it). The caller
 * guarantees a perfect assignment exists. Integer costs give integer duals, exactly.
 * `start`: the solution of an earlier problem with the same rows and columns and a subset of these
 * arcs at the same costs (the sparse graph grew). Each row's dual is lowered until its new arcs
 * are feasible; a row whose dual had to move loses its column, and only those rows are searched
 * again.
 */
export function solveAssignment(p: SparseAssignment, start?: AssignmentSolution): AssignmentSolution {
  const { n, rowStart, arcCol, arcCost } = p;
  const u = new Float64Array(n);
  const v = new Float64Array(n);
  const colOf = new Int32Array(n).fill(-1);
  const rowOf = new Int32Array(n).fill(-1);

  if (start) {
    v.set(start.v);
    for (let r = 0; r < n; r++) {
      let ur = start.u[r] as number;
      for (let a = rowStart[r] as number; a < (rowStart[r + 1] as number); a++) {
        const reduced = (arcCost[a] as number) - (v[arcCol[a] as number] as number);
        if (reduced < ur) ur = reduced;
      }
      u[r] = ur;
      const c = start.colOf[r] as number;
      if (ur === start.u[r] && c >= 0) {
        colOf[r] = c;
        rowOf[c] = r;
      }
    }
  } else {
    initialDuals(p, u, colOf, rowOf);
  }
  augmentFreeRows(p, u, v, colOf, rowOf);
  return { colOf, u, v };
}

/** u = row minimum, v = 0; a row takes a free column on a tight arc. */
function initialDuals(p: SparseAssignment, u: Float64Array, colOf: Int32Array, rowOf: Int32Array): void {
  const { n, rowStart, arcCol, arcCost } = p;
  for (let r = 0; r < n; r++) {
    let best = Infinity;
    let bestCol = -1;
    for (let a = rowStart[r] as number; a < (rowStart[r + 1] as number); a++) {
      const c = arcCost[a] as number;
      if (c < best || (c === best && rowOf[arcCol[a] as number] === -1)) {
        best = c;
        bestCol = arcCol[a] as number;
      }
    }
    u[r] = best;
    if (bestCol >= 0 && rowOf[bestCol] === -1) {
      rowOf[bestCol] = r;
      colOf[r] = bestCol;
    }
  }
}

/** Shortest augmenting paths (Dijkstra over reduced costs) from every free row. */
function augmentFreeRows(p: SparseAssignment, u: Float64Array, v: Float64Array, colOf: Int32Array, rowOf: Int32Array): void {
  const { n, rowStart, arcCol, arcCost } = p;

  const dist = new Float64Array(n).fill(Infinity);
  const prevRow = new Int32Array(n).fill(-1);
  const done = new Uint8Array(n);
  const rowDist = new Float64Array(n);
  const touchedCols: number[] = [];
  const treeRows: number[] = [];
  const heap = new MinHeap();

  for (let root = 0; root < n; root++) {
    if (colOf[root] !== -1) continue;
    touchedCols.length = 0;
    treeRows.length = 0;
    heap.clear();
    treeRows.push(root);
    rowDist[root] = 0;
    let r = root;
    let rd = 0;
    let sink = -1;
    let sinkDist = 0;
    for (;;) {
      const ur = u[r] as number;
      for (let a = rowStart[r] as number; a < (rowStart[r + 1] as number); a++) {
        const c = arcCol[a] as number;
        if (done[c]) continue;
        const d = rd + (arcCost[a] as number) - ur - (v[c] as number);
        if (d < (dist[c] as number)) {
          if (dist[c] === Infinity) touchedCols.push(c);
          dist[c] = d;
          prevRow[c] = r;
          heap.push(d, c);
        }
      }
      let c = -1;
      let dc = 0;
      while (heap.size > 0) {
        const id = heap.topId;
        const key = heap.topKey;
        heap.pop();
        if (done[id] || key !== dist[id]) continue;
        c = id;
        dc = key;
        break;
      }
      if (c < 0) throw new Error('solveAssignment: no perfect assignment exists');
      done[c] = 1;
      if (rowOf[c] === -1) {
        sink = c;
        sinkDist = dc;
        break;
      }
      r = rowOf[c] as number;
      rd = dc;
      rowDist[r] = dc;
      treeRows.push(r);
    }
    // Dual update over the scanned part, then augment along prevRow.
    for (const c of touchedCols) {
      if (done[c]) v[c] = (v[c] as number) - (sinkDist - (dist[c] as number));
    }
    for (const tr of treeRows) u[tr] = (u[tr] as number) + (sinkDist - (rowDist[tr] as number));
    let c = sink;
    for (;;) {
      const pr = prevRow[c] as number;
      const next = colOf[pr] as number;
      colOf[pr] = c;
      rowOf[c] = pr;
      if (pr === root) break;
      c = next;
    }
    for (const tc of touchedCols) {
      dist[tc] = Infinity;
      done[tc] = 0;
      prevRow[tc] = -1;
    }
  }
}
