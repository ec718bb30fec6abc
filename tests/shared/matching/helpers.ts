import { mulberry32 } from '../statistics/seeded-random.ts';

export { mulberry32 };

/** Weight and cardinality of a mate array on an edge list (parallel edges: the heaviest). */
export function matchingValue(mate: readonly number[], edges: readonly (readonly number[])[]): { pairs: number; weight: number } {
  const w = new Map<string, number>();
  for (const [i, j, wt] of edges) {
    const key = `${Math.min(i!, j!)},${Math.max(i!, j!)}`;
    w.set(key, Math.max(w.get(key) ?? -Infinity, wt!));
  }
  let pairs = 0;
  let weight = 0;
  mate.forEach((m, v) => {
    if (m > v) {
      pairs++;
      weight += w.get(`${v},${m}`)!;
    }
  });
  return { pairs, weight };
}

/** Best matching by exhaustive search: with maxCardinality most pairs first, then weight. */
export function bruteForceMatching(n: number, edges: readonly (readonly number[])[], maxCardinality: boolean): { pairs: number; weight: number } {
  const w = new Map<string, number>();
  for (const [i, j, wt] of edges) w.set(`${Math.min(i!, j!)},${Math.max(i!, j!)}`, wt!);
  let best = { pairs: 0, weight: 0 };
  const used = new Array<boolean>(n).fill(false);
  const better = (p: number, s: number): boolean =>
    maxCardinality ? p > best.pairs || (p === best.pairs && s > best.weight) : s > best.weight;
  const visit = (from: number, p: number, s: number): void => {
    let v = from;
    while (v < n && used[v]) v++;
    if (v >= n) {
      if (better(p, s)) best = { pairs: p, weight: s };
      return;
    }
    used[v] = true;
    visit(v + 1, p, s);
    for (let u = v + 1; u < n; u++) {
      const wt = w.get(`${v},${u}`);
      if (used[u] || wt === undefined) continue;
      used[u] = true;
      visit(v + 1, p + 1, s + wt);
      used[u] = false;
    }
    used[v] = false;
  };
  visit(0, 0, 0);
  return best;
}

/** Random graph on n vertices with about `degree` edges per vertex and integer weights < maxWeight. */
export function randomGraph(rng: () => number, n: number, degree: number, maxWeight: number): [number, number, number][] {
  const edges: [number, number, number][] = [];
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) if (rng() < degree / n) edges.push([i, j, Math.floor(rng() * maxWeight)]);
  }
  return edges;
}
