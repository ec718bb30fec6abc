import { StatisticsInputError, assertFiniteSample } from './errors.ts';

export interface Bimodality {
  n: number;
  /** Sarle's bimodality coefficient b. */
  b: number;
  /** Bias-corrected sample skewness G₁. */
  skewness: number;
  /** Bias-corrected sample excess kurtosis G₂. */
  excessKurtosis: number;
  /** b > 5/9, the value of a uniform distribution: the sample suggests more than one mode. */
  suggestsBimodal: boolean;
}

/** 5/9 ≈ 0.555, the coefficient of a uniform distribution (reference.md §7). */
export const BIMODALITY_THRESHOLD = 5 / 9;

/**
 * Sarle's bimodality coefficient b = (G₁² + 1)/(G₂ + 3(n − 1)²/((n − 2)(n − 3))) with the
 * bias-corrected skewness G₁ = √(n(n − 1))/(n − 2)·g₁ and excess kurtosis
 * G₂ = (n − 1)/((n − 2)(n − 3))·((n + 1)·g₂ + 6), where g₁ = m₃/m₂^{3/2}, g₂ = m₄/m₂² − 3 use
 * central moments with divisor n (D. N. Joanes & C. A. Gill, The Statistician 47 (1998) 183–189,
 * the SAS/Excel estimators). b > 5/9 suggests bimodality (SAS/STAT documentation of PROC CLUSTER, from memory;
 * reference.md §7) — a screening sign, not a test. Needs n ≥ 4 and non-constant values.
 */
export function bimodalityCoefficient(values: ArrayLike<number>): Bimodality {
  assertFiniteSample(values, 'values', 4);
  const n = values.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += values[i] as number;
  mean /= n;
  let s2 = 0;
  let s3 = 0;
  let s4 = 0;
  for (let i = 0; i < n; i++) {
    const d = (values[i] as number) - mean;
    const d2 = d * d;
    s2 += d2;
    s3 += d2 * d;
    s4 += d2 * d2;
  }
  const m2 = s2 / n;
  if (!(m2 > 0)) throw new StatisticsInputError('values', 'values are all equal; bimodality is undefined');
  const g1 = s3 / n / Math.pow(m2, 1.5);
  const g2 = s4 / n / (m2 * m2) - 3;
  const skewness = (Math.sqrt(n * (n - 1)) / (n - 2)) * g1;
  const excessKurtosis = ((n - 1) / ((n - 2) * (n - 3))) * ((n + 1) * g2 + 6);
  const b = (skewness * skewness + 1) / (excessKurtosis + (3 * (n - 1) * (n - 1)) / ((n - 2) * (n - 3)));
  return { n, b, skewness, excessKurtosis, suggestsBimodal: b > BIMODALITY_THRESHOLD };
}
