import { StatisticsInputError, isAscending } from './errors.ts';

/** Summary statistics of one sample (e.g. the hFE of a lot's sampled parts). */
export interface Description {
  n: number;
  mean: number;
  /** Sample standard deviation, n − 1 divisor; null when n < 2. */
  sd: number | null;
  /** Sample variance, n − 1 divisor; null when n < 2. */
  variance: number | null;
  min: number;
  max: number;
  range: number;
  p05: number;
  p25: number;
  median: number;
  p75: number;
  p95: number;
  /** Interquartile range p75 − p25. */
  iqr: number;
}

/**
 * Percentile of an ascending-sorted sample, p in percent (0…100), by linear interpolation
 * between order statistics: h = (n − 1)·p/100, x[⌊h⌋] + (h − ⌊h⌋)·(x[⌊h⌋+1] − x[⌊h⌋]).
 * This is definition 7 of Hyndman & Fan, "Sample quantiles in statistical packages",
 * The American Statistician 50 (1996) 361–365 — the "R-7" rule, the default of R's quantile(),
 * NumPy's percentile() and Excel's PERCENTILE.INC. The caller guarantees the sort order.
 */
export function percentile(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) throw new StatisticsInputError('sorted', 'sorted must not be empty');
  if (!(p >= 0 && p <= 100)) throw new StatisticsInputError('p', 'p must be a percentage from 0 to 100');
  const h = ((n - 1) * p) / 100;
  const lo = Math.floor(h);
  const lower = sorted[lo] as number;
  if (lo >= n - 1) return lower;
  return lower + (h - lo) * ((sorted[lo + 1] as number) - lower);
}

/**
 * n, mean, sample standard deviation (n − 1 divisor), extremes and R-7 percentiles of a sample.
 * Mean and variance come from one pass of Welford's update (B. P. Welford, Technometrics 4 (1962)
 * 419–420), which also copies the values into a Float64Array; one numeric sort (skipped when the
 * input is already ascending) then serves every percentile. Units are those of the input.
 */
export function describe(values: ArrayLike<number>): Description {
  const n = values.length;
  if (n === 0) throw new StatisticsInputError('values', 'values must not be empty');
  const sorted = new Float64Array(n);
  let mean = 0;
  let m2 = 0;
  for (let i = 0; i < n; i++) {
    const x = values[i] as number;
    if (!Number.isFinite(x)) throw new StatisticsInputError('values', `values[${i}] is not a finite number`);
    sorted[i] = x;
    const delta = x - mean;
    mean += delta / (i + 1);
    m2 += delta * (x - mean);
  }
  if (!isAscending(sorted)) sorted.sort();
  const variance = n > 1 ? m2 / (n - 1) : null;
  const min = sorted[0] as number;
  const max = sorted[n - 1] as number;
  const p25 = percentile(sorted, 25);
  const p75 = percentile(sorted, 75);
  return {
    n,
    mean,
    sd: variance === null ? null : Math.sqrt(variance),
    variance,
    min,
    max,
    range: max - min,
    p05: percentile(sorted, 5),
    p25,
    median: percentile(sorted, 50),
    p75,
    p95: percentile(sorted, 95),
    iqr: p75 - p25,
  };
}
