import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { SwitchingSettingsRequest, SwitchingView } from '../../../shared/api/sampling.ts';
import {
  advanceSwitching,
  initialSwitchingState,
  recordCorrectiveAction,
  type SwitchingLotResult,
  type SwitchingStep,
} from '../../../shared/domain/sampling/index.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { PartType } from '../catalog/part-type.entity.ts';
import { Supplier } from '../suppliers/supplier.entity.ts';
import { SwitchingStateRow } from './switching-state.entity.ts';

const START_REASON = 'no lot disposed yet for this supplier and part type: inspection starts on normal (ISO 2859-1 9.2)';

/** The stored switching state, or the starting state (normal) when none is stored yet. */
export async function loadSwitching(m: EntityManager, supplierId: number, partTypeId: number, lock = false): Promise<SwitchingStateRow> {
  const row = await m.findOne(SwitchingStateRow, {
    where: { supplierId, partTypeId },
    ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}),
  });
  if (row) return row;
  return m.create(SwitchingStateRow, {
    supplierId,
    partTypeId,
    state: initialSwitchingState(),
    reason: START_REASON,
    reducedApproved: false,
    productionSteady: true,
    updatedAt: null as unknown as Date,
  });
}

export function toSwitchingView(row: SwitchingStateRow): SwitchingView {
  const s = row.state;
  return {
    supplierId: row.supplierId,
    partTypeId: row.partTypeId,
    severity: s.severity,
    reason: row.reason,
    acceptanceBlocked: s.severity === 'discontinued',
    recent: [...s.recent],
    consecutiveAcceptedTightened: s.consecutiveAcceptedTightened,
    rejectedInTightened: s.rejectedInTightened,
    switchingScore: s.switchingScore,
    reducedApproved: row.reducedApproved,
    productionSteady: row.productionSteady,
    updatedAt: row.updatedAt ? row.updatedAt.toISOString() : null,
  };
}

async function save(m: EntityManager, row: SwitchingStateRow, step: SwitchingStep): Promise<SwitchingStateRow> {
  row.state = step.state;
  row.reason = step.reason.slice(0, 500);
  row.updatedAt = new Date();
  await m.upsert(SwitchingStateRow, row, ['supplierId', 'partTypeId']);
  return row;
}

/**
 * Applies a disposed lot to the switching state, inside the disposition's transaction, and
 * audits the step. Returns the step (new state, whether the severity changed, why).
 */
export async function advanceForLot(
  m: EntityManager,
  actor: SessionUser,
  ids: { supplierId: number; partTypeId: number; lotId: number },
  lot: SwitchingLotResult,
): Promise<SwitchingStep> {
  const row = await loadSwitching(m, ids.supplierId, ids.partTypeId, true);
  const before = row.state;
  const step = advanceSwitching(row.state, lot, { reducedApproved: row.reducedApproved, productionSteady: row.productionSteady });
  await save(m, row, step);
  await recordAudit(m, {
    actor,
    action: 'switching.advance',
    entityType: 'switching',
    entityId: `${ids.supplierId}:${ids.partTypeId}`,
    before: { ...before },
    after: { ...step.state },
    note: `lot ${ids.lotId}: ${step.reason}`.slice(0, 500),
  });
  return step;
}

async function assertPair(m: EntityManager, supplierId: number, partTypeId: number): Promise<void> {
  if (!(await m.existsBy(Supplier, { id: supplierId }))) throw AppError.notFound(`Supplier ${supplierId}`);
  if (!(await m.existsBy(PartType, { id: partTypeId }))) throw AppError.notFound(`Part type ${partTypeId}`);
}

export async function getSwitching(ds: DataSource, supplierId: number, partTypeId: number): Promise<SwitchingView> {
  await assertPair(ds.manager, supplierId, partTypeId);
  return toSwitchingView(await loadSwitching(ds.manager, supplierId, partTypeId));
}

/** A quality engineer records the supplier's corrective action: discontinued → tightened (ISO 2859-1 9.4). */
export async function recordSupplierCorrectiveAction(
  ds: DataSource,
  actor: SessionUser,
  supplierId: number,
  partTypeId: number,
  note: string,
): Promise<SwitchingView> {
  return ds.transaction(async (m) => {
    await assertPair(m, supplierId, partTypeId);
    const row = await loadSwitching(m, supplierId, partTypeId, true);
    if (row.state.severity !== 'discontinued') {
      throw AppError.conflict(`Acceptance is not discontinued (inspection is ${row.state.severity}); there is no corrective action to record.`);
    }
    const before = row.state;
    const step = recordCorrectiveAction(row.state);
    await save(m, row, { ...step, reason: `${step.reason}: ${note}` });
    await recordAudit(m, {
      actor,
      action: 'switching.corrective-action',
      entityType: 'switching',
      entityId: `${supplierId}:${partTypeId}`,
      before: { ...before },
      after: { ...step.state },
      note: note.slice(0, 500),
    });
    return toSwitchingView(row);
  });
}

/** Whether reduced inspection is approved and production is steady (inputs of the switching rules). */
export async function updateSwitchingSettings(
  ds: DataSource,
  actor: SessionUser,
  supplierId: number,
  partTypeId: number,
  input: SwitchingSettingsRequest,
): Promise<SwitchingView> {
  return ds.transaction(async (m) => {
    await assertPair(m, supplierId, partTypeId);
    const row = await loadSwitching(m, supplierId, partTypeId, true);
    const before = { reducedApproved: row.reducedApproved, productionSteady: row.productionSteady };
    if (input.reducedApproved !== undefined) row.reducedApproved = input.reducedApproved;
    if (input.productionSteady !== undefined) row.productionSteady = input.productionSteady;
    row.updatedAt = new Date();
    await m.upsert(SwitchingStateRow, row, ['supplierId', 'partTypeId']);
    await recordAudit(m, {
      actor,
      action: 'switching.settings',
      entityType: 'switching',
      entityId: `${supplierId}:${partTypeId}`,
      before,
      after: { reducedApproved: row.reducedApproved, productionSteady: row.productionSteady },
    });
    return toSwitchingView(row);
  });
}
