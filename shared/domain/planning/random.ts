/**
 * mulberry32, a small seeded 32-bit generator (T. Ettinger, public domain): uniform on [0, 1).
 * Planning and the demo data take their randomness from here, never from Math.random, so a run
 * with the same seed gives the same answer.
 */
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

/** One standard normal deviate from a uniform generator (Box–Muller transform, cosine branch). */
export function standardNormal(rng: () => number): number {
  const r = Math.sqrt(-2 * Math.log(1 - rng()));
  return r * Math.cos(2 * Math.PI * rng());
}
