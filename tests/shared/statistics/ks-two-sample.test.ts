import { describe, it, expect } from 'vitest';
import { kolmogorovQ, ksTwoSample, StatisticsInputError } from '../../../shared/domain/statistics/index.ts';
import { normalSample } from './seeded-random.ts';

/** Brute force: D = max over every observed x of |F_a(x) − F_b(x)|, counting with ≤. */
function bruteForceD(a: number[], b: number[]): number {
  const cdf = (s: number[], x: number) => s.filter((v) => v <= x).length / s.length;
  return Math.max(...[...a, ...b].map((x) => Math.abs(cdf(a, x) - cdf(b, x))));
}

describe('ksTwoSample', () => {
  // Hand-computed D (the step functions written out at every distinct value).
  const cases = [
    {
      situation: 'a = 1…5 and b = 3…8',
      // x:   1    2    3     4     5    6
      // Fa: .2   .4   .6    .8    1    1
      // Fb:  0    0   1/6   2/6  3/6  4/6   → largest gap 0.5 at x = 5
      a: [1, 2, 3, 4, 5],
      b: [3, 4, 5, 6, 7, 8],
      d: 0.5,
    },
    {
      situation: 'tied values across the samples',
      // x:   1    2    3    4
      // Fa: .25  .75   1    1
      // Fb:  0   .25  .75   1    → 0.5 at x = 2 (stepping only a past the tie would give 0.75)
      a: [1, 2, 2, 3],
      b: [2, 3, 3, 4],
      d: 0.5,
    },
    { situation: 'disjoint samples', a: [1, 2, 3], b: [10, 11], d: 1 },
    { situation: 'identical samples', a: [4, 5, 6], b: [6, 5, 4], d: 0 },
  ];
  it.each(cases)('with $situation gives D = $d', ({ a, b, d }) => {
    expect(ksTwoSample(a, b).d).toBeCloseTo(d, 12);
  });

  it('gives the critical values c(α)·√((n + m)/(n·m)) with c = 1.224, 1.358, 1.628', () => {
    // reference.md §7 [published]; n = 5, m = 6 → √(11/30) = 0.605530.
    const r = ksTwoSample([1, 2, 3, 4, 5], [3, 4, 5, 6, 7, 8]);
    const scale = Math.sqrt(11 / 30);
    expect(r.critical['0.10']).toBeCloseTo(1.224 * scale, 12);
    expect(r.critical['0.05']).toBeCloseTo(1.358 * scale, 12);
    expect(r.critical['0.01']).toBeCloseTo(1.628 * scale, 12);
    expect(r).toMatchObject({ n: 5, m: 6, rejectAt05: false });
    // Computed with SciPy 1.17 scipy.special.kolmogorov(0.5/√(11/30)).
    expect(r.pValue).toBeCloseTo(0.5029140336411289, 10);
  });

  it('on two seeded samples agrees with a brute-force D', () => {
    const a = normalSample(1, 60, 180, 20).map((x) => Math.round(x));
    const b = normalSample(2, 45, 190, 25).map((x) => Math.round(x));
    expect(ksTwoSample(a, b).d).toBeCloseTo(bruteForceD(a, b), 12);
  });

  it('when one lot is shifted by one standard deviation, rejects with a p-value below 0.05', () => {
    const r = ksTwoSample(normalSample(3, 300, 180, 20), normalSample(4, 200, 200, 20));
    expect(r.rejectAt05).toBe(true);
    expect(r.pValue).toBeLessThan(0.05);
  });

  it('when two lots come from the same distribution, does not reject', () => {
    const r = ksTwoSample(normalSample(5, 300, 180, 20), normalSample(6, 200, 180, 20));
    expect(r.rejectAt05).toBe(false);
    expect(r.pValue).toBeGreaterThan(0.05);
  });

  it('when a sample is empty, throws naming it', () => {
    expect(() => ksTwoSample([], [1])).toThrowError(expect.objectContaining({ field: 'a' }));
    expect(() => ksTwoSample([1], [])).toThrowError(expect.objectContaining({ field: 'b' }));
  });
});

describe('kolmogorovQ', () => {
  // The asymptotic critical constants of reference.md §7 are the 10 / 5 / 1 % points of this distribution.
  const published = [
    { lambda: 1.224, q: 0.1 },
    { lambda: 1.358, q: 0.05 },
    { lambda: 1.628, q: 0.01 },
  ];
  it.each(published)('Q($lambda) ≈ $q', ({ lambda, q }) => {
    expect(Math.abs(kolmogorovQ(lambda) - q)).toBeLessThan(2e-4);
  });

  // Computed with SciPy 1.17 scipy.special.kolmogorov.
  const computed = [
    { lambda: 0.3, q: 0.9999906941986655 },
    { lambda: 0.5, q: 0.9639452436648751 },
    { lambda: 0.8, q: 0.544142411574198 },
    { lambda: 1.5, q: 0.022217962616525127 },
    { lambda: 2.5, q: 7.453306344157342e-6 },
  ];
  it.each(computed)('Q($lambda) = $q', ({ lambda, q }) => {
    expect(Math.abs(kolmogorovQ(lambda) - q) / q).toBeLessThan(1e-9);
  });

  it('is continuous where the two series meet at λ = 1, and 1 at λ = 0', () => {
    expect(kolmogorovQ(1 - 1e-9)).toBeCloseTo(kolmogorovQ(1 + 1e-9), 7);
    expect(kolmogorovQ(0)).toBe(1);
  });

  it('with a negative λ, throws', () => {
    expect(() => kolmogorovQ(-0.1)).toThrow(StatisticsInputError);
  });
});
