/** Seeded pseudo-random generators for tests: reproducible samples, never Math.random. */

/** mulberry32, a 32-bit generator (T. Ettinger, public domain); uniform on [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** n normal deviates with the given mean and sd, by the Box–Muller transform. */
export function normalSample(seed: number, n: number, mean: number, sd: number): number[] {
  const u = mulberry32(seed);
  const out: number[] = [];
  while (out.length < n) {
    const r = Math.sqrt(-2 * Math.log(1 - u()));
    const theta = 2 * Math.PI * u();
    out.push(mean + sd * r * Math.cos(theta));
    if (out.length < n) out.push(mean + sd * r * Math.sin(theta));
  }
  return out;
}

/** n exponential deviates with the given mean, by inversion. */
export function exponentialSample(seed: number, n: number, mean: number): number[] {
  const u = mulberry32(seed);
  return Array.from({ length: n }, () => -mean * Math.log(1 - u()));
}

/** The §7 bimodality example of reference.md: counts 3,5,5,10,17,20,17,10,5,5,3 on the values 1…11. */
export function sarleExample(): number[] {
  const counts = [3, 5, 5, 10, 17, 20, 17, 10, 5, 5, 3];
  return counts.flatMap((count, i) => Array.from({ length: count }, () => i + 1));
}
