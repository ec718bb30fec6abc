import { describe, it, expect } from 'vitest';
import reference from 'edmonds-blossom-fixed';
import { maxWeightMatching, solveMaxWeightMatching } from '../../../shared/domain/matching/index.ts';
import { bruteForceMatching, matchingValue, mulberry32, randomGraph } from './helpers.ts';

describe('maxWeightMatching (Edmonds blossom, Galil 1986 / van Rantwijk)', () => {
  // Small graphs that exercise each step (S-blossoms, T-blossoms, nested blossoms, relabelling,
  // expansion). Expected mates as in the self-test of van Rantwijk's mwmatching.py (from memory);
  // every case is also checked against exhaustive search below, so a wrong memory cannot pass.
  const cases: { situation: string; edges: [number, number, number][]; maxCardinality: boolean; mate: number[] }[] = [
    { situation: 'a single edge', edges: [[0, 1, 1]], maxCardinality: false, mate: [1, 0] },
    { situation: 'a path of two edges takes the heavier', edges: [[1, 2, 10], [2, 3, 11]], maxCardinality: false, mate: [-1, -1, 3, 2] },
    { situation: 'a path of three, weight first', edges: [[1, 2, 5], [2, 3, 11], [3, 4, 5]], maxCardinality: false, mate: [-1, -1, 3, 2, -1] },
    { situation: 'a path of three, cardinality first', edges: [[1, 2, 5], [2, 3, 11], [3, 4, 5]], maxCardinality: true, mate: [-1, 2, 1, 4, 3] },
    { situation: 'negative weights, weight first', edges: [[1, 2, 2], [1, 3, -2], [2, 3, 1], [2, 4, -1], [3, 4, -6]], maxCardinality: false, mate: [-1, 2, 1, -1, -1] },
    { situation: 'negative weights, cardinality first', edges: [[1, 2, 2], [1, 3, -2], [2, 3, 1], [2, 4, -1], [3, 4, -6]], maxCardinality: true, mate: [-1, 3, 4, 1, 2] },
    { situation: 'an S-blossom', edges: [[1, 2, 8], [1, 3, 9], [2, 3, 10], [3, 4, 7]], maxCardinality: false, mate: [-1, 2, 1, 4, 3] },
    { situation: 'an S-blossom, then augmenting through it', edges: [[1, 2, 8], [1, 3, 9], [2, 3, 10], [3, 4, 7], [1, 6, 5], [4, 5, 6]], maxCardinality: false, mate: [-1, 6, 3, 2, 5, 4, 1] },
    { situation: 'a T-blossom', edges: [[1, 2, 9], [1, 3, 8], [2, 3, 10], [1, 4, 5], [4, 5, 4], [1, 6, 3]], maxCardinality: false, mate: [-1, 6, 3, 2, 5, 4, 1] },
    { situation: 'a T-blossom, other weights', edges: [[1, 2, 9], [1, 3, 8], [2, 3, 10], [1, 4, 5], [4, 5, 3], [3, 6, 4]], maxCardinality: false, mate: [-1, 2, 1, 6, 5, 4, 3] },
    { situation: 'nested S-blossoms', edges: [[1, 2, 9], [1, 3, 9], [2, 3, 10], [2, 4, 8], [3, 5, 8], [4, 5, 10], [5, 6, 6]], maxCardinality: false, mate: [-1, 3, 4, 1, 2, 6, 5] },
    { situation: 'nested S-blossoms, relabelled', edges: [[1, 2, 10], [1, 7, 10], [2, 3, 12], [3, 4, 20], [3, 5, 20], [4, 5, 25], [5, 6, 10], [6, 7, 10], [7, 8, 8]], maxCardinality: false, mate: [-1, 2, 1, 4, 3, 6, 5, 8, 7] },
    { situation: 'nested S-blossoms, expanded', edges: [[1, 2, 8], [1, 3, 8], [2, 3, 10], [2, 4, 12], [3, 5, 12], [4, 5, 14], [4, 6, 12], [5, 7, 12], [6, 7, 14], [7, 8, 12]], maxCardinality: false, mate: [-1, 2, 1, 5, 6, 3, 4, 8, 7] },
    { situation: 'an S-blossom relabelled as T and expanded', edges: [[1, 2, 23], [1, 5, 22], [1, 6, 15], [2, 3, 25], [3, 4, 22], [4, 5, 25], [4, 8, 14], [5, 7, 13]], maxCardinality: false, mate: [-1, 6, 3, 2, 8, 7, 1, 5, 4] },
    { situation: 'a nested S-blossom relabelled as T and expanded', edges: [[1, 2, 19], [1, 3, 20], [1, 8, 8], [2, 3, 25], [2, 4, 18], [3, 5, 18], [4, 5, 13], [4, 7, 7], [5, 6, 7]], maxCardinality: false, mate: [-1, 8, 3, 2, 7, 6, 5, 4, 1] },
    { situation: 'a blossom with a least-slack edge to be rechecked', edges: [[1, 2, 45], [1, 5, 45], [2, 3, 50], [3, 4, 45], [4, 5, 50], [1, 6, 30], [3, 9, 35], [4, 8, 35], [5, 7, 26], [9, 10, 5]], maxCardinality: false, mate: [-1, 6, 3, 2, 8, 7, 1, 5, 4, 10, 9] },
    { situation: 'a nested T-blossom expanded through its base', edges: [[1, 2, 45], [1, 7, 45], [2, 3, 50], [3, 4, 45], [4, 5, 95], [4, 6, 94], [5, 6, 94], [6, 7, 50], [1, 8, 30], [3, 11, 35], [5, 9, 36], [7, 10, 26], [11, 12, 5]], maxCardinality: false, mate: [-1, 8, 3, 2, 6, 9, 4, 10, 1, 5, 7, 12, 11] },
    { situation: 'a T-blossom expanded into an augmenting path', edges: [[1, 2, 40], [1, 3, 40], [2, 3, 60], [2, 4, 55], [3, 5, 55], [4, 5, 50], [1, 8, 15], [5, 7, 30], [7, 6, 10], [8, 10, 10], [4, 9, 30]], maxCardinality: false, mate: [-1, 2, 1, 5, 9, 3, 7, 6, 10, 4, 8] },
  ];
  it.each(cases)('on $situation, gives the expected mates and the exhaustive-search optimum', ({ edges, maxCardinality, mate }) => {
    const got = maxWeightMatching(edges, { maxCardinality });
    expect(got).toEqual(mate);
    const n = Math.max(...edges.flatMap(([i, j]) => [i, j])) + 1;
    expect(matchingValue(got, edges)).toEqual(bruteForceMatching(n, edges, maxCardinality));
  });

  it('on 300 seeded random graphs of 2–12 vertices, in both modes, equals exhaustive search (weight; and cardinality when asked)', () => {
    const rng = mulberry32(20240601);
    for (let t = 0; t < 300; t++) {
      const n = 2 + Math.floor(rng() * 11);
      const edges = randomGraph(rng, n, 1 + rng() * n, rng() < 0.5 ? 4 : 50);
      if (edges.length === 0) continue;
      for (const maxCardinality of [false, true]) {
        const got = matchingValue(maxWeightMatching(edges, { maxCardinality }), edges);
        const best = bruteForceMatching(n, edges, maxCardinality);
        expect(got.weight).toBe(best.weight);
        if (maxCardinality) expect(got.pairs).toBe(best.pairs);
      }
    }
  });

  it('on 40 seeded random graphs of 200–400 vertices, equals the reference library edmonds-blossom-fixed', () => {
    const rng = mulberry32(77);
    for (let t = 0; t < 40; t++) {
      const n = 200 + Math.floor(rng() * 201);
      const edges = randomGraph(rng, n, 2 + rng() * 10, rng() < 0.5 ? 6 : 100000);
      const maxCardinality = t % 2 === 0;
      const got = matchingValue(maxWeightMatching(edges, { maxCardinality }), edges);
      const ref = matchingValue(reference(edges.map((e) => [...e]), maxCardinality), edges);
      expect(got.weight).toBe(ref.weight);
      if (maxCardinality) expect(got.pairs).toBe(ref.pairs);
    }
  });

  it('on an empty edge list, matches nothing', () => {
    expect(maxWeightMatching([])).toEqual([]);
  });
});

describe('solveMaxWeightMatching with lazily fetched edges', () => {
  /**
   * Starts from each vertex's 3 heaviest edges (ties by index); level = heaviest weight still
   * missing at the vertex, so a missing edge u–v (weight ≤ both levels) keeps slack
   * y_u + y_v − 2w ≥ 0 while y_u ≥ level_u and y_v ≥ level_v; fetch hands out the next 2.
   */
  function lazySolve(n: number, edges: [number, number, number][]): number[] {
    const byVertex: [number, number][][] = Array.from({ length: n }, () => []);
    for (const [i, j, w] of edges) {
      byVertex[i]!.push([j, w]);
      byVertex[j]!.push([i, w]);
    }
    for (const list of byVertex) list.sort((x, y) => y[1] - x[1] || x[0] - y[0]);
    const held = new Set<string>();
    const key = (a: number, b: number) => `${Math.min(a, b)},${Math.max(a, b)}`;
    const initial: [number, number, number][] = [];
    byVertex.forEach((list, v) => {
      for (const [u, w] of list.slice(0, 3)) {
        if (held.has(key(u, v))) continue;
        held.add(key(u, v));
        initial.push([v, u, w]);
      }
    });
    const missingOf = (v: number) => byVertex[v]!.filter(([u]) => !held.has(key(u, v)));
    const level = Float64Array.from({ length: n }, (_, v) => missingOf(v)[0]?.[1] ?? -Infinity);
    const { mate } = solveMaxWeightMatching(
      {
        nVertex: n,
        edgeI: Int32Array.from(initial, (e) => e[0]),
        edgeJ: Int32Array.from(initial, (e) => e[1]),
        weight: Float64Array.from(initial, (e) => e[2]),
      },
      {
        lazyEdges: {
          level,
          fetch(v) {
            const batch = missingOf(v).slice(0, 2);
            for (const [u] of batch) held.add(key(u, v));
            const rest = missingOf(v);
            return { to: batch.map((e) => e[0]), weight: batch.map((e) => e[1]), level: rest[0]?.[1] ?? -Infinity };
          },
        },
      },
    );
    return Array.from(mate);
  }

  it('on 200 seeded random graphs of 4–60 vertices, reaches the weight of the full graph', () => {
    const rng = mulberry32(99);
    for (let t = 0; t < 200; t++) {
      const n = 4 + Math.floor(rng() * 57);
      const edges = randomGraph(rng, n, 2 + rng() * 12, rng() < 0.5 ? 10 : 1000);
      if (edges.length === 0) continue;
      const lazy = matchingValue(lazySolve(n, edges), edges);
      const full = matchingValue(maxWeightMatching(edges), edges);
      expect(lazy.weight).toBe(full.weight);
    }
  });
});
