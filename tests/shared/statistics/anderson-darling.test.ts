import { describe, it, expect } from 'vitest';
import {
  andersonDarling,
  andersonDarlingBand,
  andersonDarlingFactor,
  StatisticsInputError,
} from '../../../shared/domain/statistics/index.ts';
import { exponentialSample, normalSample, sarleExample } from './seeded-random.ts';

describe('andersonDarling', () => {
  // No published data set with its A² was at hand; reference A² values were computed with
  // SciPy 1.17 scipy.stats.anderson(x, dist='norm').statistic, an independent implementation of the
  // same unmodified statistic (mean and n − 1 standard deviation estimated from the sample).
  const cases = [
    { name: 'ten readings', values: [12.1, 9.8, 11.4, 10.2, 10.9, 8.7, 11.8, 10.0, 9.5, 10.6], a2: 0.1346224169007737 },
    { name: 'the reference.md §7 example (n 100, discrete)', values: sarleExample(), a2: 0.9813999927123973 },
  ];
  it.each(cases)('on $name gives A² = $a2', ({ values, a2 }) => {
    expect(andersonDarling(values).a2).toBeCloseTo(a2, 10);
  });

  it("applies Stephens' factor 1 + 0.75/n + 2.25/n² to get A*²", () => {
    // reference.md §7 [published, Stephens]: n = 10 → 1 + 0.075 + 0.0225 = 1.0975.
    expect(andersonDarlingFactor(10)).toBeCloseTo(1.0975, 12);
    const r = andersonDarling(cases[0]!.values);
    expect(r.a2Star).toBeCloseTo(r.a2 * 1.0975, 12);
  });

  it('on a seeded normal sample of 200 does not reject normality', () => {
    const r = andersonDarling(normalSample(2024, 200, 180, 30));
    expect(r.normalAt5).toBe(true);
    expect(r.a2Star).toBeLessThan(0.752);
  });

  it('on a seeded exponential sample of 200 rejects normality at 1 %', () => {
    const r = andersonDarling(exponentialSample(2024, 200, 50));
    expect(r.normalAt5).toBe(false);
    expect(r.pValueBand).toBe('<0.01');
  });

  it('on the §7 example (n 100, A*² ≈ 0.989) rejects at 5 % but not at 1 %', () => {
    const r = andersonDarling(sarleExample());
    expect(r.pValueBand).toBe('0.01–0.05');
    expect(r.normalAt5).toBe(false);
  });

  it('does not move when the data are shifted and scaled', () => {
    const base = normalSample(7, 50, 0, 1);
    const a = andersonDarling(base).a2;
    expect(andersonDarling(base.map((x) => 650 + 8 * x)).a2).toBeCloseTo(a, 9);
  });

  it('with one value far in the tail, stays finite and rejects', () => {
    const values = [...normalSample(5, 3000, 0, 1), 1e6];
    const r = andersonDarling(values);
    expect(Number.isFinite(r.a2)).toBe(true);
    expect(r.pValueBand).toBe('<0.01');
  });

  it('with fewer than three values or all values equal, throws naming values', () => {
    expect(() => andersonDarling([1, 2])).toThrowError(expect.objectContaining({ field: 'values' }));
    expect(() => andersonDarling([5, 5, 5, 5])).toThrow(StatisticsInputError);
  });
});

describe('andersonDarlingBand', () => {
  // Critical values of A*² 0.631 / 0.752 / 1.035 at 10 / 5 / 1 % (reference.md §7, Stephens).
  const cases = [
    { a2Star: 0.3, band: '>0.10' },
    { a2Star: 0.631, band: '>0.10' },
    { a2Star: 0.6311, band: '0.05–0.10' },
    { a2Star: 0.752, band: '0.05–0.10' },
    { a2Star: 0.7521, band: '0.01–0.05' },
    { a2Star: 1.035, band: '0.01–0.05' },
    { a2Star: 1.0351, band: '<0.01' },
  ];
  it.each(cases)('A*² $a2Star lies in the band $band', ({ a2Star, band }) => {
    expect(andersonDarlingBand(a2Star)).toBe(band);
  });
});
