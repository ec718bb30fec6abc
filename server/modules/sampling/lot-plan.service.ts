import type { DataSource, EntityManager } from 'typeorm';
import type { LotPlan, LotPlanResponse, SwitchingView } from '../../../shared/api/sampling.ts';
import { planForLot } from '../../../shared/domain/inspection/index.ts';
import { SamplingInputError, type Severity } from '../../../shared/domain/sampling/index.ts';
import type { PartType } from '../catalog/part-type.entity.ts';
import type { Lot } from '../lots/lot.entity.ts';
import { loadLotContext, toBenchLot, toBenchPartType } from '../bench/lot-context.ts';
import { loadSwitching, toSwitchingView } from './switching.service.ts';

export interface ResolvedLotPlan {
  plan: LotPlan | null;
  planError: string | null;
  switching: SwitchingView;
}

/**
 * The plan for a lot: the method, level and AQL of its part type, the severity of the supplier's
 * switching state (tightened while acceptance is discontinued, ISO 2859-1 9.4).
 */
export async function resolveLotPlan(m: EntityManager, lot: Lot, partType: PartType): Promise<ResolvedLotPlan> {
  const switching = toSwitchingView(await loadSwitching(m, lot.supplierId, lot.partTypeId));
  const severity: Severity = switching.severity === 'discontinued' ? 'tightened' : switching.severity;
  try {
    const plan = planForLot({
      method: partType.samplingMethod,
      lotSize: lot.quantity,
      level: partType.inspectionLevel,
      aql: partType.aql,
      severity,
      hfeMin: partType.hfeMin,
      hfeMax: partType.hfeMax,
    });
    if (switching.severity === 'discontinued') {
      plan.notes.unshift('Acceptance is discontinued: the lot may be measured, but it cannot be accepted until a quality engineer records the supplier\'s corrective action.');
    }
    return { plan, planError: null, switching };
  } catch (e) {
    if (e instanceof SamplingInputError) {
      return { plan: null, planError: `${e.message} (part type ${partType.partNumber}: ${e.field})`, switching };
    }
    throw e;
  }
}

/** Current (not superseded) measurements of a lot. */
export async function countCurrent(m: EntityManager, lotId: number): Promise<number> {
  const [row] = (await m.query('SELECT count(*)::int AS n FROM measurement WHERE lot_id = $1 AND NOT superseded', [lotId])) as { n: number }[];
  return row.n;
}

/** The plan and severity stored with a signed disposition, or null while the lot is not signed. */
async function signedPlan(m: EntityManager, lotId: number): Promise<{ plan: LotPlan | null; severity: SwitchingView['severity'] } | null> {
  const [row] = (await m.query(`SELECT recommendation FROM disposition WHERE lot_id = $1 AND signed_at IS NOT NULL`, [lotId])) as {
    recommendation: { plan: LotPlan | null; severity: SwitchingView['severity'] };
  }[];
  return row ? { plan: row.recommendation.plan, severity: row.recommendation.severity } : null;
}

export async function getLotPlan(ds: DataSource, lotId: number): Promise<LotPlanResponse> {
  const { lot, partType, supplier } = await loadLotContext(ds.manager, lotId);
  const [resolved, measured, signed] = await Promise.all([resolveLotPlan(ds.manager, lot, partType), countCurrent(ds.manager, lotId), signedPlan(ds.manager, lotId)]);
  const plan = signed ? signed.plan : resolved.plan;
  return {
    lot: toBenchLot(lot, supplier),
    partType: toBenchPartType(partType),
    switching: resolved.switching,
    plan,
    planError: signed && !signed.plan ? 'no sampling plan applied when the disposition was signed' : resolved.planError,
    planAsSigned: Boolean(signed),
    planSeverity: signed ? signed.severity : resolved.switching.severity,
    measured,
    remaining: plan ? Math.max(0, plan.sampleSize - measured) : 0,
  };
}
