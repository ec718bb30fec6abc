import { QueryFailedError, type DataSource, type EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { CreateLotRequest, LotDetail, LotDocumentRow, LotRow, LotSort, LotStatus, ReceivingOptions } from '../../../shared/api/lots.ts';
import type { Page } from '../../../shared/api/users.ts';
import { ESD_HBM_CLASSES, describeEsdClass } from '../../../shared/domain/esd/index.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { PartType } from '../catalog/part-type.entity.ts';
import { readLabel } from '../labels/label-reading.ts';
import { Supplier } from '../suppliers/supplier.entity.ts';
import { User } from '../users/user.entity.ts';
import { lotFloorLife } from './floor-life-view.ts';
import { nextLotCode } from './lot-code.ts';
import { Lot, LotDocument } from './lot.entity.ts';

/** How far in the future a stated bag-opening time may lie (clock skew between devices), ms. */
const CLOCK_SKEW_MS = 5 * 60_000;

const text = (v: string | null | undefined) => (typeof v === 'string' && v.trim() !== '' ? v.trim() : null);

export function toLotRow(l: Lot, now: Date): LotRow {
  const s = l.supplier!;
  const p = l.partType!;
  return {
    id: l.id,
    code: l.code,
    status: l.status,
    supplier: { id: s.id, code: s.code, name: s.name },
    partType: { id: p.id, partNumber: p.partNumber },
    quantity: l.quantity,
    purchaseOrder: l.purchaseOrder,
    supplierLot: l.supplierLot,
    dateCode: l.dateCode,
    msl: l.msl,
    dryBag: l.dryBag,
    receivedAt: l.receivedAt.toISOString(),
    floorLife: lotFloorLife(l, p.msl, now),
  };
}

export function toDocumentRow(d: LotDocument): LotDocumentRow {
  return {
    id: d.id,
    lotId: d.lotId,
    kind: d.kind as LotDocumentRow['kind'],
    originalName: d.originalName,
    mediaType: d.mediaType,
    sizeBytes: d.sizeBytes,
    sha256: d.sha256,
    uploadedBy: { id: d.uploadedBy, name: d.uploader?.name ?? `user ${d.uploadedBy}` },
    uploadedAt: d.uploadedAt.toISOString(),
    contentUrl: `/api/lots/${d.lotId}/documents/${d.id}/content`,
  };
}

/** What the audit trail keeps of a lot. */
function auditView(l: Lot) {
  return {
    code: l.code,
    supplierId: l.supplierId,
    partTypeId: l.partTypeId,
    quantity: l.quantity,
    purchaseOrder: l.purchaseOrder,
    supplierPartNumber: l.supplierPartNumber,
    supplierLot: l.supplierLot,
    dateCode: l.dateCode,
    countryOfOrigin: l.countryOfOrigin,
    msl: l.msl,
    dryBag: l.dryBag,
    bagOpenedAt: l.bagOpenedAt?.toISOString() ?? null,
    status: l.status,
    labelFingerprint: l.labelFingerprint,
    overrideBy: l.overrideBy,
    overrideReason: l.overrideReason,
  };
}

export async function receivingOptions(ds: DataSource): Promise<ReceivingOptions> {
  const [suppliers, partTypes] = await Promise.all([
    ds.getRepository(Supplier).find({ order: { name: 'ASC' } }),
    ds.getRepository(PartType).find({ where: { active: true }, order: { partNumber: 'ASC' } }),
  ]);
  return {
    suppliers: suppliers.map((s) => ({ id: s.id, code: s.code, name: s.name, approval: s.approval })),
    partTypes: partTypes.map((p) => ({ id: p.id, partNumber: p.partNumber, description: p.description, msl: p.msl, esdHbmClass: p.esdHbmClass })),
  };
}

export interface LotQuery {
  page: number;
  pageSize: number;
  status?: LotStatus;
  supplierId?: number;
  partTypeId?: number;
  receivedFrom?: Date;
  /** Exclusive upper bound. */
  receivedBefore?: Date;
  search?: string;
  sort: LotSort;
  dir: 'asc' | 'desc';
}

const SORT_COLUMN: Record<LotSort, string> = {
  code: 'l.code',
  receivedAt: 'l.receivedAt',
  quantity: 'l.quantity',
  status: 'l.status',
  supplier: 's.name',
  partNumber: 'p.partNumber',
};

export async function listLots(ds: DataSource, q: LotQuery, now = new Date()): Promise<Page<LotRow>> {
  const qb = ds.getRepository(Lot).createQueryBuilder('l').innerJoinAndSelect('l.supplier', 's').innerJoinAndSelect('l.partType', 'p');
  if (q.status) qb.andWhere('l.status = :status', { status: q.status });
  if (q.supplierId) qb.andWhere('l.supplier_id = :sid', { sid: q.supplierId });
  if (q.partTypeId) qb.andWhere('l.part_type_id = :pid', { pid: q.partTypeId });
  if (q.receivedFrom) qb.andWhere('l.received_at >= :from', { from: q.receivedFrom });
  if (q.receivedBefore) qb.andWhere('l.received_at < :before', { before: q.receivedBefore });
  if (q.search) {
    qb.andWhere('(l.code ILIKE :s OR l.purchase_order ILIKE :s OR l.supplier_lot ILIKE :s)', { s: `%${q.search.replace(/[%_\\]/g, '\\$&')}%` });
  }
  qb.orderBy(SORT_COLUMN[q.sort], q.dir === 'desc' ? 'DESC' : 'ASC').addOrderBy('l.id', q.dir === 'desc' ? 'DESC' : 'ASC');
  // offset/limit, not skip/take: the joins are many-to-one (one row per lot), so TypeORM's extra
  // DISTINCT-ids query that skip/take adds for joins is not needed.
  const [rows, total] = await qb.offset((q.page - 1) * q.pageSize).limit(q.pageSize).getManyAndCount();
  return { items: rows.map((l) => toLotRow(l, now)), total, page: q.page, pageSize: q.pageSize };
}

export async function listDocuments(m: DataSource | EntityManager, lotId: number): Promise<LotDocumentRow[]> {
  const docs = await m.getRepository(LotDocument).find({ where: { lotId }, relations: { uploader: true }, order: { uploadedAt: 'DESC', id: 'DESC' } });
  return docs.map(toDocumentRow);
}

export async function getLot(ds: DataSource, id: number, now = new Date()): Promise<LotDetail> {
  const l = await ds.getRepository(Lot).findOne({ where: { id }, relations: { supplier: true, partType: true, receiver: true } });
  if (!l) throw AppError.notFound(`Lot ${id}`);
  const s = l.supplier!;
  const p = l.partType!;
  const overrideUser = l.overrideBy ? await ds.getRepository(User).findOneBy({ id: l.overrideBy }) : null;
  const esdClass = ESD_HBM_CLASSES.find((c) => c.id === p.esdHbmClass);
  return {
    ...toLotRow(l, now),
    supplier: { id: s.id, code: s.code, name: s.name, approval: s.approval },
    partType: {
      id: p.id,
      partNumber: p.partNumber,
      description: p.description,
      polarity: p.polarity,
      packageName: p.packageName,
      msl: p.msl,
      esdHbmClass: p.esdHbmClass,
    },
    supplierPartNumber: l.supplierPartNumber,
    countryOfOrigin: l.countryOfOrigin,
    bagOpenedAt: l.bagOpenedAt?.toISOString() ?? null,
    receivedBy: { id: l.receivedBy, name: l.receiver?.name ?? `user ${l.receivedBy}` },
    override: l.overrideBy && l.overrideReason ? { by: { id: l.overrideBy, name: overrideUser?.name ?? `user ${l.overrideBy}` }, reason: l.overrideReason } : null,
    label: l.labelRaw ? { raw: l.labelRaw, elements: l.labelElements ?? [] } : null,
    esd: esdClass ? { hbmClass: esdClass.id, range: describeEsdClass(esdClass) } : null,
    documents: await listDocuments(ds, l.id),
  };
}

function isUniqueViolation(e: unknown, constraint?: string): boolean {
  if (!(e instanceof QueryFailedError)) return false;
  const d = e.driverError as { code?: string; constraint?: string; detail?: string };
  return d.code === '23505' && (!constraint || (d.constraint ?? '').includes(constraint) || (d.detail ?? '').includes(constraint));
}

function duplicateLabel(code: string): AppError {
  return AppError.conflict(`This supplier label was already received as lot ${code}; no second lot was created.`, [
    { field: 'labelText', message: `already received as lot ${code}` },
  ]);
}

/**
 * Receives a lot: a new lot code of the day, the label parsed again on the server (elements and
 * fingerprint kept), the supplier's approval checked. A supplier that is not approved needs an
 * override with a reason from a quality engineer; it is kept on the lot and in the audit trail.
 */
export async function createLot(ds: DataSource, actor: SessionUser, input: CreateLotRequest, now = new Date()): Promise<LotDetail> {
  const label = text(input.labelText) ? await readLabel(ds, input.labelText as string, 'labelText') : null;
  if (label && label.parsed.format === null) {
    throw AppError.unprocessable('labelText is not an ISO/IEC 15434 label; leave it out for a lot typed in by hand.', [
      { field: 'labelText', message: 'not an ISO/IEC 15434 label' },
    ]);
  }

  let bagOpenedAt: Date | null = null;
  if (input.dryBag === 'opened') {
    bagOpenedAt = input.bagOpenedAt ? new Date(input.bagOpenedAt) : now;
    if (bagOpenedAt.getTime() > now.getTime() + CLOCK_SKEW_MS) {
      throw AppError.badRequest('The bag cannot have been opened in the future.', [{ field: 'bagOpenedAt', message: 'bagOpenedAt is in the future' }]);
    }
  } else if (input.bagOpenedAt) {
    throw AppError.badRequest("bagOpenedAt goes only with dryBag 'opened'.", [{ field: 'bagOpenedAt', message: "only with dryBag 'opened'" }]);
  }

  let lotId: number;
  try {
    lotId = await ds.transaction(async (m) => {
      const supplier = await m.findOneBy(Supplier, { id: input.supplierId });
      const partType = await m.findOneBy(PartType, { id: input.partTypeId });
      const missing = [
        ...(supplier ? [] : [{ field: 'supplierId', message: `no supplier with id ${input.supplierId}` }]),
        ...(partType ? [] : [{ field: 'partTypeId', message: `no part type with id ${input.partTypeId}` }]),
        ...(partType && !partType.active ? [{ field: 'partTypeId', message: `part type ${partType.partNumber} is retired` }] : []),
      ];
      if (missing.length || !supplier || !partType) throw AppError.unprocessable(`Check ${missing.map((e) => e.field).join(', ')}.`, missing);

      if (label?.fingerprint) {
        const existing = await m.findOne(Lot, { where: { labelFingerprint: label.fingerprint }, select: { id: true, code: true } });
        if (existing) throw duplicateLabel(existing.code);
      }

      const override = supplier.approval === 'not-approved' ? input.override ?? null : null;
      if (supplier.approval === 'not-approved') {
        if (!override) {
          throw new AppError(
            409,
            'supplier-not-approved',
            `${supplier.name} is not an approved supplier: receiving from it needs a quality engineer's override with a reason.`,
            [{ field: 'supplierId', message: 'supplier is not approved' }],
          );
        }
        if (actor.role !== 'quality') {
          throw AppError.forbidden(`Only a quality engineer can override the approval of ${supplier.name}; you are signed in as ${actor.role}.`);
        }
      }

      const lot = m.create(Lot, {
        code: await nextLotCode(m, now),
        supplierId: supplier.id,
        partTypeId: partType.id,
        quantity: input.quantity,
        purchaseOrder: text(input.purchaseOrder),
        supplierPartNumber: text(input.supplierPartNumber),
        supplierLot: text(input.supplierLot),
        dateCode: text(input.dateCode),
        countryOfOrigin: text(input.countryOfOrigin)?.toUpperCase() ?? null,
        msl: text(input.msl),
        dryBag: input.dryBag,
        bagOpenedAt,
        status: 'received',
        labelRaw: label ? label.parsed.raw.trim() : null,
        labelFingerprint: label?.fingerprint ?? null,
        labelElements: label ? label.parsed.elements : null,
        receivedBy: actor.id,
        receivedAt: now,
        overrideBy: override ? actor.id : null,
        overrideReason: override ? override.reason.trim() : null,
      });
      const saved = await m.save(lot);
      await recordAudit(m, { actor, action: 'lot.create', entityType: 'lot', entityId: saved.id, after: auditView(saved) });
      if (override) {
        await recordAudit(m, {
          actor,
          action: 'lot.supplier-override',
          entityType: 'lot',
          entityId: saved.id,
          after: { supplierId: supplier.id, supplierCode: supplier.code, approval: supplier.approval, lotCode: saved.code },
          note: override.reason.trim().slice(0, 500),
        });
      }
      return saved.id;
    });
  } catch (e) {
    if (label?.fingerprint && isUniqueViolation(e, 'label_fingerprint')) {
      const existing = await ds.getRepository(Lot).findOneBy({ labelFingerprint: label.fingerprint });
      throw duplicateLabel(existing?.code ?? 'an existing lot');
    }
    throw e;
  }
  return getLot(ds, lotId, now);
}

/** Records that the dry bag was opened: the J-STD-033 floor-life clock starts (once). */
export async function openDryBag(ds: DataSource, actor: SessionUser, id: number, openedAtText: string | undefined, now = new Date()): Promise<LotDetail> {
  const openedAt = openedAtText ? new Date(openedAtText) : now;
  if (openedAt.getTime() > now.getTime() + CLOCK_SKEW_MS) {
    throw AppError.badRequest('The bag cannot have been opened in the future.', [{ field: 'openedAt', message: 'openedAt is in the future' }]);
  }
  await ds.transaction(async (m) => {
    const lot = await m.findOne(Lot, { where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!lot) throw AppError.notFound(`Lot ${id}`);
    if (lot.dryBag === 'opened') {
      throw AppError.conflict(
        `The dry bag of lot ${lot.code} was already opened at ${lot.bagOpenedAt?.toISOString() ?? 'an unrecorded time'}; the clock is not restarted.`,
      );
    }
    const before = { dryBag: lot.dryBag, bagOpenedAt: lot.bagOpenedAt?.toISOString() ?? null };
    lot.dryBag = 'opened';
    lot.bagOpenedAt = openedAt;
    await m.save(lot);
    await recordAudit(m, {
      actor,
      action: 'lot.dry-bag-open',
      entityType: 'lot',
      entityId: id,
      before,
      after: { dryBag: lot.dryBag, bagOpenedAt: openedAt.toISOString() },
    });
  });
  return getLot(ds, id, now);
}
