import { describe, it, expect } from 'vitest';
import {
  interquartileRange,
  max,
  mean,
  min,
  quantileSorted,
  sampleStandardDeviation,
  sampleVariance,
} from 'simple-statistics';
import { describe as describeSample, percentile, StatisticsInputError } from '../../../shared/domain/statistics/index.ts';
import { normalSample } from './seeded-random.ts';

// Reference implementation: simple-statistics 7.12 (its quantileSorted is Hyndman & Fan definition 7,
// the same rule as percentile()). Used only here, as an independent check.
function reference(values: number[]) {
  const sorted = [...values].sort((a, b) => a - b);
  return {
    n: values.length,
    mean: mean(values),
    sd: sampleStandardDeviation(values),
    variance: sampleVariance(values),
    min: min(values),
    max: max(values),
    p05: quantileSorted(sorted, 0.05),
    p25: quantileSorted(sorted, 0.25),
    median: quantileSorted(sorted, 0.5),
    p75: quantileSorted(sorted, 0.75),
    p95: quantileSorted(sorted, 0.95),
    iqr: interquartileRange(values) as number,
  };
}

describe('percentile (Hyndman & Fan definition 7, "R-7")', () => {
  // Check values derived by hand from h = (n − 1)·p/100 and linear interpolation (Hyndman & Fan 1996, def. 7).
  const cases: { sorted: number[]; p: number; expected: number; note: string }[] = [
    { sorted: [1, 2, 3, 4], p: 25, expected: 1.75, note: 'h = 0.75 → 1 + 0.75·(2 − 1)' },
    { sorted: [1, 2, 3, 4], p: 50, expected: 2.5, note: 'h = 1.5 → 2 + 0.5·(3 − 2)' },
    { sorted: [1, 2, 3, 4], p: 0, expected: 1, note: 'p 0 is the minimum' },
    { sorted: [1, 2, 3, 4], p: 100, expected: 4, note: 'p 100 is the maximum' },
    { sorted: [10, 20, 30, 40, 50], p: 90, expected: 46, note: 'h = 3.6 → 40 + 0.6·10' },
    { sorted: [7], p: 37, expected: 7, note: 'a single value is every percentile' },
  ];
  it.each(cases)('on $sorted at p $p gives $expected ($note)', ({ sorted, p, expected }) => {
    expect(percentile(sorted, p)).toBeCloseTo(expected, 12);
  });

  it('when p is outside 0…100, throws naming p', () => {
    expect(() => percentile([1, 2], 101)).toThrow(StatisticsInputError);
    expect(() => percentile([1, 2], -1)).toThrowError(expect.objectContaining({ field: 'p' }));
  });

  it('when the sample is empty, throws', () => {
    expect(() => percentile([], 50)).toThrow(StatisticsInputError);
  });
});

describe('describe', () => {
  it('on 1, 2, 3, 4 gives mean 2.5, sd √(5/3) with the n − 1 divisor, median 2.5', () => {
    // Derived by hand: Σ(x − 2.5)² = 5, variance 5/3.
    const d = describeSample([4, 1, 3, 2]);
    expect(d).toMatchObject({ n: 4, mean: 2.5, min: 1, max: 4, range: 3, median: 2.5 });
    expect(d.variance).toBeCloseTo(5 / 3, 12);
    expect(d.sd).toBeCloseTo(Math.sqrt(5 / 3), 12);
    expect(d.p25).toBeCloseTo(1.75, 12);
    expect(d.p75).toBeCloseTo(3.25, 12);
    expect(d.iqr).toBeCloseTo(1.5, 12);
  });

  const samples: { name: string; values: number[] }[] = [
    { name: 'a seeded normal sample of 1 000 hFE-like values', values: normalSample(11, 1000, 180, 25) },
    { name: 'a seeded sample of 100 000 values', values: normalSample(12, 100_000, 650, 8) },
    { name: 'a small sample with ties', values: [120, 120, 135, 150, 150, 150, 171, 199, 205] },
    { name: 'values with a large common offset', values: normalSample(13, 500, 1e9, 0.5) },
  ];
  it.each(samples)('on $name agrees with simple-statistics', ({ values }) => {
    const d = describeSample(values);
    const ref = reference(values);
    expect(d.n).toBe(ref.n);
    expect(d.min).toBe(ref.min);
    expect(d.max).toBe(ref.max);
    const scale = Math.max(1, Math.abs(ref.mean));
    expect(Math.abs(d.mean - ref.mean) / scale).toBeLessThan(1e-12);
    expect(d.sd as number).toBeCloseTo(ref.sd, 6);
    for (const key of ['p05', 'p25', 'median', 'p75', 'p95', 'iqr'] as const) {
      expect(Math.abs(d[key] - ref[key]) / scale, key).toBeLessThan(1e-12);
    }
  });

  it('with one value, gives that value everywhere and a null sd', () => {
    expect(describeSample([163])).toMatchObject({ n: 1, mean: 163, sd: null, variance: null, median: 163, iqr: 0 });
  });

  it('accepts a Float64Array and leaves the input order untouched', () => {
    const input = Float64Array.from([3, 1, 2]);
    expect(describeSample(input).median).toBe(2);
    expect(Array.from(input)).toEqual([3, 1, 2]);
  });

  it('when the sample is empty, throws naming values', () => {
    expect(() => describeSample([])).toThrowError(expect.objectContaining({ field: 'values' }));
  });

  it('when a value is not finite, throws naming values', () => {
    expect(() => describeSample([1, Number.NaN, 3])).toThrow(StatisticsInputError);
    expect(() => describeSample([1, Number.POSITIVE_INFINITY])).toThrow(StatisticsInputError);
  });
});
