import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { readConfig, type ServerConfig } from '../../server/config.ts';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { createMailTransport, deliverDueMail, retryDelayMs } from '../../server/modules/mail/mail.service.ts';
import { OutgoingMail, OutgoingMailAttachment } from '../../server/modules/mail/outgoing-mail.entity.ts';
import { startSmtpSink, type SmtpSink } from '../../server/modules/mail/smtp-sink.ts';
import { onLotDisposed } from '../../server/modules/supplier-quality/drift.service.ts';
import { portIsFree } from '../../scripts/lib/pg-cluster.ts';
import { normalSample } from '../shared/statistics/seeded-random.ts';
import { agentFor, makeUser, useTestApp, type Agent } from './helpers.ts';
import { DAY, makeSupplierWorld } from './suppliers-fixtures.ts';

const ctx = useTestApp();
let sink: SmtpSink;
let config: ServerConfig;
let app: Express;
const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'bw-ncr-sink-'));
const FAKE_PDF = Buffer.from('%PDF-1.4\n% supplier answer\n%%EOF\n');
const dueDate = new Date(Date.now() + 30 * DAY).toISOString().slice(0, 10);

async function freePort(): Promise<number> {
  for (let p = 47000 + Math.floor(Math.random() * 1000); ; p++) if (await portIsFree(p)) return p;
}

beforeAll(async () => {
  const port = await freePort();
  config = readConfig({ ...process.env, BINWRIGHT_SMTP_PORT: String(port) });
  config.smtp.sinkFolder = folder;
  sink = await startSmtpSink({ port, folder });
  app = createApp({ dataSource: ctx.ds, config, mailTransport: createMailTransport(config) });
});
afterAll(async () => {
  await sink?.close();
  fs.rmSync(folder, { recursive: true, force: true });
});

async function buyer(): Promise<Agent> {
  return agentFor(app, await makeUser(ctx.ds, 'buyer'));
}

const post = (a: Agent, url: string, body: object = {}) => a.post(url).set('x-csrf-token', a.csrf).send(body);

async function rejectedLot(o: Parameters<typeof makeSupplierWorld>[1] = {}) {
  const w = await makeSupplierWorld(ctx.ds, o);
  const lot = await w.lot({ status: 'rejected', hfe: [88, 92, 150, 160, 170, 180, 190, 200], dateCode: '2611' });
  return { w, lot };
}

async function sinkMessage(subject: string) {
  for (let i = 0; i < 50; i++) {
    for (const f of fs.readdirSync(folder)) {
      const m = await simpleParser(fs.readFileSync(path.join(folder, f)));
      if (m.subject === subject) return m;
    }
    await new Promise((r) => setTimeout(r, 50));
  }
  return null;
}

describe('NCR lifecycle', () => {
  it('raise from a rejected lot → PDF → send (mail with the PDF at the sink) → answer with a document → close', async () => {
    const { w, lot } = await rejectedLot();
    const a = await buyer();
    const draft = await a.get(`/api/ncrs/draft?lotId=${lot.lotId}`).expect(200);
    expect(draft.body.findings).toMatch(/2 parts outside the limits/);
    expect(draft.body.findings).toMatch(/date code 2611/);
    expect(draft.body.disposition).toMatch(/^Rejected, signed by /);

    const created = await post(a, '/api/ncrs', { lotId: lot.lotId, correctiveAction: 'Explain the low-gain parts and contain the remaining stock.', dueDate }).expect(201);
    const ncr = created.body;
    expect(ncr.code).toMatch(/^NCR-\d{4}-\d{4}$/);
    expect(ncr.status).toBe('open');
    expect(ncr.findings).toBe(draft.body.findings);
    expect(ncr.recipient.email).toMatch(/^quality-/);

    const pdf = await a.get(`/api/ncrs/${ncr.id}/report.pdf`).expect(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    expect(pdf.body.subarray(0, 5).toString()).toBe('%PDF-');
    fs.mkdirSync('test-results/screens', { recursive: true });
    fs.writeFileSync('test-results/screens/suppliers-ncr.pdf', pdf.body);

    const sent = await post(a, `/api/ncrs/${ncr.id}/send`).expect(200);
    expect(sent.body.status).toBe('sent');
    expect(sent.body.sentTo).toBe(ncr.recipient.email);
    expect(sent.body.mail).toMatchObject({ status: 'sent', attempts: 1 });
    const mail = await ctx.ds.getRepository(OutgoingMail).findOneByOrFail({ id: sent.body.mail.id });
    expect(mail).toMatchObject({ relatedType: 'ncr', relatedId: String(ncr.id) });
    const msg = await sinkMessage(mail.subject);
    expect(msg).not.toBeNull();
    expect(msg!.to && !Array.isArray(msg!.to) ? msg!.to.value[0].address : '').toBe(ncr.recipient.email);
    expect(msg!.attachments).toHaveLength(1);
    expect(msg!.attachments[0].filename).toBe(`${ncr.code}.pdf`);
    expect(msg!.attachments[0].contentType).toBe('application/pdf');
    expect(msg!.attachments[0].content.subarray(0, 5).toString()).toBe('%PDF-');
    expect(msg!.text).toMatch(new RegExp(ncr.code));

    // Closing before the supplier answered is refused.
    const early = await post(a, `/api/ncrs/${ncr.id}/close`).expect(409);
    expect(early.body.detail).toMatch(/record the supplier's answer/);

    // An executable as the answer document is refused by its content.
    await a.post(`/api/ncrs/${ncr.id}/answer`).set('x-csrf-token', a.csrf).field('text', 'Our answer').attach('file', Buffer.from([0x7f, 0x45, 0x4c, 0x46, 1, 2, 3]), 'answer.pdf').expect(415);
    const noFile = await a.post(`/api/ncrs/${ncr.id}/answer`).set('x-csrf-token', a.csrf).field('text', 'Our answer').expect(400);
    expect(noFile.body.errors.map((e: { field: string }) => e.field)).toContain('file');

    const answered = await a
      .post(`/api/ncrs/${ncr.id}/answer`)
      .set('x-csrf-token', a.csrf)
      .field('text', 'Root cause: two date codes packed together at our warehouse. Stock purged; packing check added.')
      .attach('file', FAKE_PDF, '8D-report.pdf')
      .expect(200);
    expect(answered.body.status).toBe('answered');
    expect(answered.body.answer.document).toMatchObject({ name: '8D-report.pdf', mediaType: 'application/pdf', size: FAKE_PDF.length });
    const doc = await a.get(answered.body.answer.document.url).expect(200);
    expect(Buffer.from(doc.body).equals(FAKE_PDF)).toBe(true);
    // The answer is kept as recorded.
    await a.post(`/api/ncrs/${ncr.id}/answer`).set('x-csrf-token', a.csrf).field('text', 'Another answer').attach('file', FAKE_PDF, 'x.pdf').expect(409);

    const closed = await post(a, `/api/ncrs/${ncr.id}/close`, { note: 'Answer accepted; next lots on tightened inspection.' }).expect(200);
    expect(closed.body.status).toBe('closed');
    expect(closed.body.closed.note).toMatch(/Answer accepted/);

    const actions = (await ctx.ds.getRepository(AuditEntry).findBy({ entityType: 'ncr', entityId: String(ncr.id) })).map((e) => e.action).sort();
    expect(actions).toEqual(['ncr.answer', 'ncr.close', 'ncr.create', 'ncr.send']);
    const listed = await a.get(`/api/ncrs?supplierId=${w.supplier.id}&status=closed`).expect(200);
    expect(listed.body.items.map((r: { id: number }) => r.id)).toEqual([ncr.id]);
  });

  it('an NCR raised from an alert on an accepted lot carries the alert figures', async () => {
    const w = await makeSupplierWorld(ctx.ds);
    for (const seed of [1, 2, 3]) await w.lot({ status: 'accepted', hfe: normalSample(seed, 40, 180, 18), receivedAt: new Date(Date.now() - (40 - seed) * DAY) });
    const { lotId } = await w.lot({ status: 'accepted', hfe: [...normalSample(8, 30, 140, 8), ...normalSample(9, 30, 250, 9)] });
    const { alertId } = (await ctx.ds.transaction((m) => onLotDisposed(m, lotId)))!;
    const a = await buyer();
    // Without the alert, an accepted lot is no ground for an NCR.
    await post(a, '/api/ncrs', { lotId, correctiveAction: 'Explain the two gain groups in one lot.', dueDate }).expect(409);
    const res = await post(a, '/api/ncrs', { lotId, alertId, correctiveAction: 'Explain the two gain groups in one lot.', dueDate }).expect(201);
    expect(res.body.alertId).toBe(alertId);
    expect(res.body.findings).toMatch(/bimodality/);
    const alert = await a.get(`/api/drift-alerts/${alertId}`).expect(200);
    expect(alert.body.ncrs).toEqual([{ id: res.body.id, code: res.body.code, status: 'open' }]);
    // An alert of another lot is refused, naming alertId.
    const other = await w.lot({ status: 'rejected', hfe: [50, 60, 70, 80] });
    const bad = await post(a, '/api/ncrs', { lotId: other.lotId, alertId, correctiveAction: 'Explain the low-gain parts please.', dueDate }).expect(422);
    expect(bad.body.errors[0].field).toBe('alertId');
  });

  it('refuses a second open NCR for the lot, a due date in the past and missing fields, naming them', async () => {
    const { lot } = await rejectedLot();
    const a = await buyer();
    await post(a, '/api/ncrs', { lotId: lot.lotId, correctiveAction: 'Contain and explain, please.', dueDate }).expect(201);
    await post(a, '/api/ncrs', { lotId: lot.lotId, correctiveAction: 'Contain and explain, please.', dueDate }).expect(409);
    const past = await post(a, '/api/ncrs', { lotId: lot.lotId, correctiveAction: 'Contain and explain, please.', dueDate: '2020-01-01' }).expect(422);
    expect(past.body.errors[0].field).toBe('dueDate');
    const missing = await post(a, '/api/ncrs', { lotId: lot.lotId }).expect(400);
    expect([...new Set(missing.body.errors.map((e: { field: string }) => e.field))].sort()).toEqual(['correctiveAction', 'dueDate']);
    const unknown = await post(a, '/api/ncrs', { lotId: lot.lotId, correctiveAction: 'Contain and explain, please.', dueDate, colour: 'red' }).expect(400);
    expect(unknown.body.errors[0].field).toBe('colour');
  });

  it('edits an open NCR, and refuses edits once it was sent', async () => {
    const { lot } = await rejectedLot();
    const a = await buyer();
    const { body: ncr } = await post(a, '/api/ncrs', { lotId: lot.lotId, correctiveAction: 'Contain and explain, please.', dueDate }).expect(201);
    const edited = await a.patch(`/api/ncrs/${ncr.id}`).set('x-csrf-token', a.csrf).send({ correctiveAction: 'Contain, explain and replace the lot.' }).expect(200);
    expect(edited.body.correctiveAction).toBe('Contain, explain and replace the lot.');
    await post(a, `/api/ncrs/${ncr.id}/send`).expect(200);
    await a.patch(`/api/ncrs/${ncr.id}`).set('x-csrf-token', a.csrf).send({ correctiveAction: 'Something else entirely.' }).expect(409);
  });

  it('sending to a supplier without any contact answers 409 and queues nothing', async () => {
    const { lot } = await rejectedLot({ contacts: [] });
    const a = await buyer();
    const { body: ncr } = await post(a, '/api/ncrs', { lotId: lot.lotId, correctiveAction: 'Contain and explain, please.', dueDate }).expect(201);
    expect(ncr.recipient).toBeNull();
    const res = await post(a, `/api/ncrs/${ncr.id}/send`).expect(409);
    expect(res.body.detail).toMatch(/no contact/);
    expect(await ctx.ds.getRepository(OutgoingMail).countBy({ relatedType: 'ncr', relatedId: String(ncr.id) })).toBe(0);
    expect((await a.get(`/api/ncrs/${ncr.id}`).expect(200)).body.status).toBe('open');
  });

  it('without a quality contact, the first contact gets the report', async () => {
    const { lot } = await rejectedLot({
      contacts: [
        { name: 'First Contact', email: 'first@supplier.example.test', duty: 'sales' },
        { name: 'Second Contact', email: 'second@supplier.example.test', duty: null },
      ],
    });
    const a = await buyer();
    const { body: ncr } = await post(a, '/api/ncrs', { lotId: lot.lotId, correctiveAction: 'Contain and explain, please.', dueDate }).expect(201);
    expect(ncr.recipient.email).toBe('first@supplier.example.test');
  });

  it('a send while the SMTP server is down is kept as failed with the NCR sent, and a later delivery round sends it', async () => {
    const downPort = await freePort();
    const downConfig = readConfig({ ...process.env, BINWRIGHT_SMTP_PORT: String(downPort) });
    const downApp = createApp({ dataSource: ctx.ds, config: downConfig, mailTransport: createMailTransport(downConfig) });
    const { lot } = await rejectedLot();
    const a = await agentFor(downApp, await makeUser(ctx.ds, 'quality'));
    const { body: ncr } = await post(a, '/api/ncrs', { lotId: lot.lotId, correctiveAction: 'Contain and explain, please.', dueDate }).expect(201);
    const sent = await post(a, `/api/ncrs/${ncr.id}/send`).expect(200);
    expect(sent.body.status).toBe('sent');
    expect(sent.body.mail.status).toBe('failed');
    expect(sent.body.mail.lastError).toBeTruthy();
    const mail = await ctx.ds.getRepository(OutgoingMail).findOneByOrFail({ id: sent.body.mail.id });
    expect(await ctx.ds.getRepository(OutgoingMailAttachment).countBy({ mailId: mail.id })).toBe(1);
    // Once due, the retry reaches the sink with the PDF.
    await deliverDueMail(ctx.ds, createMailTransport(config), config.smtp.from, new Date(Date.now() + retryDelayMs(1) + 1000));
    expect((await ctx.ds.getRepository(OutgoingMail).findOneByOrFail({ id: mail.id })).status).toBe('sent');
    const msg = await sinkMessage(mail.subject);
    expect(msg?.attachments[0].filename).toBe(`${ncr.code}.pdf`);
    expect((await a.get(`/api/ncrs/${ncr.id}`).expect(200)).body.mail.status).toBe('sent');
  });
});
