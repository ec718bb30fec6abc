import { QueryFailedError, type DataSource, type EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { CreateLotRequest, DryBagState, LotDetail, LotDocumentRow, LotRow, LotSort, LotStatus, ReceivingOptions } from '../../../shared/api/lots.ts';
import type { Page } from '../../../shared/api/users.ts';
import { ESD_HBM_CLASSES, describeEsdClass } from '../../../shared/domain/esd/index.ts';
import { AppError } from '../../http/app-error.ts';
import { preparedQuery } from '../../prepared-query.ts';
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

const SORT_SQL: Record<LotSort, string> = {
  code: 'l.code',
  receivedAt: 'l.received_at',
  quantity: 'l.quantity',
  status: 'l.status',
  supplier: 's.name',
  partNumber: 'p.part_number',
};

interface LotListRow {
  id: number;
  code: string;
  status: LotStatus;
  quantity: number;
  purchase_order: string | null;
  supplier_lot: string | null;
  date_code: string | null;
  msl: string | null;
  dry_bag: DryBagState;
  bag_opened_at: Date | null;
  received_at: Date;
  supplier_id: number;
  supplier_code: string;
  supplier_name: string;
  part_type_id: number;
  part_number: string;
  part_msl: string | null;
}

/**
 * A page of lots, filtered and sorted on the server, and the total: one named prepared statement
 * per combination of filters and sort (parsed and planned once per connection), reading only the
 * list's columns. The total comes with the page (an InitPlan, same snapshot); only a page past
 * the end, which has no row to carry it, counts separately. The count needs no joins: every lot
 * has its supplier and part type (NOT NULL foreign keys).
 */
export async function listLots(ds: DataSource, q: LotQuery, now = new Date()): Promise<Page<LotRow>> {
  const where: string[] = [];
  const values: unknown[] = [];
  const add = (sql: string, v: unknown) => {
    values.push(v);
    where.push(sql.replaceAll('?', `$${values.length}`));
  };
  if (q.status) add('l.status = ?', q.status);
  if (q.supplierId) add('l.supplier_id = ?', q.supplierId);
  if (q.partTypeId) add('l.part_type_id = ?', q.partTypeId);
  if (q.receivedFrom) add('l.received_at >= ?', q.receivedFrom);
  if (q.receivedBefore) add('l.received_at < ?', q.receivedBefore);
  if (q.search) add('(l.code ILIKE ? OR l.purchase_order ILIKE ? OR l.supplier_lot ILIKE ?)', `%${q.search.replace(/[%_\\]/g, '\\$&')}%`);
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const countSql = `SELECT count(*)::int AS total FROM lot l ${whereSql}`;
  const dir = q.dir === 'desc' ? 'DESC' : 'ASC';
  const n = values.length;
  const rows = await preparedQuery<LotListRow & { total: number }>(
    ds,
    `SELECT l.id, l.code, l.status, l.quantity, l.purchase_order, l.supplier_lot, l.date_code, l.msl, l.dry_bag, l.bag_opened_at, l.received_at,
            s.id AS supplier_id, s.code AS supplier_code, s.name AS supplier_name, p.id AS part_type_id, p.part_number, p.msl AS part_msl,
            (${countSql}) AS total
       FROM lot l
       JOIN supplier s ON s.id = l.supplier_id
       JOIN part_type p ON p.id = l.part_type_id
       ${whereSql}
      ORDER BY ${SORT_SQL[q.sort]} ${dir}, l.id ${dir}
      LIMIT $${n + 1} OFFSET $${n + 2}`,
    [...values, q.pageSize, (q.page - 1) * q.pageSize],
  );
  const total = rows.length ? rows[0].total : (await preparedQuery<{ total: number }>(ds, countSql, values))[0].total;
  const items = rows.map(
    (r): LotRow => ({
      id: r.id,
      code: r.code,
      status: r.status,
      supplier: { id: r.supplier_id, code: r.supplier_code, name: r.supplier_name },
      partType: { id: r.part_type_id, partNumber: r.part_number },
      quantity: r.quantity,
      purchaseOrder: r.purchase_order,
      supplierLot: r.supplier_lot,
      dateCode: r.date_code,
      msl: r.msl,
      dryBag: r.dry_bag,
      receivedAt: r.received_at.toISOString(),
      floorLife: lotFloorLife({ msl: r.msl, dryBag: r.dry_bag, bagOpenedAt: r.bag_opened_at }, r.part_msl, now),
    }),
  );
  return { items, total, page: q.page, pageSize: q.pageSize };
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
