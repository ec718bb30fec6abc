import { IsNull, type DataSource, type EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { DispositionDecision, DispositionView, MrbAction, ProposeDispositionRequest, Recommendation, SignDispositionRequest } from '../../../shared/api/disposition.ts';
import { wouldAcceptOneStepTighter, type CodeLetter, type SwitchingLotResult } from '../../../shared/domain/sampling/index.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { loadLotContext } from '../bench/lot-context.ts';
import type { PartType } from '../catalog/part-type.entity.ts';
import { Lot, type LotStatus } from '../lots/lot.entity.ts';
import { MeasurementSession } from '../measurements/measurement-session.entity.ts';
import { advanceForLot } from '../sampling/switching.service.ts';
import { onLotDisposed } from '../supplier-quality/drift.service.ts';
import { User } from '../users/user.entity.ts';
import { Disposition } from './disposition.entity.ts';
import { computeRecommendation } from './recommendation.service.ts';

const FINAL: LotStatus[] = ['accepted', 'rejected', 'mrb'];
const STATUS_OF: Record<DispositionDecision, LotStatus> = { accept: 'accepted', reject: 'rejected', mrb: 'mrb' };

function mrbActionOf(input: { decision: DispositionDecision; mrbAction?: MrbAction | null }): MrbAction | null {
  if (input.decision === 'mrb') {
    if (!input.mrbAction) throw AppError.badRequest('An MRB decision needs its action.', [{ field: 'mrbAction', message: 'choose use-as-is, return-to-supplier, scrap or screen-100' }]);
    return input.mrbAction;
  }
  if (input.mrbAction) throw AppError.badRequest('mrbAction goes only with the decision mrb.', [{ field: 'mrbAction', message: 'only for decision mrb' }]);
  return null;
}

function assertNotBlocked(decision: DispositionDecision, rec: Recommendation): void {
  if (decision === 'accept' && rec.severity === 'discontinued') {
    throw AppError.conflict(
      "Acceptance is discontinued for this supplier and part type (ISO 2859-1 9.4): a quality engineer must record the supplier's corrective action before a lot can be accepted.",
      [{ field: 'decision', message: 'acceptance discontinued' }],
    );
  }
}

async function names(m: EntityManager, ids: (number | null)[]): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((i): i is number => i !== null))];
  const users = wanted.length ? await m.getRepository(User).createQueryBuilder('u').where('u.id IN (:...ids)', { ids: wanted }).getMany() : [];
  return new Map(users.map((u) => [u.id, u.name]));
}

async function toView(m: EntityManager, lot: Lot, d: Disposition | null, live: Recommendation): Promise<DispositionView> {
  const who = await names(m, [d?.proposedBy ?? null, d?.signedBy ?? null]);
  return {
    lotId: lot.id,
    lotStatus: lot.status,
    recommendation: live,
    proposal: d
      ? {
          decision: d.proposedDecision,
          mrbAction: d.proposedMrbAction,
          reason: d.proposalReason,
          by: { id: d.proposedBy, name: who.get(d.proposedBy) ?? '', at: d.proposedAt.toISOString() },
          recommendation: d.recommendation,
        }
      : null,
    signature:
      d && d.signedAt && d.decision && d.signedBy !== null
        ? { decision: d.decision, mrbAction: d.mrbAction, reason: d.reason ?? '', by: { id: d.signedBy, name: who.get(d.signedBy) ?? '', at: d.signedAt.toISOString() } }
        : null,
    locked: Boolean(d?.signedAt),
  };
}

export async function getDisposition(ds: DataSource, lotId: number): Promise<DispositionView> {
  const { lot, partType } = await loadLotContext(ds.manager, lotId);
  const d = await ds.getRepository(Disposition).findOneBy({ lotId });
  const live = d?.signedAt ? d.recommendation : await computeRecommendation(ds.manager, lot, partType);
  return toView(ds.manager, lot, d, live);
}

function auditView(d: Disposition) {
  return {
    proposedDecision: d.proposedDecision,
    proposedMrbAction: d.proposedMrbAction,
    proposalReason: d.proposalReason,
    recommended: d.recommended,
    decision: d.decision,
    mrbAction: d.mrbAction,
    reason: d.reason,
    signedBy: d.signedBy,
  };
}

/** An inspector (or quality engineer) proposes the disposition; the lot then awaits signature. */
export async function proposeDisposition(ds: DataSource, actor: SessionUser, lotId: number, input: ProposeDispositionRequest): Promise<DispositionView> {
  const mrbAction = mrbActionOf(input);
  return ds.transaction(async (m) => {
    const { lot, partType } = await loadLotContext(m, lotId, true);
    const existing = await m.findOneBy(Disposition, { lotId });
    if (existing?.signedAt || FINAL.includes(lot.status)) throw AppError.conflict(`The disposition of lot ${lot.code} is signed and locked.`);
    const rec = await computeRecommendation(m, lot, partType);
    assertNotBlocked(input.decision, rec);
    const before = existing ? auditView(existing) : null;
    const d = existing ?? m.create(Disposition, { lotId });
    Object.assign(d, {
      recommended: rec.decision,
      recommendation: rec,
      proposedDecision: input.decision,
      proposedMrbAction: mrbAction,
      proposedBy: actor.id,
      proposedAt: new Date(),
      proposalReason: input.reason.trim(),
    });
    await m.save(d);
    const statusBefore = lot.status;
    if (lot.status !== 'awaiting-signature') {
      await m.update(Lot, { id: lot.id }, { status: 'awaiting-signature', updatedAt: new Date() });
      lot.status = 'awaiting-signature';
    }
    await recordAudit(m, {
      actor,
      action: 'disposition.propose',
      entityType: 'lot',
      entityId: lotId,
      before: before ? { ...before, status: statusBefore } : { status: statusBefore },
      after: { ...auditView(d), status: lot.status },
      note: rec.reason.slice(0, 500),
    });
    return toView(m, lot, d, rec);
  });
}

/** The switching input for this lot's original-inspection outcome, or null when no plan applied. */
export function switchingInput(rec: Recommendation, decision: DispositionDecision, part: Pick<PartType, 'aql'>): SwitchingLotResult | null {
  const plan = rec.plan;
  if (!plan) return null;
  const accepted = decision === 'accept';
  if (plan.method === 'variables') {
    // The s-method has no acceptance number: counted as Ac 0 for the switching score (simplification).
    return { accepted, acceptNumber: 0, defects: accepted ? 0 : 1, wouldAcceptOneStepTighter: false };
  }
  const defects = rec.defects ?? 0;
  const ac = plan.accept as number;
  const re = plan.reject as number;
  return {
    accepted,
    acceptNumber: ac,
    defects,
    wouldAcceptOneStepTighter: accepted && plan.planLetter !== null && wouldAcceptOneStepTighter({ planLetter: plan.planLetter as CodeLetter }, part.aql, defects),
    reducedGapAccept: accepted && plan.severity === 'reduced' && defects > ac && defects < re,
  };
}

/**
 * A quality engineer signs: accept, reject, or MRB with its action, with a reason. The lot takes
 * its final status, open sessions close, the switching state advances, and the disposition is
 * locked — all in one transaction with the audit entries.
 */
export async function signDisposition(ds: DataSource, actor: SessionUser, lotId: number, input: SignDispositionRequest): Promise<DispositionView> {
  const mrbAction = mrbActionOf(input);
  return ds.transaction(async (m) => {
    const { lot, partType } = await loadLotContext(m, lotId, true);
    const d = await m.findOne(Disposition, { where: { lotId }, lock: { mode: 'pessimistic_write' } });
    if (d?.signedAt || FINAL.includes(lot.status)) throw AppError.conflict(`The disposition of lot ${lot.code} is signed and locked.`);
    if (!d) throw AppError.conflict('Nothing to sign yet: an inspector proposes the disposition first.');
    const rec = await computeRecommendation(m, lot, partType);
    assertNotBlocked(input.decision, rec);
    const before = auditView(d);
    Object.assign(d, {
      recommended: rec.decision,
      recommendation: rec,
      decision: input.decision,
      mrbAction,
      reason: input.reason.trim(),
      signedBy: actor.id,
      signedAt: new Date(),
    });
    await m.save(d);
    const statusBefore = lot.status;
    lot.status = STATUS_OF[input.decision];
    await m.update(Lot, { id: lot.id }, { status: lot.status, updatedAt: new Date() });
    await m.update(MeasurementSession, { lotId, closedAt: IsNull() }, { closedAt: new Date() });
    let switchingNote = 'switching state not advanced: no sampling plan applied';
    if (rec.severity === 'discontinued') {
      switchingNote = 'switching state not advanced: acceptance is discontinued until the corrective action is recorded';
    } else {
      const lotResult = switchingInput(rec, d.decision as DispositionDecision, partType);
      if (lotResult) {
        const step = await advanceForLot(m, actor, { supplierId: lot.supplierId, partTypeId: lot.partTypeId, lotId }, lotResult);
        switchingNote = step.reason;
      }
    }
    await recordAudit(m, {
      actor,
      action: 'disposition.sign',
      entityType: 'lot',
      entityId: lotId,
      before: { ...before, status: statusBefore },
      after: { ...auditView(d), status: lot.status },
      note: `${input.reason.trim()} | ${switchingNote}`.slice(0, 500),
    });
    await onLotDisposed(m, lotId); // Suppliers: drift check against the supplier's accepted history.
    return toView(m, lot, d, rec);
  });
}
