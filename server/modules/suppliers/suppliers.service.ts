import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import {
  APPROVAL_LABELS,
  type ApprovalStatus,
  type ContactInput,
  type ContactRow,
  type ContactUpdate,
  type MslChoice,
  type PartLookupRow,
  type SupplierDetail,
  type SupplierInput,
  type SupplierPartInput,
  type SupplierPartRow,
  type SupplierRow,
  type SupplierSort,
  type SupplierUpdate,
} from '../../../shared/api/catalog.ts';
import type { Page } from '../../../shared/api/users.ts';
import { AppError } from '../../http/app-error.ts';
import { isUniqueViolation, likePattern } from '../../http/route-params.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { PartType } from '../catalog/part-type.entity.ts';
import { Supplier, SupplierContact, SupplierPart } from './supplier.entity.ts';

const normaliseCode = (code: string) => code.trim().toUpperCase();
const normaliseEmail = (email: string) => email.trim().toLowerCase();

function auditView(s: Supplier) {
  return { code: s.code, name: s.name, approval: s.approval, notes: s.notes };
}

function contactRow(c: SupplierContact): ContactRow {
  return { id: c.id, name: c.name, email: c.email, phone: c.phone, duty: c.duty };
}

function toRow(s: Supplier, counts: { contacts: number; parts: number }): SupplierRow {
  return {
    id: s.id,
    code: s.code,
    name: s.name,
    approval: s.approval,
    notes: s.notes,
    contactCount: counts.contacts,
    partCount: counts.parts,
    createdAt: s.createdAt.toISOString(),
    updatedAt: s.updatedAt.toISOString(),
  };
}

async function countsFor(m: EntityManager, ids: number[]): Promise<Map<number, { contacts: number; parts: number }>> {
  const out = new Map(ids.map((id) => [id, { contacts: 0, parts: 0 }]));
  if (ids.length === 0) return out;
  const rows: { id: number; contacts: number; parts: number }[] = await m.query(
    `SELECT s.id,
            (SELECT count(*)::int FROM supplier_contact c WHERE c.supplier_id = s.id) AS contacts,
            (SELECT count(*)::int FROM supplier_part p WHERE p.supplier_id = s.id) AS parts
       FROM supplier s WHERE s.id = ANY($1)`,
    [ids],
  );
  for (const r of rows) out.set(r.id, { contacts: r.contacts, parts: r.parts });
  return out;
}

const SORT_COLUMNS: Record<SupplierSort, string> = { code: 's.code', name: 's.name', approval: 's.approval', updatedAt: 's.updatedAt' };

export interface SupplierListOptions {
  page: number;
  pageSize: number;
  search?: string;
  approval?: ApprovalStatus;
  sort?: SupplierSort;
  dir?: 'asc' | 'desc';
}

export async function listSuppliers(ds: DataSource, q: SupplierListOptions): Promise<Page<SupplierRow>> {
  const qb = ds.getRepository(Supplier).createQueryBuilder('s');
  if (q.search) qb.andWhere('(s.name ILIKE :s OR s.code ILIKE :s)', { s: likePattern(q.search) });
  if (q.approval) qb.andWhere('s.approval = :approval', { approval: q.approval });
  qb.orderBy(SORT_COLUMNS[q.sort ?? 'name'], (q.dir ?? 'asc').toUpperCase() as 'ASC' | 'DESC').addOrderBy('s.id', 'ASC');
  const [rows, total] = await qb.skip((q.page - 1) * q.pageSize).take(q.pageSize).getManyAndCount();
  const counts = await countsFor(ds.manager, rows.map((r) => r.id));
  return { items: rows.map((r) => toRow(r, counts.get(r.id)!)), total, page: q.page, pageSize: q.pageSize };
}

async function requireSupplier(m: EntityManager, id: number, lock = false): Promise<Supplier> {
  const s = await m.findOne(Supplier, { where: { id }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
  if (!s) throw AppError.notFound(`Supplier ${id}`);
  return s;
}

async function detail(m: EntityManager, s: Supplier): Promise<SupplierDetail> {
  const contacts = await m.find(SupplierContact, { where: { supplierId: s.id }, order: { name: 'ASC', id: 'ASC' } });
  const parts: {
    id: number;
    supplier_part_number: string;
    part_type_id: number;
    part_number: string;
    description: string;
    polarity: SupplierPartRow['polarity'];
    lot_count: number;
  }[] = await m.query(
    `SELECT sp.id, sp.supplier_part_number, sp.part_type_id, pt.part_number, pt.description, pt.polarity,
            (SELECT count(*)::int FROM lot l
              WHERE l.supplier_id = sp.supplier_id AND lower(l.supplier_part_number) = lower(sp.supplier_part_number)) AS lot_count
       FROM supplier_part sp JOIN part_type pt ON pt.id = sp.part_type_id
      WHERE sp.supplier_id = $1
      ORDER BY sp.supplier_part_number, sp.id`,
    [s.id],
  );
  return {
    ...toRow(s, { contacts: contacts.length, parts: parts.length }),
    contacts: contacts.map(contactRow),
    parts: parts.map((p) => ({
      id: p.id,
      supplierPartNumber: p.supplier_part_number,
      partTypeId: p.part_type_id,
      partNumber: p.part_number,
      partDescription: p.description,
      polarity: p.polarity,
      lotCount: p.lot_count,
    })),
  };
}

export async function getSupplier(ds: DataSource, id: number): Promise<SupplierDetail> {
  return detail(ds.manager, await requireSupplier(ds.manager, id));
}

function duplicateCode(code: string): AppError {
  return AppError.conflict(`Supplier code ${code} is already in use.`, [{ field: 'code', message: `code ${code} is already in use` }]);
}

async function assertCodeFree(m: EntityManager, code: string, exceptId?: number): Promise<void> {
  const qb = m.getRepository(Supplier).createQueryBuilder('s').where('upper(s.code) = :code', { code });
  if (exceptId !== undefined) qb.andWhere('s.id <> :id', { id: exceptId });
  if (await qb.getExists()) throw duplicateCode(code);
}

async function mapUnique<T>(work: () => Promise<T>, onDuplicate: () => AppError): Promise<T> {
  try {
    return await work();
  } catch (e) {
    if (isUniqueViolation(e)) throw onDuplicate();
    throw e;
  }
}

export async function createSupplier(ds: DataSource, actor: SessionUser, input: SupplierInput): Promise<SupplierDetail> {
  const code = normaliseCode(input.code);
  return mapUnique(
    () =>
      ds.transaction(async (m) => {
        await assertCodeFree(m, code);
        const saved = await m.save(m.create(Supplier, { code, name: input.name, approval: input.approval ?? 'approved', notes: input.notes ?? null }));
        await recordAudit(m, { actor, action: 'supplier.create', entityType: 'supplier', entityId: saved.id, after: auditView(saved) });
        return detail(m, saved);
      }),
    () => duplicateCode(code),
  );
}

/**
 * Changes a supplier. An approval change is recorded as its own audit entry
 * (`supplier.approval-change`) carrying the reason, so it stands out in the trail.
 */
export async function updateSupplier(ds: DataSource, actor: SessionUser, id: number, input: SupplierUpdate): Promise<SupplierDetail> {
  const code = input.code === undefined ? undefined : normaliseCode(input.code);
  return mapUnique(
    () =>
      ds.transaction(async (m) => {
        const s = await requireSupplier(m, id, true);
        const before = auditView(s);
        if (code !== undefined && code !== s.code) await assertCodeFree(m, code, id);
        if (code !== undefined) s.code = code;
        if (input.name !== undefined) s.name = input.name;
        if (input.notes !== undefined) s.notes = input.notes;
        const approvalChanged = input.approval !== undefined && input.approval !== s.approval;
        if (input.approval !== undefined) s.approval = input.approval;
        const after = auditView(s);
        const changed = (Object.keys(before) as (keyof typeof before)[]).filter((k) => k !== 'approval' && before[k] !== after[k]);
        if (!approvalChanged && changed.length === 0) return detail(m, s);
        const saved = await m.save(s);
        if (approvalChanged) {
          await recordAudit(m, {
            actor,
            action: 'supplier.approval-change',
            entityType: 'supplier',
            entityId: id,
            before: { approval: before.approval },
            after: { approval: after.approval },
            note: `${APPROVAL_LABELS[before.approval]} → ${APPROVAL_LABELS[after.approval]}${input.approvalReason ? `: ${input.approvalReason}` : ''}`,
          });
        }
        if (changed.length) {
          await recordAudit(m, {
            actor,
            action: 'supplier.update',
            entityType: 'supplier',
            entityId: id,
            before: Object.fromEntries(changed.map((k) => [k, before[k]])),
            after: Object.fromEntries(changed.map((k) => [k, after[k]])),
          });
        }
        return detail(m, saved);
      }),
    () => duplicateCode(code ?? ''),
  );
}

// --- contacts ----------------------------------------------------------------------------------

function duplicateEmail(email: string): AppError {
  return AppError.conflict(`This supplier already has a contact with the e-mail ${email}.`, [
    { field: 'email', message: `${email} is already a contact of this supplier` },
  ]);
}

async function assertEmailFree(m: EntityManager, supplierId: number, email: string, exceptId?: number): Promise<void> {
  const qb = m
    .getRepository(SupplierContact)
    .createQueryBuilder('c')
    .where('c.supplierId = :supplierId AND lower(c.email) = :email', { supplierId, email });
  if (exceptId !== undefined) qb.andWhere('c.id <> :id', { id: exceptId });
  if (await qb.getExists()) throw duplicateEmail(email);
}

export async function addContact(ds: DataSource, actor: SessionUser, supplierId: number, input: ContactInput): Promise<ContactRow> {
  const email = normaliseEmail(input.email);
  return ds.transaction(async (m) => {
    await requireSupplier(m, supplierId, true);
    await assertEmailFree(m, supplierId, email);
    const saved = await m.save(m.create(SupplierContact, { supplierId, name: input.name, email, phone: input.phone ?? null, duty: input.duty ?? null }));
    await recordAudit(m, { actor, action: 'supplier.contact-add', entityType: 'supplier', entityId: supplierId, after: { contactId: saved.id, ...contactRow(saved) } });
    return contactRow(saved);
  });
}

async function requireContact(m: EntityManager, supplierId: number, contactId: number): Promise<SupplierContact> {
  const c = await m.findOneBy(SupplierContact, { id: contactId, supplierId });
  if (!c) throw AppError.notFound(`Contact ${contactId} of supplier ${supplierId}`);
  return c;
}

export async function updateContact(
  ds: DataSource,
  actor: SessionUser,
  supplierId: number,
  contactId: number,
  input: ContactUpdate,
): Promise<ContactRow> {
  return ds.transaction(async (m) => {
    await requireSupplier(m, supplierId, true);
    const c = await requireContact(m, supplierId, contactId);
    const before = contactRow(c);
    if (input.email !== undefined) {
      const email = normaliseEmail(input.email);
      if (email !== c.email) await assertEmailFree(m, supplierId, email, contactId);
      c.email = email;
    }
    if (input.name !== undefined) c.name = input.name;
    if (input.phone !== undefined) c.phone = input.phone;
    if (input.duty !== undefined) c.duty = input.duty;
    const saved = await m.save(c);
    const after = contactRow(saved);
    const changed = (Object.keys(after) as (keyof ContactRow)[]).filter((k) => before[k] !== after[k]);
    if (changed.length) {
      await recordAudit(m, {
        actor,
        action: 'supplier.contact-update',
        entityType: 'supplier',
        entityId: supplierId,
        before: { contactId, ...Object.fromEntries(changed.map((k) => [k, before[k]])) },
        after: { contactId, ...Object.fromEntries(changed.map((k) => [k, after[k]])) },
      });
    }
    return after;
  });
}

export async function deleteContact(ds: DataSource, actor: SessionUser, supplierId: number, contactId: number): Promise<void> {
  await ds.transaction(async (m) => {
    await requireSupplier(m, supplierId, true);
    const c = await requireContact(m, supplierId, contactId);
    await m.delete(SupplierContact, { id: contactId });
    await recordAudit(m, { actor, action: 'supplier.contact-remove', entityType: 'supplier', entityId: supplierId, before: { contactId, ...contactRow(c) } });
  });
}

// --- part-number mappings ------------------------------------------------------------------------

function duplicateMapping(spn: string): AppError {
  return AppError.conflict(`This supplier already maps part number ${spn}.`, [
    { field: 'supplierPartNumber', message: `${spn} is already mapped for this supplier` },
  ]);
}

export async function addPartMapping(ds: DataSource, actor: SessionUser, supplierId: number, input: SupplierPartInput): Promise<SupplierPartRow> {
  const spn = input.supplierPartNumber;
  return mapUnique(
    () =>
      ds.transaction(async (m) => {
        await requireSupplier(m, supplierId, true);
        const part = await m.findOneBy(PartType, { id: input.partTypeId });
        if (!part) {
          throw AppError.unprocessable(`There is no part type ${input.partTypeId}.`, [{ field: 'partTypeId', message: `no part type with id ${input.partTypeId}` }]);
        }
        const exists = await m
          .getRepository(SupplierPart)
          .createQueryBuilder('sp')
          .where('sp.supplierId = :supplierId AND lower(sp.supplierPartNumber) = lower(:spn)', { supplierId, spn })
          .getExists();
        if (exists) throw duplicateMapping(spn);
        const saved = await m.save(m.create(SupplierPart, { supplierId, supplierPartNumber: spn, partTypeId: part.id }));
        await recordAudit(m, {
          actor,
          action: 'supplier.part-map',
          entityType: 'supplier',
          entityId: supplierId,
          after: { mappingId: saved.id, supplierPartNumber: spn, partTypeId: part.id, partNumber: part.partNumber },
        });
        return {
          id: saved.id,
          supplierPartNumber: spn,
          partTypeId: part.id,
          partNumber: part.partNumber,
          partDescription: part.description,
          polarity: part.polarity,
          lotCount: 0,
        };
      }),
    () => duplicateMapping(spn),
  );
}

/**
 * Removes a part-number mapping. Allowed even when lots were received under it: each lot keeps
 * its own supplier part number and part type, so nothing already received changes; a wrong
 * mapping must be removable before it fills more receiving forms. The audit entry notes how
 * many lots were received under the mapping.
 */
export async function deletePartMapping(ds: DataSource, actor: SessionUser, supplierId: number, mappingId: number): Promise<void> {
  await ds.transaction(async (m) => {
    await requireSupplier(m, supplierId, true);
    const mapping = await m.findOne(SupplierPart, { where: { id: mappingId, supplierId }, relations: { partType: true } });
    if (!mapping) throw AppError.notFound(`Part mapping ${mappingId} of supplier ${supplierId}`);
    const [{ n }] = (await m.query(
      `SELECT count(*)::int AS n FROM lot WHERE supplier_id = $1 AND lower(supplier_part_number) = lower($2)`,
      [supplierId, mapping.supplierPartNumber],
    )) as { n: number }[];
    await m.delete(SupplierPart, { id: mappingId });
    await recordAudit(m, {
      actor,
      action: 'supplier.part-unmap',
      entityType: 'supplier',
      entityId: supplierId,
      before: { mappingId, supplierPartNumber: mapping.supplierPartNumber, partTypeId: mapping.partTypeId, partNumber: mapping.partType?.partNumber },
      note: n > 0 ? `${n} lot${n === 1 ? ' was' : 's were'} received under this mapping; they keep their part type` : null,
    });
  });
}

/**
 * Every mapping of a supplier part number (any supplier), with the supplier and our part type.
 * The match ignores case and surrounding space; the Dock uses it to fill the receiving form.
 */
export async function lookupSupplierPart(ds: DataSource, supplierPartNumber: string): Promise<PartLookupRow[]> {
  const rows = await ds
    .getRepository(SupplierPart)
    .createQueryBuilder('sp')
    .innerJoinAndSelect('sp.supplier', 's')
    .innerJoinAndSelect('sp.partType', 'pt')
    .where('lower(sp.supplierPartNumber) = lower(:spn)', { spn: supplierPartNumber.trim() })
    .orderBy(`CASE s.approval WHEN 'approved' THEN 0 WHEN 'conditional' THEN 1 ELSE 2 END`, 'ASC')
    .addOrderBy('s.name', 'ASC')
    .getMany();
  return rows.map((r) => ({
    mappingId: r.id,
    supplierPartNumber: r.supplierPartNumber,
    supplier: { id: r.supplier!.id, code: r.supplier!.code, name: r.supplier!.name, approval: r.supplier!.approval },
    partType: {
      id: r.partType!.id,
      partNumber: r.partType!.partNumber,
      description: r.partType!.description,
      polarity: r.partType!.polarity,
      packageName: r.partType!.packageName,
      msl: r.partType!.msl as MslChoice,
      esdHbmClass: r.partType!.esdHbmClass,
      active: r.partType!.active,
    },
  }));
}
