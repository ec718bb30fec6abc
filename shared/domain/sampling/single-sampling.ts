import { codeLetter, type CodeLetter, type InspectionLevel } from './code-letters.ts';
import { SamplingInputError } from './errors.ts';
import {
  MASTER_TABLES,
  assertSeverity,
  masterTablePlan,
  oneStepTighterAcceptNumber,
  type Severity,
} from './master-tables.ts';

export interface SingleSamplingInput {
  /** Parts in the lot, whole number ≥ 2. */
  readonly lotSize: number;
  readonly level: InspectionLevel;
  /** Acceptance quality limit, % nonconforming; one of AQL_VALUES. */
  readonly aql: number;
  readonly severity: Severity;
}

export interface SingleSamplingPlan {
  /** Letter from Table 1 for the lot size and level. */
  readonly codeLetter: CodeLetter;
  /** Row of the master table whose plan is used, after following arrows. */
  readonly planLetter: CodeLetter;
  /** Parts to inspect; equals the lot size when the plan's sample would reach it. */
  readonly sampleSize: number;
  /** Acceptance number Ac: accept the lot when nonconforming parts d ≤ Ac. */
  readonly accept: number;
  /** Rejection number Re: do not accept when d ≥ Re. */
  readonly reject: number;
  /** True when the plan's sample size reaches the lot size, so every part is inspected. */
  readonly hundredPercent: boolean;
  readonly source: string;
}

/**
 * Single-sampling plan for a lot: code letter from ISO 2859-1 Table 1, then the normal (Table 2-A),
 * tightened (Table 2-B) or reduced (Z1.4 Table II-C convention) master table with the arrow rule.
 * When the sample size reaches the lot size the whole lot is inspected (ISO 2859-1 Table 2 note),
 * with the plan's Ac/Re kept. Throws SamplingInputError naming 'lotSize', 'level', 'aql' or
 * 'severity'.
 */
export function singleSamplingPlan(input: SingleSamplingInput): SingleSamplingPlan {
  const { lotSize, level, aql, severity } = input;
  const letter = codeLetter(lotSize, level);
  const plan = masterTablePlan(assertedSeverity(severity), letter, aql);
  const hundredPercent = plan.sampleSize >= lotSize;
  return {
    codeLetter: letter,
    planLetter: plan.planLetter,
    sampleSize: hundredPercent ? lotSize : plan.sampleSize,
    accept: plan.accept,
    reject: plan.reject,
    hundredPercent,
    source: `ISO 2859-1 Table 1; ${MASTER_TABLES[severity].source}`,
  };
}

function assertedSeverity(severity: unknown): Severity {
  assertSeverity(severity);
  return severity;
}

export interface AttributeLotJudgement {
  /** The lot is accepted on this inspection. */
  readonly accepted: boolean;
  /** Accepted with Ac < d < Re (only possible with the reduced Z1.4 plans): reinstate normal. */
  readonly gapAccept: boolean;
}

/**
 * Accept/not-accept for d nonconforming parts found in the sample (ISO 2859-1 clause 11):
 * accepted when d ≤ Ac, not accepted when d ≥ Re; Ac < d < Re (reduced plans, Z1.4 convention)
 * accepts the lot and reinstates normal inspection.
 */
export function judgeAttributeLot(
  plan: Pick<SingleSamplingPlan, 'accept' | 'reject'>,
  defects: number,
): AttributeLotJudgement {
  if (!Number.isSafeInteger(defects) || defects < 0) {
    throw new SamplingInputError('defects', `nonconforming count must be a whole number ≥ 0 (got ${String(defects)})`);
  }
  if (defects <= plan.accept) return { accepted: true, gapAccept: false };
  if (defects >= plan.reject) return { accepted: false, gapAccept: false };
  return { accepted: true, gapAccept: true };
}

/**
 * Whether a lot inspected on normal inspection with this plan would also have been accepted had
 * the AQL been one step tighter (same sample, Table 2-A acceptance number of the next tighter
 * AQL column). Input to the ISO 2859-1:1999 switching score. False when that cell is an arrow.
 */
export function wouldAcceptOneStepTighter(
  plan: Pick<SingleSamplingPlan, 'planLetter'>,
  aql: number,
  defects: number,
): boolean {
  const tighterAccept = oneStepTighterAcceptNumber(plan.planLetter, aql);
  return tighterAccept !== null && defects <= tighterAccept;
}
