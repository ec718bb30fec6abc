import { StatisticsInputError, assertFiniteSample, sortedCopy } from './errors.ts';
import { normalCdf } from './normal.ts';

export type AndersonDarlingBand = '>0.10' | '0.05–0.10' | '0.01–0.05' | '<0.01';

export interface AndersonDarling {
  n: number;
  /** A², the Anderson–Darling statistic against a normal with the sample's mean and sd. */
  a2: number;
  /** Stephens' modified statistic A*² = A²·(1 + 0.75/n + 2.25/n²). */
  a2Star: number;
  /** Where the p-value lies, from A*² against the critical values 0.631 / 0.752 / 1.035. */
  pValueBand: AndersonDarlingBand;
  /** True when normality is not rejected at the 5 % level (A*² ≤ 0.752). */
  normalAt5: boolean;
}

/** Critical values of A*² for a normal with estimated mean and variance (Stephens; reference.md §7). */
export const AD_CRITICAL = { '0.10': 0.631, '0.05': 0.752, '0.01': 1.035 } as const;

/** Stephens' small-sample factor 1 + 0.75/n + 2.25/n² for the normal case with estimated parameters. */
export function andersonDarlingFactor(n: number): number {
  return 1 + 0.75 / n + 2.25 / (n * n);
}

/**
 * The p-value band of a modified statistic A*² against Stephens' critical values 0.631 / 0.752 /
 * 1.035 (10 / 5 / 1 %, reference.md §7); a value equal to a critical value falls in the band above it.
 */
export function andersonDarlingBand(a2Star: number): AndersonDarlingBand {
  if (a2Star > AD_CRITICAL['0.01']) return '<0.01';
  if (a2Star > AD_CRITICAL['0.05']) return '0.01–0.05';
  if (a2Star > AD_CRITICAL['0.10']) return '0.05–0.10';
  return '>0.10';
}

/** ln Φ(z); below z = −37 Φ approaches underflow, so the leading term of the Mills-ratio expansion is used. */
function logNormalCdf(z: number): number {
  if (z > -37) return Math.log(normalCdf(z));
  return -0.5 * z * z - Math.log(-z * Math.sqrt(2 * Math.PI));
}

/**
 * Anderson–Darling test of normality with mean and standard deviation estimated from the sample
 * (T. W. Anderson & D. A. Darling, Ann. Math. Stat. 23 (1952) 193–212):
 * A² = −n − (1/n)·Σ (2i − 1)·[ln Φ(zᵢ) + ln(1 − Φ(z₍ₙ₊₁₋ᵢ₎))], z = (x − x̄)/s with the n − 1 divisor,
 * then Stephens' modification A*² = A²(1 + 0.75/n + 2.25/n²) compared with 0.631 / 0.752 / 1.035 at
 * 10 / 5 / 1 % (M. A. Stephens, JASA 69 (1974) 730–737; D'Agostino & Stephens, Goodness-of-Fit
 * Techniques, 1986; reference.md §7). Φ uses Cody's erfc (normal.ts). Needs n ≥ 3 and s > 0;
 * the tabled critical values are least reliable for very small n. A statistic equal to a critical
 * value counts as not exceeding it.
 */
export function andersonDarling(values: ArrayLike<number>): AndersonDarling {
  assertFiniteSample(values, 'values', 3);
  const n = values.length;
  const sorted = sortedCopy(values);
  let mean = 0;
  for (let i = 0; i < n; i++) mean += sorted[i] as number;
  mean /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const d = (sorted[i] as number) - mean;
    ss += d * d;
  }
  const sd = Math.sqrt(ss / (n - 1));
  if (!(sd > 0)) throw new StatisticsInputError('values', 'values are all equal; normality cannot be tested');
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const zLow = ((sorted[i] as number) - mean) / sd;
    const zHigh = ((sorted[n - 1 - i] as number) - mean) / sd;
    // ln(1 − Φ(z)) = ln Φ(−z): no cancellation in the upper tail.
    sum += (2 * i + 1) * (logNormalCdf(zLow) + logNormalCdf(-zHigh));
  }
  const a2 = -n - sum / n;
  const a2Star = a2 * andersonDarlingFactor(n);
  return { n, a2, a2Star, pValueBand: andersonDarlingBand(a2Star), normalAt5: a2Star <= AD_CRITICAL['0.05'] };
}
