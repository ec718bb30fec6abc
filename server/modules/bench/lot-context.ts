import type { EntityManager } from 'typeorm';
import type { BenchLot, BenchPartType } from '../../../shared/api/sampling.ts';
import { AppError } from '../../http/app-error.ts';
import { PartType } from '../catalog/part-type.entity.ts';
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

/** Lot states in which the bench may still record measurements. */
export const MEASURABLE_STATUSES = new Set(['received', 'inspecting', 'awaiting-signature']);

export function assertMeasurable(lot: Lot): void {
  if (!MEASURABLE_STATUSES.has(lot.status)) {
    throw AppError.conflict(`Lot ${lot.code} is ${lot.status}: its disposition is signed and its measurements are closed.`);
  }
}
