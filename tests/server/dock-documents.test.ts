import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { readConfig } from '../../server/config.ts';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { LotDocument } from '../../server/modules/lots/lot.entity.ts';
import { agentFor, signedIn, useTestApp, type Agent } from './helpers.ts';
import { lotBody, makeCatalog, postLot } from './dock-fixtures.ts';

const base = useTestApp();
// A data folder of this run: the throwaway database restarts its ids, files from an earlier run must not collide.
const dataDir = path.join(readConfig().dataDir, `dock-documents-${process.pid}-${Date.now()}`);
const DOCS = path.join(dataDir, 'documents');
const ctx = {} as typeof base;
beforeAll(() => {
  ctx.ds = base.ds;
  ctx.app = createApp({ dataSource: base.ds, config: { ...readConfig(), dataDir } });
});
afterAll(() => {
  fs.rmSync(dataDir, { recursive: true, force: true });
});

/** A tiny but well-formed one-page PDF (PDF 1.4 structure). */
function pdf(text = 'Certificate of conformance'): Buffer {
  return Buffer.from(
    `%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[3 0 R]/Count 1>>endobj\n` +
      `3 0 obj<</Type/Page/Parent 2 0 R/MediaBox[0 0 200 100]>>endobj\n% ${text}\ntrailer<</Root 1 0 R>>\n%%EOF\n`,
  );
}
/** Bytes that start like an ELF executable (0x7F 'E' 'L' 'F', 64-bit, little-endian). */
const ELF = Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 0x02, 0x01, 0x01, 0x00]), Buffer.alloc(120, 0)]);
/** A DOS/PE header: 'MZ' then binary fields. */
const PE = Buffer.concat([Buffer.from('MZ'), Buffer.from([0x90, 0x00, 0x03, 0x00, 0x00, 0x00, 0x04, 0x00]), Buffer.alloc(60, 0)]);
const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.from('0000000dIHDR-rest-of-image')]);
const JPEG = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10]), Buffer.from('JFIF\0'), Buffer.alloc(20, 1)]);
const CSV = Buffer.from('serial;hfe;vbe_mv\n1;312;652.1\n2;298;655.0\n3;305;653.4\n', 'utf8');

async function lotFor(role: 'inspector' | 'quality' = 'inspector') {
  const c = await makeCatalog(ctx.ds);
  const { agent, user } = await signedIn(ctx, role);
  const lot = await postLot(agent, lotBody(c)).expect(201);
  return { agent, user, lotId: lot.body.id as number };
}

function upload(agent: Agent, lotId: number, file: Buffer | null, name: string, kind = 'coc') {
  const req = agent.post(`/api/lots/${lotId}/documents`).set('x-csrf-token', agent.csrf).field('kind', kind);
  return file ? req.attach('file', file, { filename: name, contentType: 'application/octet-stream' }) : req;
}

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const lotFolder = (lotId: number) => path.join(DOCS, String(lotId));
const incoming = () => (fs.existsSync(path.join(DOCS, '.incoming')) ? fs.readdirSync(path.join(DOCS, '.incoming')) : []);

describe('POST /api/lots/:id/documents', () => {
  it('accepts a PDF: SHA-256 recorded, file stored under <lotId>/<docId>-<sha8>, listed with who and when, audited', async () => {
    const { agent, user, lotId } = await lotFor();
    const bytes = pdf();
    const res = await upload(agent, lotId, bytes, 'CoC 2331 — Z2331B.pdf').expect(201);
    expect(res.body).toMatchObject({
      lotId,
      kind: 'coc',
      originalName: 'CoC 2331 — Z2331B.pdf',
      mediaType: 'application/pdf',
      sizeBytes: bytes.length,
      sha256: sha(bytes),
      uploadedBy: { id: user.id, name: user.name },
      contentUrl: `/api/lots/${lotId}/documents/${res.body.id}/content`,
    });
    const row = await ctx.ds.getRepository(LotDocument).findOneByOrFail({ id: res.body.id });
    expect(row.storageKey).toBe(`${lotId}/${res.body.id}-${sha(bytes).slice(0, 8)}`);
    const onDisk = path.join(DOCS, row.storageKey);
    expect(fs.readFileSync(onDisk).equals(bytes)).toBe(true);
    expect(path.resolve(onDisk).startsWith(path.resolve('dist'))).toBe(false);

    const list = await agent.get(`/api/lots/${lotId}/documents`).expect(200);
    expect(list.body).toHaveLength(1);
    expect(Date.parse(list.body[0].uploadedAt)).toBeGreaterThan(Date.now() - 60_000);
    expect((await agent.get(`/api/lots/${lotId}`).expect(200)).body.documents).toHaveLength(1);
    const [entry] = await ctx.ds.getRepository(AuditEntry).findBy({ entityType: 'lot', entityId: String(lotId), action: 'lot.document-add' });
    expect(entry.after).toMatchObject({ documentId: res.body.id, sha256: sha(bytes) });
    expect(incoming()).toEqual([]);
  });

  it.each([
    ['PNG', PNG, 'label-photo.jpg', 'image/png'],
    ['JPEG', JPEG, 'reel.png', 'image/jpeg'],
    ['CSV', CSV, 'tester-export.txt', 'text/csv'],
    ['PDF', pdf('named like an image'), 'scan.png', 'application/pdf'],
  ])('detects %s from the content, whatever the name (%s → %s)', async (_what, bytes, name, mediaType) => {
    const { agent, lotId } = await lotFor();
    const res = await upload(agent, lotId, bytes, name, 'photo').expect(201);
    expect(res.body.mediaType).toBe(mediaType);
  });

  it.each([
    ['a renamed ELF executable', ELF, 'coc.pdf', /ELF executable/],
    ['a renamed PE executable', PE, 'test-report.pdf', /Windows \(PE\/MZ\) executable/],
    ['plain prose text', Buffer.from('Thanks for your order, parts ship Friday.\n'), 'notes.csv', /neither PDF, PNG, JPEG nor a CSV/],
    ['text with a NUL byte', Buffer.from('a,b\n1,\u0000\n'), 'data.csv', /neither/],
    ['a shell script with commas', Buffer.from('#!/bin/sh\necho a,b,c\necho d,e,f\n'), 'run.csv', /a script/],
  ])('refuses %s with 415 and writes nothing — no row, no file', async (_what, bytes, name, message) => {
    const { agent, lotId } = await lotFor();
    const res = await upload(agent, lotId, bytes, name).expect(415);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(res.body.detail).toMatch(message);
    expect(res.body.errors[0].field).toBe('file');
    expect(await ctx.ds.getRepository(LotDocument).countBy({ lotId })).toBe(0);
    expect(fs.existsSync(lotFolder(lotId))).toBe(false);
    expect(incoming()).toEqual([]);
  });

  it('refuses a file over 20 MB with 413 and writes nothing', async () => {
    const { agent, lotId } = await lotFor();
    const big = Buffer.concat([pdf(), Buffer.alloc(20 * 1024 * 1024, 0x20)]);
    const res = await upload(agent, lotId, big, 'huge.pdf').expect(413);
    expect(res.body.detail).toMatch(/larger than 20 MB/);
    expect(await ctx.ds.getRepository(LotDocument).countBy({ lotId })).toBe(0);
    expect(fs.existsSync(lotFolder(lotId))).toBe(false);
    expect(incoming()).toEqual([]);
  });

  it('the same content again answers 409 naming the existing document; same name with new content is a second document', async () => {
    const { agent, lotId } = await lotFor();
    const first = await upload(agent, lotId, pdf('v1'), 'coc.pdf').expect(201);
    const again = await upload(agent, lotId, pdf('v1'), 'coc-copy.pdf').expect(409);
    expect(again.body.detail).toContain(`document ${first.body.id} "coc.pdf"`);
    const second = await upload(agent, lotId, pdf('v2'), 'coc.pdf').expect(201);
    expect(second.body.id).not.toBe(first.body.id);
    const list = await agent.get(`/api/lots/${lotId}/documents`).expect(200);
    expect(list.body.map((d: { originalName: string }) => d.originalName)).toEqual(['coc.pdf', 'coc.pdf']);
    const files = fs.readdirSync(lotFolder(lotId)).sort();
    expect(files).toEqual([`${first.body.id}-${first.body.sha256.slice(0, 8)}`, `${second.body.id}-${second.body.sha256.slice(0, 8)}`].sort());
    // The first file still holds the first content: nothing was replaced.
    const firstBytes = await agent.get(first.body.contentUrl).buffer(true).expect(200);
    expect(firstBytes.body.toString()).toContain('% v1');
  });

  it('when a file already sits under the new document\'s key, nothing is replaced and no row is written', async () => {
    const { agent, lotId } = await lotFor();
    const bytes = pdf('collides');
    const [{ last_value, is_called }] = await ctx.ds.query(`SELECT last_value, is_called FROM lot_document_id_seq`);
    const nextId = Number(last_value) + (is_called ? 1 : 0);
    const stale = path.join(lotFolder(lotId), `${nextId}-${sha(bytes).slice(0, 8)}`);
    fs.mkdirSync(lotFolder(lotId), { recursive: true });
    fs.writeFileSync(stale, 'left over from another database');
    const res = await upload(agent, lotId, bytes, 'coc.pdf').expect(500);
    expect(res.body.code).toBe('document-store-conflict');
    expect(fs.readFileSync(stale, 'utf8')).toBe('left over from another database');
    expect(await ctx.ds.getRepository(LotDocument).countBy({ lotId })).toBe(0);
    expect(incoming()).toEqual([]);
  });

  it('with a bad kind or without a file, answers 400 naming the field', async () => {
    const { agent, lotId } = await lotFor();
    const kind = await upload(agent, lotId, pdf(), 'a.pdf', 'invoice').expect(400);
    expect(kind.body.errors.map((e: { field: string }) => e.field)).toEqual(['kind']);
    const none = await upload(agent, lotId, null, 'a.pdf').expect(400);
    expect(none.body.errors.map((e: { field: string }) => e.field)).toEqual(['file']);
    const empty = await upload(agent, lotId, Buffer.alloc(0), 'a.pdf').expect(400);
    expect(empty.body.errors[0].field).toBe('file');
    const wrongField = await agent.post(`/api/lots/${lotId}/documents`).set('x-csrf-token', agent.csrf).field('kind', 'coc').attach('upload', pdf(), 'a.pdf').expect(400);
    expect(wrongField.body.errors[0].field).toBe('upload');
    expect(await ctx.ds.getRepository(LotDocument).countBy({ lotId })).toBe(0);
  });

  it('for a lot that does not exist, answers 404', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    await upload(agent, 99_999_999, pdf(), 'a.pdf').expect(404);
  });
});

describe('GET /api/lots/:id/documents/:docId/content', () => {
  it('any signed-in user downloads it as an attachment with the detected type and nosniff', async () => {
    const { agent, lotId } = await lotFor();
    const bytes = pdf('download me');
    const doc = await upload(agent, lotId, bytes, 'CoC Ü.pdf').expect(201);
    const { agent: buyer } = await signedIn(ctx, 'buyer');
    const res = await buyer.get(doc.body.contentUrl).buffer(true).expect(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename=/);
    expect(res.headers['content-disposition']).toContain("filename*=UTF-8''CoC%20%C3%9C.pdf");
    expect(Buffer.from(res.body).equals(bytes)).toBe(true);
  });

  it('a CSV is served as text/csv, not guessed from the name', async () => {
    const { agent, lotId } = await lotFor();
    const doc = await upload(agent, lotId, CSV, 'export.pdf', 'test-report').expect(201);
    const res = await agent.get(doc.body.contentUrl).buffer(true).expect(200);
    expect(res.headers['content-type']).toBe('text/csv');
  });

  it('without a session answers 401; an unknown document 404', async () => {
    const { agent, lotId } = await lotFor();
    const doc = await upload(agent, lotId, pdf('private'), 'p.pdf').expect(201);
    const anon = await agentFor(ctx.app);
    const res = await anon.get(doc.body.contentUrl).expect(401);
    expect(res.headers['content-type']).toMatch(/problem\+json/);
    await anon.get(`/api/lots/${lotId}/documents`).expect(401);
    await agent.get(`/api/lots/${lotId}/documents/99999999/content`).expect(404);
  });
});
