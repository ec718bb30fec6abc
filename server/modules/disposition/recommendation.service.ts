import type { EntityManager } from 'typeorm';
import type { Recommendation } from '../../../shared/api/disposition.ts';
import { recommend } from '../../../shared/domain/inspection/index.ts';
import type { PartType } from '../catalog/part-type.entity.ts';
import type { Lot } from '../lots/lot.entity.ts';
import { outsideLimitsSql } from '../measurements/measurements.service.ts';
import { resolveLotPlan } from '../sampling/lot-plan.service.ts';

/** The product's recommendation for a lot from its plan and its current readings at 25 °C. */
export async function computeRecommendation(m: EntityManager, lot: Lot, partType: PartType): Promise<Recommendation> {
  const resolved = await resolveLotPlan(m, lot, partType);
  const params: unknown[] = [lot.id];
  const outside = outsideLimitsSql(partType, params);
  const [agg] = (await m.query(
    `SELECT count(*)::int AS n, count(*) FILTER (WHERE ${outside})::int AS d FROM measurement m WHERE m.lot_id = $1 AND NOT m.superseded`,
    params,
  )) as { n: number; d: number }[];
  let hfeValues: number[] | undefined;
  if (resolved.plan?.method === 'variables' && agg.n >= resolved.plan.sampleSize) {
    const rows = (await m.query('SELECT hfe_25 FROM measurement WHERE lot_id = $1 AND NOT superseded ORDER BY position', [lot.id])) as { hfe_25: number }[];
    hfeValues = rows.map((r) => r.hfe_25);
  }
  const r = recommend({
    plan: resolved.plan,
    planError: resolved.planError,
    discontinued: resolved.switching.acceptanceBlocked,
    measured: agg.n,
    defects: agg.d,
    hfeValues,
    hfeMin: partType.hfeMin,
    hfeMax: partType.hfeMax,
  });
  return {
    decision: r.decision,
    reason: r.reason,
    measured: agg.n,
    defects: r.defects ?? (resolved.plan?.method === 'variables' ? null : agg.d),
    plan: resolved.plan,
    severity: resolved.switching.severity,
    sMethod: r.sMethod,
  };
}
