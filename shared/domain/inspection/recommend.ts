import { judgeAttributeLot, sMethodDecision } from '../sampling/index.ts';
import type { LotPlanResult } from './lot-plan.ts';

export type RecommendedDecision = 'accept' | 'reject' | 'incomplete' | 'blocked';

export interface RecommendationInput {
  plan: LotPlanResult | null;
  /** Why no plan applies, when plan is null. */
  planError?: string | null;
  /** Acceptance is discontinued for this supplier and part type. */
  discontinued: boolean;
  /** Current measurements of the lot. */
  measured: number;
  /** Parts outside a limit at 25 °C among them. */
  defects: number;
  /** hFE at 25 °C of the measured parts (needed for the variables method only). */
  hfeValues?: readonly number[];
  hfeMin: number | null;
  hfeMax: number | null;
}

export interface RecommendationResult {
  decision: RecommendedDecision;
  reason: string;
  defects: number | null;
  sMethod: { mean: number; sd: number; qL: number | null; qU: number | null; k: number; reasons: string[] } | null;
}

/**
 * What the product recommends for a lot (a person decides):
 * - no plan → incomplete; sample not complete → incomplete, naming how many parts are missing;
 * - attribute / zero-acceptance: d ≤ Ac accept, d ≥ Re reject, Ac < d < Re accept with normal
 *   reinstated (ISO 2859-1 clause 11; reduced plans of the Z1.4 convention);
 * - variables: the s-method decision on hFE (Q ≥ k for every given limit);
 * - acceptance discontinued (ISO 2859-1 9.4): an accept becomes "blocked" until the supplier's
 *   corrective action is recorded. Product rule built on shared/domain/sampling.
 */
export function recommend(input: RecommendationInput): RecommendationResult {
  const { plan, measured, defects } = input;
  if (!plan) {
    return { decision: 'incomplete', reason: `No sampling plan applies: ${input.planError ?? 'unknown reason'}.`, defects: null, sMethod: null };
  }
  if (measured < plan.sampleSize) {
    const missing = plan.sampleSize - measured;
    return {
      decision: 'incomplete',
      reason: `${measured} of ${plan.sampleSize} sampled parts measured; ${missing} still to measure.`,
      defects: plan.method === 'variables' ? null : defects,
      sMethod: null,
    };
  }
  let result: RecommendationResult;
  if (plan.method === 'variables') {
    const k = plan.k as number;
    const d = sMethodDecision({
      values: input.hfeValues ?? [],
      ...(input.hfeMin !== null ? { lower: input.hfeMin } : {}),
      ...(input.hfeMax !== null ? { upper: input.hfeMax } : {}),
      k,
    });
    result = {
      decision: d.accept ? 'accept' : 'reject',
      reason: `s-method on hFE at 25 °C, n = ${d.n}, x̄ = ${d.mean.toFixed(2)}, s = ${d.sd.toFixed(2)}: ${d.reasons.join('; ')}.`,
      defects: null,
      sMethod: { mean: d.mean, sd: d.sd, qL: d.qL ?? null, qU: d.qU ?? null, k, reasons: [...d.reasons] },
    };
  } else {
    const accept = plan.accept as number;
    const reject = plan.reject as number;
    const j = judgeAttributeLot({ accept, reject }, defects);
    const counted = `${defects} nonconforming in ${measured} measured (Ac ${accept}, Re ${reject})`;
    result = {
      decision: j.accepted ? 'accept' : 'reject',
      reason: j.gapAccept
        ? `${counted}: Ac < d < Re, accept the lot and reinstate normal inspection.`
        : j.accepted
          ? `${counted}: d ≤ Ac, accept.`
          : `${counted}: d ≥ Re, reject.`,
      defects,
      sMethod: null,
    };
  }
  if (input.discontinued && result.decision === 'accept') {
    return { ...result, decision: 'blocked', reason: `${result.reason} But acceptance is discontinued for this supplier and part type until the supplier's corrective action is recorded.` };
  }
  return result;
}
