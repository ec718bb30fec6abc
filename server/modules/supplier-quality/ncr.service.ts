import { createHash } from 'node:crypto';
import type { Transporter } from 'nodemailer';
import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { Page } from '../../../shared/api/page.ts';
import {
  NCR_ANSWER_ACCEPTED,
  type CreateNcrRequest,
  type NcrDetail,
  type NcrDraft,
  type NcrRow,
  type NcrSort,
  type NcrStatus,
  type UpdateNcrRequest,
} from '../../../shared/api/supplier-quality.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { cleanFileName, type UploadedFile } from '../lots/documents/documents.service.ts';
import { detectMediaType } from '../lots/documents/detect-media-type.ts';
import type { DocumentStore } from '../lots/documents/document-store.ts';
import { deliverDueMail, queueMail } from '../mail/mail.service.ts';
import { dispositionText, findingsText, loadLotFacts } from './ncr-facts.ts';
import { renderNcrPdf } from './ncr-pdf.ts';
import { Ncr } from './ncr.entity.ts';

/** Lot statuses from which an NCR may be raised without a drift alert. */
const NONCONFORMING = ['rejected', 'mrb'];

export interface Mailer {
  transport: Transporter;
  from: string;
}

const today = (now = new Date()) => now.toISOString().slice(0, 10);

/**
 * Issues the next NCR code of the year (UTC) inside the caller's transaction, NCR-2026-0001: the
 * upsert locks the year's counter row until commit, and a rollback gives the number back.
 */
export async function nextNcrCode(m: EntityManager, now = new Date()): Promise<string> {
  const year = now.getUTCFullYear();
  const [{ last }] = (await m.query(
    `INSERT INTO ncr_counter (year, last) VALUES ($1, 1) ON CONFLICT (year) DO UPDATE SET last = ncr_counter.last + 1 RETURNING last`,
    [year],
  )) as { last: number }[];
  return `NCR-${year}-${String(last).padStart(4, '0')}`;
}

/** Where an NCR goes: the supplier's contact with duty 'quality', else the first contact; null when none. */
export async function recipientOf(m: EntityManager | DataSource, supplierId: number): Promise<{ name: string; email: string; duty: string | null } | null> {
  const [c] = (await m.query(
    `SELECT name, email, duty FROM supplier_contact WHERE supplier_id = $1 ORDER BY (lower(trim(duty)) = 'quality') IS TRUE DESC, id LIMIT 1`,
    [supplierId],
  )) as { name: string; email: string; duty: string | null }[];
  return c ?? null;
}

async function openNcrOfLot(m: EntityManager | DataSource, lotId: number): Promise<{ id: number; code: string } | null> {
  const [r] = (await m.query(`SELECT id, code FROM ncr WHERE lot_id = $1 AND status <> 'closed' ORDER BY id LIMIT 1`, [lotId])) as { id: number; code: string }[];
  return r ?? null;
}

function dueIn(days: number, now = new Date()): string {
  const d = new Date(now);
  d.setUTCDate(d.getUTCDate() + days);
  return today(d);
}

/** The create form's starting values: findings from the lot's figures, the signed disposition, a due date 30 days ahead. */
export async function ncrDraft(ds: DataSource, lotId: number, alertId: number | null): Promise<NcrDraft> {
  const facts = await loadLotFacts(ds.manager, lotId, alertId);
  return {
    lotId,
    alertId,
    lotCode: facts.lot.code,
    supplierName: facts.supplier.name,
    partNumber: facts.partType.partNumber,
    findings: findingsText(facts),
    disposition: dispositionText(facts),
    dueDate: dueIn(30),
    existing: await openNcrOfLot(ds, lotId),
  };
}

function assertDueDate(value: string, now = new Date()): void {
  const ok = /^\d{4}-\d{2}-\d{2}$/.test(value) && !Number.isNaN(Date.parse(`${value}T00:00:00Z`)) && new Date(`${value}T00:00:00Z`).toISOString().slice(0, 10) === value;
  if (!ok) throw AppError.badRequest('Check dueDate.', [{ field: 'dueDate', message: 'dueDate must be a calendar date YYYY-MM-DD' }]);
  if (value < today(now)) throw AppError.unprocessable('The due date lies in the past.', [{ field: 'dueDate', message: 'dueDate must be today or later' }]);
}

function auditView(n: Ncr) {
  return { code: n.code, status: n.status, lotId: n.lotId, alertId: n.alertId, disposition: n.disposition, correctiveAction: n.correctiveAction, dueDate: n.dueDate };
}

/**
 * A buyer or quality engineer raises an NCR from a rejected (or MRB) lot, or from a drift alert
 * on any disposed lot. One NCR per lot at a time: a second while the first is not closed is
 * refused (409). Findings and disposition default to the text filled from the lot.
 */
export async function createNcr(ds: DataSource, actor: SessionUser, input: CreateNcrRequest): Promise<NcrDetail> {
  assertDueDate(input.dueDate);
  return ds.transaction(async (m) => {
    await m.query(`SELECT id FROM lot WHERE id = $1 FOR UPDATE`, [input.lotId]);
    const facts = await loadLotFacts(m, input.lotId, input.alertId ?? null).catch((e: unknown) => {
      if (e instanceof AppError && e.status === 404) throw AppError.unprocessable(`There is no lot ${input.lotId}.`, [{ field: 'lotId', message: `no lot ${input.lotId}` }]);
      throw e;
    });
    if (!facts.alert && !NONCONFORMING.includes(facts.lot.status)) {
      throw AppError.conflict(`Lot ${facts.lot.code} is ${facts.lot.status}: raise an NCR from a rejected or MRB lot, or from a drift alert.`, [
        { field: 'lotId', message: 'the lot is neither rejected nor under an alert' },
      ]);
    }
    const existing = await openNcrOfLot(m, input.lotId);
    if (existing) throw AppError.conflict(`Lot ${facts.lot.code} already has ${existing.code}, which is not closed.`, [{ field: 'lotId', message: `already in ${existing.code}` }]);
    const code = await nextNcrCode(m);
    const saved = await m.save(
      m.create(Ncr, {
        code,
        lotId: input.lotId,
        alertId: facts.alert?.id ?? null,
        supplierId: facts.supplier.id,
        partTypeId: facts.partType.id,
        findings: input.findings?.trim() || findingsText(facts),
        disposition: input.disposition?.trim() || dispositionText(facts),
        correctiveAction: input.correctiveAction.trim(),
        dueDate: input.dueDate,
        status: 'open',
        createdBy: actor.id,
      }),
    );
    await recordAudit(m, { actor, action: 'ncr.create', entityType: 'ncr', entityId: saved.id, after: auditView(saved) });
    return getNcr(m, saved.id);
  });
}

async function lockNcr(m: EntityManager, id: number): Promise<Ncr> {
  const n = await m.findOne(Ncr, { where: { id }, lock: { mode: 'pessimistic_write' } });
  if (!n) throw AppError.notFound(`NCR ${id}`);
  return n;
}

/** Edits an NCR that has not been sent yet. */
export async function updateNcr(ds: DataSource, actor: SessionUser, id: number, input: UpdateNcrRequest): Promise<NcrDetail> {
  if (input.dueDate !== undefined) assertDueDate(input.dueDate);
  return ds.transaction(async (m) => {
    const n = await lockNcr(m, id);
    if (n.status !== 'open') throw AppError.conflict(`${n.code} was sent to the supplier and is kept as sent; raise a new NCR instead of changing it.`);
    const before = auditView(n);
    if (input.findings !== undefined) n.findings = input.findings.trim();
    if (input.disposition !== undefined) n.disposition = input.disposition.trim();
    if (input.correctiveAction !== undefined) n.correctiveAction = input.correctiveAction.trim();
    if (input.dueDate !== undefined) n.dueDate = input.dueDate;
    await m.save(n);
    await recordAudit(m, { actor, action: 'ncr.update', entityType: 'ncr', entityId: id, before, after: auditView(n) });
    return getNcr(m, id);
  });
}

const SORT_SQL: Record<NcrSort, string> = { code: 'n.code', createdAt: 'n.created_at', dueDate: 'n.due_date', status: 'n.status', supplierName: 's.name' };

interface NcrQueryRow {
  id: number;
  code: string;
  status: NcrStatus;
  lot_id: number;
  lot_code: string;
  lot_status: string;
  supplier_id: number;
  supplier_code: string;
  supplier_name: string;
  part_type_id: number;
  part_number: string;
  alert_id: number | null;
  due_date: string;
  created_at: Date;
  sent_at: Date | null;
}

const NCR_SELECT = `
  SELECT n.id, n.code, n.status, n.lot_id, l.code AS lot_code, l.status AS lot_status, n.supplier_id, s.code AS supplier_code, s.name AS supplier_name,
         n.part_type_id, pt.part_number, n.alert_id, to_char(n.due_date, 'YYYY-MM-DD') AS due_date, n.created_at, n.sent_at
    FROM ncr n JOIN lot l ON l.id = n.lot_id JOIN supplier s ON s.id = n.supplier_id JOIN part_type pt ON pt.id = n.part_type_id`;

function toRow(r: NcrQueryRow, now = new Date()): NcrRow {
  return {
    id: r.id,
    code: r.code,
    status: r.status,
    lot: { id: r.lot_id, code: r.lot_code, status: r.lot_status },
    supplier: { id: r.supplier_id, code: r.supplier_code, name: r.supplier_name },
    partType: { id: r.part_type_id, partNumber: r.part_number },
    alertId: r.alert_id,
    dueDate: r.due_date,
    overdue: r.status !== 'closed' && r.status !== 'answered' && r.due_date < today(now),
    createdAt: new Date(r.created_at).toISOString(),
    sentAt: r.sent_at ? new Date(r.sent_at).toISOString() : null,
  };
}

export interface NcrQuery {
  page: number;
  pageSize: number;
  status?: NcrStatus;
  supplierId?: number;
  lotId?: number;
  sort?: NcrSort;
  dir?: 'asc' | 'desc';
}

export async function listNcrs(ds: DataSource, q: NcrQuery): Promise<Page<NcrRow>> {
  const where: string[] = [];
  const params: unknown[] = [];
  const add = (sql: string, v: unknown) => {
    params.push(v);
    where.push(sql.replace('?', `$${params.length}`));
  };
  if (q.status) add('n.status = ?', q.status);
  if (q.supplierId) add('n.supplier_id = ?', q.supplierId);
  if (q.lotId) add('n.lot_id = ?', q.lotId);
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [{ total }] = (await ds.query(`SELECT count(*)::int AS total FROM ncr n JOIN supplier s ON s.id = n.supplier_id ${whereSql}`, params)) as { total: number }[];
  const rows = (await ds.query(
    `${NCR_SELECT} ${whereSql} ORDER BY ${SORT_SQL[q.sort ?? 'createdAt']} ${q.dir === 'asc' ? 'ASC' : 'DESC'}, n.id DESC LIMIT $${params.length + 1} OFFSET $${params.length + 2}`,
    [...params, q.pageSize, (q.page - 1) * q.pageSize],
  )) as NcrQueryRow[];
  return { items: rows.map((r) => toRow(r)), total, page: q.page, pageSize: q.pageSize };
}

export async function getNcr(m: DataSource | EntityManager, id: number): Promise<NcrDetail> {
  const [row] = (await m.query(`${NCR_SELECT} WHERE n.id = $1`, [id])) as NcrQueryRow[];
  if (!row) throw AppError.notFound(`NCR ${id}`);
  const n = (await m.getRepository(Ncr).findOneByOrFail({ id })) as Ncr;
  const names = (await m.query(`SELECT id, name FROM app_user WHERE id = ANY($1)`, [[n.createdBy, n.answeredBy, n.closedBy].filter((x) => x !== null)])) as { id: number; name: string }[];
  const who = (uid: number | null) => names.find((u) => u.id === uid)?.name ?? '';
  const [mail] = n.mailId
    ? ((await m.query(`SELECT id, status, attempts, last_error, sent_at FROM outgoing_mail WHERE id = $1`, [n.mailId])) as {
        id: number;
        status: 'queued' | 'sent' | 'failed';
        attempts: number;
        last_error: string | null;
        sent_at: Date | null;
      }[])
    : [];
  return {
    ...toRow(row),
    findings: n.findings,
    disposition: n.disposition,
    correctiveAction: n.correctiveAction,
    createdBy: who(n.createdBy),
    sentTo: n.sentTo,
    mail: mail ? { id: mail.id, status: mail.status, attempts: mail.attempts, lastError: mail.last_error, sentAt: mail.sent_at ? new Date(mail.sent_at).toISOString() : null } : null,
    recipient: await recipientOf(m, n.supplierId),
    answer:
      n.answerText && n.answerDocKey && n.answeredAt
        ? {
            text: n.answerText,
            document: { name: n.answerDocName ?? 'answer', mediaType: n.answerDocMediaType ?? 'application/octet-stream', size: n.answerDocSize ?? 0, url: `/api/ncrs/${id}/answer-document` },
            by: who(n.answeredBy),
            at: n.answeredAt.toISOString(),
          }
        : null,
    closed: n.closedAt ? { by: who(n.closedBy), at: n.closedAt.toISOString(), note: n.closeNote } : null,
    pdfUrl: `/api/ncrs/${id}/report.pdf`,
  };
}

async function pdfOf(m: DataSource | EntityManager, n: Ncr): Promise<Buffer> {
  const facts = await loadLotFacts(m, n.lotId, n.alertId);
  const detail = await getNcr(m, n.id);
  return renderNcrPdf({
    code: n.code,
    status: n.status,
    createdAt: n.createdAt,
    createdBy: detail.createdBy,
    dueDate: n.dueDate,
    findings: n.findings,
    disposition: n.disposition,
    correctiveAction: n.correctiveAction,
    recipient: detail.recipient,
    answer: detail.answer ? { text: detail.answer.text, by: detail.answer.by, at: new Date(detail.answer.at), documentName: detail.answer.document.name } : null,
    facts,
    generatedAt: new Date(),
  });
}

export async function ncrPdf(ds: DataSource, id: number): Promise<{ code: string; pdf: Buffer }> {
  const n = await ds.getRepository(Ncr).findOneBy({ id });
  if (!n) throw AppError.notFound(`NCR ${id}`);
  return { code: n.code, pdf: await pdfOf(ds.manager, n) };
}

function mailText(n: Ncr, lotCode: string, partNumber: string, recipientName: string): string {
  return [
    `Dear ${recipientName},`,
    '',
    `Please find attached our nonconformance report ${n.code} on lot ${lotCode} (${partNumber}).`,
    '',
    `Disposition: ${n.disposition}`,
    '',
    `Corrective action requested: ${n.correctiveAction}`,
    `Please answer by ${n.dueDate} with your root cause and corrective action, quoting ${n.code}.`,
    '',
    'Kind regards,',
    'Incoming quality',
  ].join('\n');
}

/**
 * "Send": renders the PDF, queues the e-mail to the supplier's quality contact with the PDF
 * attached and marks the NCR sent — the message and the status change in one transaction, so a
 * sent NCR always has its message in the outbox. Delivery follows right after the commit; a
 * failed delivery stays in the outbox and is retried (mail.service), the NCR stays sent.
 * 409 when the supplier has no contact, or the NCR is answered or closed.
 */
export async function sendNcr(ds: DataSource, actor: SessionUser, id: number, mailer: Mailer): Promise<NcrDetail> {
  await ds.transaction(async (m) => {
    const n = await lockNcr(m, id);
    if (n.status !== 'open' && n.status !== 'sent') throw AppError.conflict(`${n.code} is ${n.status}; it is not sent again.`);
    const to = await recipientOf(m, n.supplierId);
    if (!to) {
      throw AppError.conflict('The supplier has no contact to send the report to: add one (duty "quality") under Catalog → Suppliers.', [
        { field: 'recipient', message: 'the supplier has no contact' },
      ]);
    }
    const [{ code: lotCode, part_number: partNumber }] = (await m.query(
      `SELECT l.code, pt.part_number FROM lot l JOIN part_type pt ON pt.id = l.part_type_id WHERE l.id = $1`,
      [n.lotId],
    )) as { code: string; part_number: string }[];
    const before = auditView(n);
    n.status = 'sent';
    n.sentAt = new Date();
    n.sentTo = to.email;
    await m.save(n);
    const pdf = await pdfOf(m, n);
    n.mailId = await queueMail(m, {
      to: `${to.name} <${to.email}>`,
      subject: `${n.code}: nonconformance report, lot ${lotCode} (${partNumber})`,
      text: mailText(n, lotCode, partNumber, to.name),
      attachments: [{ filename: `${n.code}.pdf`, contentType: 'application/pdf', content: pdf }],
      related: { type: 'ncr', id: n.id },
      createdBy: actor.id,
    });
    await m.save(n);
    await recordAudit(m, { actor, action: 'ncr.send', entityType: 'ncr', entityId: id, before, after: { ...auditView(n), sentTo: to.email, mailId: n.mailId } });
  });
  try {
    await deliverDueMail(ds, mailer.transport, mailer.from);
  } catch (e) {
    // The message is stored; the mail worker or a retry from the outbox sends it later.
    console.error('[binwright] NCR mail delivery round failed', e);
  }
  return getNcr(ds, id);
}

/**
 * Records the supplier's answer: text and a document (PDF, PNG or JPEG, type read from the
 * content). Stored once; an answer is never replaced. The file is written first, published under
 * its key inside the transaction that stores the row and its audit entry.
 */
export async function recordAnswer(ds: DataSource, store: DocumentStore, actor: SessionUser, id: number, textValue: unknown, file: UploadedFile | undefined): Promise<NcrDetail> {
  const errors = [];
  const text = typeof textValue === 'string' ? textValue.trim() : '';
  if (text.length < 3 || text.length > 4000) errors.push({ field: 'text', message: 'text must hold the supplier answer, 3 to 4 000 characters' });
  if (!file || file.buffer.length === 0) errors.push({ field: 'file', message: 'attach the supplier answer document in the form field "file"' });
  if (errors.length || !file) throw AppError.badRequest(`Check ${errors.map((e) => e.field).join(', ')}.`, errors);
  const detected = detectMediaType(file.buffer);
  if (!detected.ok || detected.mediaType === 'text/csv') {
    const what = detected.ok ? 'a CSV table' : detected.what;
    throw new AppError(415, 'unsupported-media-type', `The content of "${cleanFileName(file.originalname)}" is ${what}. Only ${NCR_ANSWER_ACCEPTED} files are accepted; the type is read from the content, not the name.`, [
      { field: 'file', message: `content is ${what}` },
    ]);
  }
  const sha256 = createHash('sha256').update(file.buffer).digest('hex');
  const name = cleanFileName(file.originalname);
  const tmp = await store.writeTemp(file.buffer);
  let published: string | null = null;
  try {
    await ds.transaction(async (m) => {
      const n = await lockNcr(m, id);
      if (n.status === 'answered' || n.status === 'closed') throw AppError.conflict(`${n.code} already has the supplier's answer; it is kept as recorded.`);
      const before = auditView(n);
      const key = `${n.id}/${sha256.slice(0, 16)}`;
      Object.assign(n, {
        status: 'answered',
        answerText: text,
        answerDocName: name,
        answerDocMediaType: detected.mediaType,
        answerDocSize: file.buffer.length,
        answerDocSha256: sha256,
        answerDocKey: key,
        answeredAt: new Date(),
        answeredBy: actor.id,
      });
      await m.save(n);
      await recordAudit(m, {
        actor,
        action: 'ncr.answer',
        entityType: 'ncr',
        entityId: id,
        before,
        after: { ...auditView(n), answerDocument: { name, mediaType: detected.mediaType, size: file.buffer.length, sha256 } },
        note: text.slice(0, 500),
      });
      published = await store.publish(tmp, key);
    });
  } catch (e) {
    if (published) await store.remove(published);
    if ((e as NodeJS.ErrnoException).code === 'EEXIST') {
      throw new AppError(500, 'document-store-conflict', 'A stored file already has this answer document\'s name: the answers folder does not match the database. Nothing was stored; tell your administrator.');
    }
    throw e;
  } finally {
    await store.remove(tmp);
  }
  return getNcr(ds, id);
}

export async function answerDocument(ds: DataSource, id: number): Promise<{ key: string; name: string; mediaType: string }> {
  const n = await ds.getRepository(Ncr).findOneBy({ id });
  if (!n) throw AppError.notFound(`NCR ${id}`);
  if (!n.answerDocKey) throw AppError.notFound(`The answer document of ${n.code}`);
  return { key: n.answerDocKey, name: n.answerDocName ?? 'answer', mediaType: n.answerDocMediaType ?? 'application/octet-stream' };
}

/** Closes an NCR; needs the supplier's answer (text and document) recorded first, else 409. */
export async function closeNcr(ds: DataSource, actor: SessionUser, id: number, note: string | null): Promise<NcrDetail> {
  return ds.transaction(async (m) => {
    const n = await lockNcr(m, id);
    if (n.status === 'closed') throw AppError.conflict(`${n.code} is already closed.`);
    if (n.status !== 'answered' || !n.answerText || !n.answerDocKey) {
      throw AppError.conflict(`${n.code} cannot be closed yet: record the supplier's answer (text and document) first.`, [{ field: 'answer', message: 'no supplier answer recorded' }]);
    }
    const before = auditView(n);
    n.status = 'closed';
    n.closedAt = new Date();
    n.closedBy = actor.id;
    n.closeNote = note?.trim() || null;
    await m.save(n);
    await recordAudit(m, { actor, action: 'ncr.close', entityType: 'ncr', entityId: id, before, after: auditView(n), note: n.closeNote });
    return getNcr(m, id);
  });
}
