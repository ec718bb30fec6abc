import { assertFiniteSample, sortedCopy, StatisticsInputError } from './errors.ts';

export interface KsTwoSample {
  /** D = sup |F_a(x) − F_b(x)| over the two empirical distribution functions. */
  d: number;
  /** Size of the first sample. */
  n: number;
  /** Size of the second sample. */
  m: number;
  /** Asymptotic critical values of D, c(α)·√((n + m)/(n·m)). */
  critical: { '0.10': number; '0.05': number; '0.01': number };
  /** True when D exceeds the 5 % critical value: the two samples differ in distribution. */
  rejectAt05: boolean;
  /** Q_KS(√(n·m/(n + m))·D), the asymptotic Kolmogorov distribution's upper tail. */
  pValue: number;
}

/** c(α) of the asymptotic two-sample critical value (reference.md §7). */
export const KS_C_ALPHA = { '0.10': 1.224, '0.05': 1.358, '0.01': 1.628 } as const;

/**
 * Upper tail of the Kolmogorov distribution, Q(λ) = P(K > λ) = 2·Σₖ₌₁ (−1)^(k−1)·e^(−2k²λ²)
 * (A. N. Kolmogorov, 1933; N. V. Smirnov, 1939). Below λ = 1 the equivalent theta-function form
 * 1 − (√(2π)/λ)·Σₖ₌₁ e^(−(2k−1)²π²/(8λ²)) converges faster and is used instead.
 */
export function kolmogorovQ(lambda: number): number {
  if (!(lambda >= 0)) throw new StatisticsInputError('lambda', 'lambda must be a non-negative number');
  if (lambda === 0) return 1;
  if (lambda < 1) {
    const f = (-Math.PI * Math.PI) / (8 * lambda * lambda);
    let sum = 0;
    for (let k = 1; k <= 20; k++) {
      const term = Math.exp((2 * k - 1) * (2 * k - 1) * f);
      sum += term;
      if (term < 1e-17 * sum) break;
    }
    return Math.min(1, Math.max(0, 1 - (Math.sqrt(2 * Math.PI) / lambda) * sum));
  }
  let sum = 0;
  let sign = 1;
  for (let k = 1; k <= 100; k++) {
    const term = Math.exp(-2 * k * k * lambda * lambda);
    sum += sign * term;
    if (term < 1e-17 * Math.abs(sum)) break;
    sign = -sign;
  }
  return Math.min(1, Math.max(0, 2 * sum));
}

/**
 * Two-sample Kolmogorov–Smirnov test of whether samples a and b come from the same distribution,
 * e.g. a lot's hFE against that supplier's history. D = sup |F_a − F_b| (ties handled by stepping
 * both empirical functions past each distinct value); critical values c(α)·√((n + m)/(n·m)) with
 * c = 1.224, 1.358, 1.628 for α = 0.10, 0.05, 0.01 (reference.md §7); p-value from the asymptotic
 * Kolmogorov distribution at λ = D·√(n·m/(n + m)), so rejectAt05 and pValue < 0.05 agree
 * (c(0.05) is that distribution's 95 % point). Asymptotic: rough for samples of a few dozen or fewer.
 */
export function ksTwoSample(a: ArrayLike<number>, b: ArrayLike<number>): KsTwoSample {
  assertFiniteSample(a, 'a');
  assertFiniteSample(b, 'b');
  const sa = sortedCopy(a);
  const sb = sortedCopy(b);
  const n = sa.length;
  const m = sb.length;
  let i = 0;
  let j = 0;
  let d = 0;
  while (i < n && j < m) {
    const x = Math.min(sa[i] as number, sb[j] as number);
    while (i < n && sa[i] === x) i++;
    while (j < m && sb[j] === x) j++;
    d = Math.max(d, Math.abs(i / n - j / m));
  }
  const scale = Math.sqrt((n + m) / (n * m));
  const critical = {
    '0.10': KS_C_ALPHA['0.10'] * scale,
    '0.05': KS_C_ALPHA['0.05'] * scale,
    '0.01': KS_C_ALPHA['0.01'] * scale,
  };
  return { d, n, m, critical, rejectAt05: d > critical['0.05'], pValue: kolmogorovQ(d / scale) };
}
