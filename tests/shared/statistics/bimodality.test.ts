import { describe, it, expect } from 'vitest';
import { sampleKurtosis, sampleSkewness } from 'simple-statistics';
import { bimodalityCoefficient, StatisticsInputError } from '../../../shared/domain/statistics/index.ts';
import { exponentialSample, normalSample, sarleExample } from './seeded-random.ts';

describe('bimodalityCoefficient', () => {
  it('on the reference.md §7 example (counts 3,5,5,10,17,20,17,10,5,5,3 on 1…11) gives b ≈ 0.336', () => {
    // reference.md §7 [published example]; symmetric data, so G₁ = 0; G₂ = −0.11742 (SciPy 1.17
    // scipy.stats.kurtosis(bias=False)).
    const r = bimodalityCoefficient(sarleExample());
    expect(r.b).toBeCloseTo(0.336, 3);
    expect(r.skewness).toBeCloseTo(0, 12);
    expect(r.excessKurtosis).toBeCloseTo(-0.11742328917691713, 10);
    expect(r.suggestsBimodal).toBe(false);
  });

  it('on 20 parts at hFE 100 and 20 at hFE 200 gives b ≈ 0.879 and flags bimodality', () => {
    // Derived: g₂ = −2 for two equal point masses; G₂ = 39/(38·37)·(41·(−2) + 6) = −2.10811;
    // 3·39²/(38·37) = 3.24538; b = 1/(3.24538 − 2.10811) = 0.87933 > 5/9.
    const values = [...Array.from({ length: 20 }, () => 100), ...Array.from({ length: 20 }, () => 200)];
    const r = bimodalityCoefficient(values);
    expect(r.b).toBeCloseTo(0.87933, 4);
    expect(r.suggestsBimodal).toBe(true);
  });

  it('on a seeded normal sample of 1 000 stays well below 5/9', () => {
    // A normal population has b = 1/3 (G₁ = G₂ = 0, large n) [derived].
    const r = bimodalityCoefficient(normalSample(99, 1000, 180, 25));
    expect(r.b).toBeGreaterThan(0.28);
    expect(r.b).toBeLessThan(0.4);
    expect(r.suggestsBimodal).toBe(false);
  });

  const samples = [
    { name: 'a seeded normal sample', values: normalSample(31, 200, 650, 6) },
    { name: 'a seeded exponential sample', values: exponentialSample(32, 150, 40) },
    { name: 'five values', values: [2, 4, 6, 3, 1] },
  ];
  it.each(samples)('on $name, G₁ and G₂ agree with simple-statistics sampleSkewness and sampleKurtosis', ({ values }) => {
    const r = bimodalityCoefficient(values);
    expect(r.skewness).toBeCloseTo(sampleSkewness(values), 10);
    expect(r.excessKurtosis).toBeCloseTo(sampleKurtosis(values), 10);
  });

  it('with fewer than four values or all values equal, throws naming values', () => {
    expect(() => bimodalityCoefficient([1, 2, 3])).toThrowError(expect.objectContaining({ field: 'values' }));
    expect(() => bimodalityCoefficient([7, 7, 7, 7, 7])).toThrow(StatisticsInputError);
  });
});
