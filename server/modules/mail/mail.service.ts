import nodemailer, { type Transporter } from 'nodemailer';
import type { DataSource, EntityManager } from 'typeorm';
import type { ServerConfig } from '../../config.ts';
import type { OutboxRow } from '../../../shared/api/mail.ts';
import type { Page } from '../../../shared/api/page.ts';
import { AppError } from '../../http/app-error.ts';
import { OutgoingMail, OutgoingMailAttachment } from './outgoing-mail.entity.ts';

export interface MailInput {
  to: string;
  subject: string;
  text: string;
  attachments?: { filename: string; contentType: string; content: Buffer }[];
  related?: { type: string; id: string | number };
  createdBy?: number | null;
}

/** Builds the SMTP transport from configuration: the local sink by default, any relay by settings. */
export function createMailTransport(config: ServerConfig): Transporter {
  const loopback = /^(127\.|localhost$|::1$)/.test(config.smtp.host);
  return nodemailer.createTransport({
    host: config.smtp.host,
    port: config.smtp.port,
    secure: config.smtp.secure,
    // The local sink offers no TLS; a real relay negotiates STARTTLS.
    ignoreTLS: loopback && !config.smtp.secure,
    auth: config.smtp.user ? { user: config.smtp.user, pass: config.smtp.pass ?? '' } : undefined,
    connectionTimeout: 5000,
    greetingTimeout: 5000,
    socketTimeout: 10000,
  });
}

/** Stores a message for delivery, inside the caller's transaction. Returns its id. */
export async function queueMail(manager: EntityManager, input: MailInput): Promise<number> {
  const mail = await manager.save(
    manager.create(OutgoingMail, {
      to: input.to,
      subject: input.subject,
      bodyText: input.text,
      status: 'queued',
      relatedType: input.related?.type ?? null,
      relatedId: input.related ? String(input.related.id) : null,
      createdBy: input.createdBy ?? null,
    }),
  );
  for (const a of input.attachments ?? []) {
    await manager.insert(OutgoingMailAttachment, { mailId: mail.id, filename: a.filename, contentType: a.contentType, content: a.content });
  }
  return mail.id;
}

/** Delay before the next attempt: 30 s doubling per attempt, at most one hour. */
export function retryDelayMs(attempts: number): number {
  return Math.min(30_000 * 2 ** Math.max(0, attempts - 1), 3_600_000);
}

/**
 * Sends every message that is due. Rows are claimed with FOR UPDATE SKIP LOCKED, so two workers
 * never send the same message. A failure is recorded and retried later; nothing is dropped.
 */
export async function deliverDueMail(ds: DataSource, transport: Transporter, from: string, now = new Date()): Promise<{ sent: number; failed: number }> {
  let sent = 0;
  let failed = 0;
  for (;;) {
    const done = await ds.transaction(async (m) => {
      const [mail] = await m
        .createQueryBuilder(OutgoingMail, 'o')
        .where("o.status <> 'sent'")
        .andWhere('o.next_attempt_at <= :now', { now })
        .orderBy('o.id', 'ASC')
        .setLock('pessimistic_write')
        .setOnLocked('skip_locked')
        .limit(1)
        .getMany();
      if (!mail) return true;
      const attachments = await m.findBy(OutgoingMailAttachment, { mailId: mail.id });
      mail.attempts += 1;
      try {
        const info = await transport.sendMail({
          from,
          to: mail.to,
          subject: mail.subject,
          text: mail.bodyText,
          attachments: attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, content: a.content })),
        });
        mail.status = 'sent';
        mail.sentAt = new Date();
        mail.messageId = info.messageId ?? null;
        mail.lastError = null;
        sent++;
      } catch (e) {
        mail.status = 'failed';
        mail.lastError = (e as Error).message.slice(0, 1000);
        mail.nextAttemptAt = new Date(now.getTime() + retryDelayMs(mail.attempts));
        failed++;
      }
      await m.save(mail);
      return false;
    });
    if (done) break;
  }
  return { sent, failed };
}

/** Delivers due mail every `intervalMs` until stopped. */
export function startMailWorker(ds: DataSource, transport: Transporter, from: string, intervalMs = 5000): () => void {
  let running = false;
  const timer = setInterval(() => {
    if (running) return;
    running = true;
    deliverDueMail(ds, transport, from)
      .catch((e) => console.error('[binwright] mail delivery round failed', e))
      .finally(() => (running = false));
  }, intervalMs);
  timer.unref();
  return () => clearInterval(timer);
}

export async function listOutbox(ds: DataSource, q: { page: number; pageSize: number; status?: string }): Promise<Page<OutboxRow>> {
  const qb = ds.getRepository(OutgoingMail).createQueryBuilder('o').orderBy('o.id', 'DESC');
  if (q.status) qb.where('o.status = :s', { s: q.status });
  const [rows, total] = await qb.skip((q.page - 1) * q.pageSize).take(q.pageSize).getManyAndCount();
  const ids = rows.map((r) => r.id);
  const atts: { id: number; mail_id: number; filename: string; content_type: string; size: number }[] = ids.length
    ? await ds.query(`SELECT id, mail_id, filename, content_type, octet_length(content) AS size FROM outgoing_mail_attachment WHERE mail_id = ANY($1) ORDER BY id`, [ids])
    : [];
  return {
    items: rows.map((r) => ({
      id: r.id,
      to: r.to,
      subject: r.subject,
      status: r.status,
      attempts: r.attempts,
      lastError: r.lastError,
      nextAttemptAt: r.nextAttemptAt.toISOString(),
      sentAt: r.sentAt?.toISOString() ?? null,
      createdAt: r.createdAt.toISOString(),
      relatedType: r.relatedType,
      relatedId: r.relatedId,
      attachments: atts.filter((a) => a.mail_id === r.id).map((a) => ({ id: a.id, filename: a.filename, contentType: a.content_type, size: Number(a.size) })),
    })),
    total,
    page: q.page,
    pageSize: q.pageSize,
  };
}

/** Makes a failed message due now; the next delivery round sends it. */
export async function retryMail(ds: DataSource, id: number): Promise<void> {
  const res = await ds.getRepository(OutgoingMail).update({ id, status: 'failed' }, { nextAttemptAt: new Date() });
  if (!res.affected) {
    const exists = await ds.getRepository(OutgoingMail).existsBy({ id });
    if (!exists) throw AppError.notFound(`Message ${id}`);
    throw AppError.conflict('Only a failed message can be retried.');
  }
}

export async function getOutboxAttachment(ds: DataSource, mailId: number, attachmentId: number): Promise<OutgoingMailAttachment> {
  const a = await ds.getRepository(OutgoingMailAttachment).findOneBy({ id: attachmentId, mailId });
  if (!a) throw AppError.notFound('Attachment');
  return a;
}
