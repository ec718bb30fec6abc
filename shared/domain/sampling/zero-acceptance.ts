import type { InspectionLevel } from './code-letters.ts';
import { SamplingInputError } from './errors.ts';
import { singleSamplingPlan, type SingleSamplingPlan } from './single-sampling.ts';

function assertOpenProbability(field: string, value: number): void {
  if (!Number.isFinite(value) || value <= 0 || value >= 1) {
    throw new SamplingInputError(field, `${field} must be a probability strictly between 0 and 1 (got ${String(value)})`);
  }
}

/**
 * Smallest c = 0 sample size n (parts) that gives confidence C that the lot's fraction
 * nonconforming is below p₁ when no nonconforming part is found: n = ⌈ln(1 − C)/ln(1 − p₁)⌉
 * (reference.md §1.7, derived from Pa = (1 − p)ⁿ). E.g. C = 0.95, p₁ = 0.01 → 299.
 * Both arguments are fractions (0.95, not 95).
 */
export function zeroAcceptanceSampleSize(confidence: number, p1: number): number {
  assertOpenProbability('confidence', confidence);
  assertOpenProbability('p1', p1);
  const exact = Math.log1p(-confidence) / Math.log1p(-p1);
  // The tolerance keeps a quotient that is an integer in exact arithmetic (e.g. 0.75, 0.5 → 2)
  // from being rounded up by floating-point error.
  return Math.max(1, Math.ceil(exact - 1e-9));
}

/**
 * Probability of accepting a lot, Pa = P(d ≤ c) for d ~ Binomial(n, p): sample size n (parts),
 * acceptance number c, fraction nonconforming p (0…1). For c = 0, Pa = (1 − p)ⁿ
 * (reference.md §1.7). Summed in log space so large n does not underflow.
 */
export function probabilityOfAcceptance(n: number, c: number, p: number): number {
  if (!Number.isSafeInteger(n) || n < 1) {
    throw new SamplingInputError('n', `sample size must be a whole number ≥ 1 (got ${String(n)})`);
  }
  if (!Number.isSafeInteger(c) || c < 0) {
    throw new SamplingInputError('c', `acceptance number must be a whole number ≥ 0 (got ${String(c)})`);
  }
  if (!Number.isFinite(p) || p < 0 || p > 1) {
    throw new SamplingInputError('p', `fraction nonconforming must be between 0 and 1 (got ${String(p)})`);
  }
  if (c >= n || p === 0) return 1;
  if (p === 1) return 0;
  const logP = Math.log(p);
  const logQ = Math.log1p(-p);
  let logTerm = n * logQ;
  let sum = Math.exp(logTerm);
  for (let d = 0; d < c; d += 1) {
    logTerm += Math.log(n - d) - Math.log(d + 1) + logP - logQ;
    sum += Math.exp(logTerm);
  }
  return Math.min(1, sum);
}

export interface ZeroAcceptanceInput {
  readonly lotSize: number;
  readonly level: InspectionLevel;
  /** % nonconforming; one of AQL_VALUES. */
  readonly aql: number;
}

/** Source string of zeroAcceptancePlan. */
export const ZERO_ACCEPTANCE_SOURCE =
  'Binwright simplification: sample size of the ISO 2859-1 normal single plan (Table 1, Table 2-A) ' +
  'with Ac 0 / Re 1. N. L. Squeglia, Zero Acceptance Number Sampling Plans (ASQ Quality Press, ' +
  '5th ed. 2008) tabulates its own c = 0 sample sizes, which are not reproduced here.';

/**
 * A c = 0 plan: the sample size of the normal single-sampling plan for the lot (ISO 2859-1 Table 1
 * and Table 2-A, 100 % when it reaches the lot size) with Ac 0, Re 1. This is our simplification;
 * Squeglia's c = 0 table (reference.md §1.7) is not published here, so its sample sizes are not used.
 */
export function zeroAcceptancePlan(input: ZeroAcceptanceInput): SingleSamplingPlan {
  const normal = singleSamplingPlan({ ...input, severity: 'normal' });
  return { ...normal, accept: 0, reject: 1, source: ZERO_ACCEPTANCE_SOURCE };
}
