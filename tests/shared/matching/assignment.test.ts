import { describe, expect, it } from 'vitest';
import { type SparseAssignment, solveAssignment } from '../../../shared/domain/matching/assignment.ts';
import { mulberry32 } from './helpers.ts';

/** A random sparse n×n problem: the diagonal (so a perfect assignment exists) plus random arcs. */
function problem(seed: number, n: number, perRow: number): { arcs: [number, number, number][][] } {
  const rng = mulberry32(seed);
  const arcs: [number, number, number][][] = [];
  for (let r = 0; r < n; r++) {
    const row: [number, number, number][] = [[r, r, 1000]];
    for (let k = 0; k < perRow; k++) {
      const c = Math.floor(rng() * n);
      if (row.some(([, cc]) => cc === c)) continue;
      row.push([r, c, Math.floor(rng() * 1000)]);
    }
    arcs.push(row);
  }
  return { arcs };
}

function sparse(n: number, arcs: [number, number, number][][], keep: (r: number, i: number) => boolean): SparseAssignment {
  const rowStart = new Int32Array(n + 1);
  const cols: number[] = [];
  const costs: number[] = [];
  for (let r = 0; r < n; r++) {
    arcs[r]!.forEach(([, c, w], i) => {
      if (!keep(r, i)) return;
      cols.push(c);
      costs.push(w);
    });
    rowStart[r + 1] = cols.length;
  }
  return { n, rowStart, arcCol: Int32Array.from(cols), arcCost: Float64Array.from(costs) };
}

function totalCost(p: SparseAssignment, colOf: Int32Array): number {
  let sum = 0;
  for (let r = 0; r < p.n; r++) {
    let found = -1;
    for (let a = p.rowStart[r]!; a < p.rowStart[r + 1]!; a++) if (p.arcCol[a] === colOf[r]) found = a;
    expect(found, `row ${r} is assigned along one of its arcs`).toBeGreaterThanOrEqual(0);
    sum += p.arcCost[found]!;
  }
  return sum;
}

describe('solveAssignment', () => {
  it('on 30 seeded sparse problems, started from the optimum of a subset of the arcs, reaches the same cost as a cold start, with feasible tight duals', () => {
    for (let seed = 1; seed <= 30; seed++) {
      const n = 40 + seed * 3;
      const { arcs } = problem(seed, n, 6);
      const full = sparse(n, arcs, () => true);
      // The earlier, smaller problem: the diagonal and every other random arc.
      const part = sparse(n, arcs, (_, i) => i === 0 || i % 2 === 1);
      const cold = solveAssignment(full);
      const warm = solveAssignment(full, solveAssignment(part));
      expect(totalCost(full, warm.colOf)).toBe(totalCost(full, cold.colOf));
      expect(new Set(warm.colOf).size, 'a permutation').toBe(n);
      // LP duality: u + v ≤ cost on every arc, equal on the assigned ones.
      for (let r = 0; r < n; r++) {
        for (let a = full.rowStart[r]!; a < full.rowStart[r + 1]!; a++) {
          const c = full.arcCol[a]!;
          const slack = full.arcCost[a]! - warm.u[r]! - warm.v[c]!;
          expect(slack).toBeGreaterThanOrEqual(0);
          if (warm.colOf[r] === c) expect(slack).toBe(0);
        }
      }
    }
  });
});
