import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES } from '../../shared/api/roles.ts';
import { createApp } from '../../server/app.ts';
import { readConfig, type ServerConfig } from '../../server/config.ts';
import { createMailTransport, deliverDueMail, queueMail, retryDelayMs } from '../../server/modules/mail/mail.service.ts';
import { OutgoingMail } from '../../server/modules/mail/outgoing-mail.entity.ts';
import { startSmtpSink, type SmtpSink } from '../../server/modules/mail/smtp-sink.ts';
import { portIsFree } from '../../scripts/lib/pg-cluster.ts';
import { agentFor, makeUser, useTestApp } from './helpers.ts';

const ctx = useTestApp();
let sink: SmtpSink;
let config: ServerConfig;
const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'bw-sink-'));
const FAKE_PDF = Buffer.from('%PDF-1.4\n% test attachment\n%%EOF\n');

async function freePort(): Promise<number> {
  for (let p = 46000 + Math.floor(Math.random() * 1000); ; p++) if (await portIsFree(p)) return p;
}

beforeAll(async () => {
  const port = await freePort();
  config = readConfig({ ...process.env, BINWRIGHT_SMTP_PORT: String(port) });
  config.smtp.sinkFolder = folder;
  sink = await startSmtpSink({ port, folder });
});
afterAll(async () => {
  await sink?.close();
  fs.rmSync(folder, { recursive: true, force: true });
});

const due = () => ctx.ds.getRepository(OutgoingMail);

describe('outgoing mail through the local SMTP sink', () => {
  it('a queued message with a PDF arrives at the sink with its attachment, and is marked sent', async () => {
    const id = await queueMail(ctx.ds.manager, {
      to: 'quality@supplier.example.test',
      subject: `NCR test ${Date.now()}`,
      text: 'Please see the attached report.',
      attachments: [{ filename: 'ncr.pdf', contentType: 'application/pdf', content: FAKE_PDF }],
    });
    const result = await deliverDueMail(ctx.ds, createMailTransport(config), config.smtp.from);
    expect(result.sent).toBeGreaterThanOrEqual(1);
    const row = await due().findOneByOrFail({ id });
    expect(row.status).toBe('sent');
    const files = fs.readdirSync(folder);
    const parsed = await Promise.all(files.map(async (f) => simpleParser(fs.readFileSync(path.join(folder, f)))));
    const mine = parsed.find((m) => m.subject === row.subject);
    expect(mine).toBeDefined();
    expect(mine!.attachments[0].filename).toBe('ncr.pdf');
    expect(mine!.attachments[0].content.equals(FAKE_PDF)).toBe(true);
  });

  it('when the SMTP server is down, the message is kept as failed and sent by a later retry', async () => {
    const downPort = await freePort();
    const downConfig = readConfig({ ...process.env, BINWRIGHT_SMTP_PORT: String(downPort) });
    const id = await queueMail(ctx.ds.manager, { to: 'x@supplier.example.test', subject: `Retry ${Date.now()}`, text: 'retry me' });
    const first = await deliverDueMail(ctx.ds, createMailTransport(downConfig), config.smtp.from);
    expect(first.failed).toBeGreaterThanOrEqual(1);
    const failed = await due().findOneByOrFail({ id });
    expect(failed.status).toBe('failed');
    expect(failed.attempts).toBe(1);
    expect(failed.lastError).toBeTruthy();
    expect(failed.nextAttemptAt.getTime()).toBeGreaterThan(Date.now());

    // Not due yet: nothing is sent even with the sink up.
    await deliverDueMail(ctx.ds, createMailTransport(config), config.smtp.from);
    expect((await due().findOneByOrFail({ id })).status).toBe('failed');

    // Once due, the retry goes through.
    await deliverDueMail(ctx.ds, createMailTransport(config), config.smtp.from, new Date(Date.now() + retryDelayMs(1) + 1000));
    const sent = await due().findOneByOrFail({ id });
    expect(sent.status).toBe('sent');
    expect(sent.attempts).toBe(2);
  });

  it('retry delay doubles from 30 s and stops at one hour', () => {
    expect([1, 2, 3, 10].map(retryDelayMs)).toEqual([30_000, 60_000, 120_000, 3_600_000]);
  });
});

describe('mail routes', () => {
  it('a quality engineer lists the outbox and the sink inbox, and downloads an attachment', async () => {
    const app = createApp({ dataSource: ctx.ds, config, mailTransport: createMailTransport(config) });
    const qe = await makeUser(ctx.ds, 'quality');
    const agent = await agentFor(app, qe);
    const out = await agent.get('/api/mail/outbox?status=sent').expect(200);
    const withAttachment = out.body.items.find((m: { attachments: unknown[] }) => m.attachments.length > 0);
    expect(withAttachment).toBeDefined();
    const file = await agent.get(`/api/mail/outbox/${withAttachment.id}/attachments/${withAttachment.attachments[0].id}`).expect(200);
    expect(file.headers['content-type']).toBe('application/pdf');
    const inbox = await agent.get('/api/mail/sink').expect(200);
    expect(inbox.body.total).toBeGreaterThan(0);
    const msg = inbox.body.items.find((m: { attachments: unknown[] }) => m.attachments.length > 0);
    await agent.get(`/api/mail/sink/${msg.name}/attachments/0`).expect(200);
    await agent.get('/api/mail/sink/..%2F..%2Fetc%2Fpasswd/attachments/0').expect(400);
  });

  it.each(ROLES.filter((r) => r !== 'quality'))('a %s gets 403 on the outbox and on retry', async (role) => {
    const app = createApp({ dataSource: ctx.ds, config });
    const agent = await agentFor(app, await makeUser(ctx.ds, role));
    await agent.get('/api/mail/outbox').expect(403);
    await agent.post('/api/mail/outbox/1/retry').set('x-csrf-token', agent.csrf).expect(403);
  });

  it('anonymous access to the outbox answers 401', async () => {
    await request(createApp({ dataSource: ctx.ds, config })).get('/api/mail/outbox').expect(401);
  });
});
