import type { EntityManager } from 'typeorm';
import { MRB_ACTION_LABELS, type MrbAction } from '../../../shared/api/disposition.ts';
import type { SessionMode } from '../../../shared/api/measurements.ts';
import type { BenchLot, BenchPartType } from '../../../shared/api/sampling.ts';
import { SCREEN_AFTER_SIGNING_ACTION, benchWorkFor, modeAllowed, type BenchWork } from '../../../shared/domain/inspection/index.ts';
import { AppError } from '../../http/app-error.ts';
import { PartType } from '../catalog/part-type.entity.ts';
import { Disposition } from '../disposition/disposition.entity.ts';
import { Lot } from '../lots/lot.entity.ts';
import { Supplier } from '../suppliers/supplier.entity.ts';

export interface LotContext {
  lot: Lot;
  partType: PartType;
  supplier: Supplier;
}

/** Reads `:id` of a lot route; 400 naming `id` unless it is a positive whole number. */
export function parseLotId(raw: unknown): number {
  const id = Number(raw);
  if (!Number.isSafeInteger(id) || id < 1) {
    throw AppError.badRequest('The lot id must be a positive whole number.', [{ field: 'id', message: 'invalid lot id' }]);
  }
  return id;
}

/**
 * Loads a lot with its part type and supplier, or 404. With `lock`, the lot row is locked for
 * the rest of the transaction so concurrent bench writes on one lot run one after another.
 */
export async function loadLotContext(m: EntityManager, lotId: number, lock = false): Promise<LotContext> {
  const lot = await m.findOne(Lot, { where: { id: lotId }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
  if (!lot) throw AppError.notFound(`Lot ${lotId}`);
  const [partType, supplier] = await Promise.all([
    m.findOneByOrFail(PartType, { id: lot.partTypeId }),
    m.findOneByOrFail(Supplier, { id: lot.supplierId }),
  ]);
  return { lot, partType, supplier };
}

export function toBenchLot(lot: Lot, supplier: Supplier): BenchLot {
  return {
    id: lot.id,
    code: lot.code,
    status: lot.status,
    quantity: lot.quantity,
    supplierId: lot.supplierId,
    supplierName: supplier.name,
    partTypeId: lot.partTypeId,
    binSchemeId: lot.binSchemeId,
    supplierLot: lot.supplierLot,
    dateCode: lot.dateCode,
    receivedAt: lot.receivedAt.toISOString(),
  };
}

export function toBenchPartType(p: PartType): BenchPartType {
  return {
    id: p.id,
    partNumber: p.partNumber,
    description: p.description,
    polarity: p.polarity,
    hfeIcMa: p.hfeIcMa,
    hfeVceV: p.hfeVceV,
    vbeIcMa: p.vbeIcMa,
    hfeMin: p.hfeMin,
    hfeMax: p.hfeMax,
    vbeMinMv: p.vbeMinMv,
    vbeMaxMv: p.vbeMaxMv,
    vbeTcMvPerC: p.vbeTcMvPerC,
    hfeTcPctPerC: p.hfeTcPctPerC,
    esdHbmClass: p.esdHbmClass,
    samplingMethod: p.samplingMethod,
    inspectionLevel: p.inspectionLevel,
    aql: p.aql,
  };
}

/** Lot states in which the bench may still record measurements of either mode. */
export const MEASURABLE_STATUSES = new Set(['received', 'inspecting', 'awaiting-signature']);

/**
 * What the bench may still record on a lot (shared/domain/inspection benchWorkFor). The signed
 * disposition is read only for an MRB lot, so the hot path (a lot under inspection) costs no query.
 */
export async function benchWorkOf(m: EntityManager, lot: Pick<Lot, 'id' | 'status'>): Promise<BenchWork> {
  if (MEASURABLE_STATUSES.has(lot.status)) return 'open';
  if (lot.status !== 'mrb') return 'closed';
  const d = await m.findOne(Disposition, { where: { lotId: lot.id }, select: { lotId: true, mrbAction: true, signedAt: true } });
  return benchWorkFor(lot.status, d?.signedAt ? d.mrbAction : null);
}

const SCREEN_LABEL = MRB_ACTION_LABELS[SCREEN_AFTER_SIGNING_ACTION as MrbAction];

/**
 * Refuses bench work a lot no longer takes (409): every reading once the disposition is signed,
 * except 100 % screening of a lot whose signed disposition is MRB "100 % screen". `mode` is the
 * mode of the session the work goes into, or null while that is not known yet (then only a lot
 * closed to both modes is refused). Answers what the lot still takes.
 */
export async function assertMeasurable(m: EntityManager, lot: Lot, mode: SessionMode | null): Promise<BenchWork> {
  const work = await benchWorkOf(m, lot);
  if (mode === null ? work !== 'closed' : modeAllowed(work, mode)) return work;
  if (work === 'screen-only') {
    throw AppError.conflict(
      `Lot ${lot.code} has the signed MRB disposition "${SCREEN_LABEL}": only 100 % screening sessions record on it now. The sample its disposition rests on is closed.`,
      [{ field: 'mode', message: `only mode screen after a signed "${SCREEN_LABEL}" disposition` }],
    );
  }
  throw AppError.conflict(
    `Lot ${lot.code} is ${lot.status}: its disposition is signed and its measurements are closed.` +
      (mode === 'screen' ? ` Screening after signing is open only when the signed disposition is MRB "${SCREEN_LABEL}".` : ''),
    mode === 'screen' ? [{ field: 'mode', message: `screening after signing needs the MRB disposition "${SCREEN_LABEL}"` }] : undefined,
  );
}
