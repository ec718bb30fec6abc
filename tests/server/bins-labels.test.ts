import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { BinaryBitmap, DataMatrixReader, HybridBinarizer, RGBLuminanceSource } from '@zxing/library';
import { afterAll, describe, expect, it } from 'vitest';
import type { PlaceScreenedResponse } from '../../shared/api/bins.ts';
import { parseLabel } from '../../shared/domain/labels/index.ts';
import { binLabelGeometry, MM } from '../../server/modules/bins/bin-label-pdf.ts';
import { agentFor, signedIn, useTestApp, type Agent } from './helpers.ts';
import { addReadings, makeScreenLot, type ScreenLot } from './bins-fixtures.ts';

const ctx = useTestApp();
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'bw-bin-labels-'));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

async function screened(hfes: number[]): Promise<{ f: ScreenLot; agent: Agent; placed: PlaceScreenedResponse }> {
  const f = await makeScreenLot(ctx.ds, { setup: { kind: 'strip', capacity: 25, hasPositions: true, location: 'Rack 9' } });
  const agent = await agentFor(ctx.app, f.inspector);
  await addReadings(ctx.ds, f, hfes);
  const res = await agent.post(`/api/lots/${f.lotId}/screening/place`).set('x-csrf-token', agent.csrf).send({}).expect(200);
  return { f, agent, placed: res.body };
}

function containerIds(p: PlaceScreenedResponse): number[] {
  return [...new Set(p.placements.map((x) => x.containerId))];
}

async function print(agent: Agent, body: object) {
  return agent
    .post('/api/labels/bins.pdf')
    .set('x-csrf-token', agent.csrf)
    .send(body)
    .buffer(true)
    .parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
}

function pdfText(pdf: Buffer, page?: number): string {
  const file = path.join(tmp, `t-${Math.random().toString(36).slice(2)}.pdf`);
  fs.writeFileSync(file, pdf);
  const args = page ? ['-f', String(page), '-l', String(page)] : [];
  return execFileSync('pdftotext', [...args, '-layout', file, '-'], { encoding: 'utf8' });
}

/** Renders one page in grey at 300 dpi (pdftoppm, PGM) and returns its pixels. */
function renderGrey(pdf: Buffer, page: number, dpi = 300): { w: number; h: number; px: Buffer; png: string } {
  const base = path.join(tmp, `r-${Math.random().toString(36).slice(2)}`);
  fs.writeFileSync(`${base}.pdf`, pdf);
  execFileSync('pdftoppm', ['-r', String(dpi), '-gray', '-f', String(page), '-l', String(page), '-singlefile', `${base}.pdf`, base]);
  execFileSync('pdftoppm', ['-r', String(dpi), '-png', '-f', String(page), '-l', String(page), '-singlefile', `${base}.pdf`, base]);
  const raw = fs.readFileSync(`${base}.pgm`);
  // Binary PGM: "P5\n<w> <h>\n<max>\n" then one byte per pixel.
  const header = raw.subarray(0, 40).toString('latin1').match(/^P5\s+(\d+)\s+(\d+)\s+(\d+)\s/);
  if (!header) throw new Error('not a binary PGM');
  return { w: Number(header[1]), h: Number(header[2]), px: raw.subarray(header[0].length), png: `${base}.png` };
}

/** Crops the Data Matrix of a 100 × 50 mm label from a rendering and decodes it with ZXing (test-only). */
function decodeDataMatrix(img: { w: number; h: number; px: Buffer }, dpi = 300): string {
  const g = binLabelGeometry(100 * MM, 50 * MM);
  const k = dpi / 72;
  const margin = 1.5 * MM * k;
  const x0 = Math.max(0, Math.floor(g.dm.x * k - margin));
  const y0 = Math.max(0, Math.floor(g.dm.y * k - margin));
  const x1 = Math.min(img.w, Math.ceil((g.dm.x + g.dm.w) * k + margin));
  const y1 = Math.min(img.h, Math.ceil((g.dm.y + g.dm.h) * k + margin));
  const w = x1 - x0;
  const h = y1 - y0;
  const lum = new Uint8ClampedArray(w * h);
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) lum[y * w + x] = img.px[(y + y0) * img.w + x + x0] as number;
  const bitmap = new BinaryBitmap(new HybridBinarizer(new RGBLuminanceSource(lum, w, h)));
  return new DataMatrixReader().decode(bitmap).getText();
}

describe('POST /api/labels/bins.pdf', () => {
  it('prints one label per container with the bin, interval, test condition, part, lots, quantity, date and inspector as text', async () => {
    const { f, agent, placed } = await screened([120, 130, 210]);
    const ids = containerIds(placed);
    const res = await print(agent, { containerIds: ids, stock: '100x50' });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/application\/pdf/);
    const pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    const page1 = pdfText(pdf, 1);
    const today = new Date().toISOString().slice(0, 10);
    for (const text of ['BIN', 'Gain group A', '100 ≤ hFE < 200', 'IC = 2 mA, VCE = 5 V', f.partNumber, f.lotCode, f.supplierLot, 'Qty 2 pcs', today, f.inspector.name, placed.placements[0]?.containerCode as string]) {
      expect(page1).toContain(text);
    }
    const page2 = pdfText(pdf, 2);
    expect(page2).toContain('Gain group B');
    expect(page2).toContain('200 ≤ hFE ≤ 300');
    expect(page2).toContain('Qty 1 pcs');
    const fonts = execFileSync('pdffonts', ['-'], { input: pdf, encoding: 'utf8' });
    expect(fonts).toMatch(/SourceSans3/);
    expect(fonts.split('\n').filter((l) => /SourceSans3/.test(l)).every((l) => /\byes\s+yes\b/.test(l))).toBe(true);
  });

  it('the Data Matrix decodes (ZXing) to an ISO/IEC 15434 format-06 message: P part, T container, 1T supplier lot, Q quantity; the Code 128 reads the container code', async () => {
    const { f, agent, placed } = await screened([120, 130]);
    const [id] = containerIds(placed);
    const res = await print(agent, { containerIds: [id], stock: '100x50' });
    const img = renderGrey(res.body as Buffer, 1);
    const text = decodeDataMatrix(img);
    const parsed = parseLabel(text);
    expect(parsed.format).toBe('06');
    expect(parsed.warnings).toEqual([]);
    expect(parsed.elements).toEqual([
      { di: 'P', value: f.partNumber },
      { di: 'T', value: placed.placements[0]?.containerCode },
      { di: '1T', value: f.supplierLot },
      { di: 'Q', value: '2' },
    ]);
    expect(parsed.fields).toMatchObject({ customerPartNumber: f.partNumber, supplierLot: f.supplierLot, quantity: 2 });
    const bars = execFileSync('zbarimg', ['-q', '--raw', '-Sdisable', '-Scode128.enable', img.png], { encoding: 'utf8' }).trim();
    expect(bars).toBe(placed.placements[0]?.containerCode);
  });

  it('a reprint gives identical bytes, and is recorded as a reprint', async () => {
    const { agent, placed } = await screened([120, 210, 250]);
    const ids = containerIds(placed);
    const first = await print(agent, { containerIds: ids, stock: 'a4-2x7', startPosition: 3 });
    expect(first.headers['x-label-reprints']).toBe('0');
    const second = await print(agent, { containerIds: ids, stock: 'a4-2x7', startPosition: 3 });
    expect(second.headers['x-label-reprints']).toBe(String(ids.length));
    expect(Buffer.compare(first.body as Buffer, second.body as Buffer)).toBe(0);
    const rows = (await ctx.ds.query(`SELECT container_id, reprint, stock, page, cell FROM label_print WHERE container_id = ANY($1) ORDER BY id`, [ids])) as {
      reprint: boolean;
      cell: number;
    }[];
    expect(rows.map((r) => r.reprint)).toEqual([false, false, true, true]);
    expect(rows.map((r) => r.cell)).toEqual([2, 3, 2, 3]);
    const audits = (await ctx.ds.query(`SELECT action FROM audit_entry WHERE entity_type = 'label-job' AND entity_id = ANY($1)`, [[first.headers['x-label-job'], second.headers['x-label-job']]])) as {
      action: string;
    }[];
    expect(audits.map((a) => a.action).sort()).toEqual(['labels.bins.print', 'labels.bins.reprint']);
    const d = (await agent.get(`/api/containers/${ids[0]}`).expect(200)).body;
    expect(d.labelPrints).toBe(2);
    expect(d.prints.map((p: { reprint: boolean }) => p.reprint)).toEqual([true, false]);
  });

  it('on a sheet, starts at the given cell and continues on a new sheet', async () => {
    const { agent, placed } = await screened([120, 210, 50]);
    const ids = containerIds(placed);
    expect(ids).toHaveLength(3);
    const res = await print(agent, { containerIds: ids, stock: 'letter-2x5', startPosition: 9 });
    const txt = pdfText(res.body as Buffer);
    expect(txt.split('\f').filter((p) => p.trim()).length).toBe(2);
    const rows = (await ctx.ds.query(`SELECT page, cell FROM label_print WHERE container_id = ANY($1) ORDER BY id`, [ids])) as { page: number; cell: number }[];
    expect(rows).toEqual([
      { page: 0, cell: 8 },
      { page: 0, cell: 9 },
      { page: 1, cell: 0 },
    ]);
  });

  it('bad input: unknown stock 400 naming stock, start beyond the sheet 422 naming startPosition, unknown container 404, empty list 400', async () => {
    const { agent, placed } = await screened([120]);
    const ids = containerIds(placed);
    expect((await print(agent, { containerIds: ids, stock: 'napkin' })).status).toBe(400);
    const beyond = await agent.post('/api/labels/bins.pdf').set('x-csrf-token', agent.csrf).send({ containerIds: ids, stock: 'a4-2x7', startPosition: 15 });
    expect(beyond.status).toBe(422);
    expect(beyond.body.errors[0].field).toBe('startPosition');
    const roll = await agent.post('/api/labels/bins.pdf').set('x-csrf-token', agent.csrf).send({ containerIds: ids, stock: '62x29', startPosition: 2 });
    expect(roll.status).toBe(422);
    expect((await agent.post('/api/labels/bins.pdf').set('x-csrf-token', agent.csrf).send({ containerIds: [99999999], stock: '100x50' })).status).toBe(404);
    const empty = await agent.post('/api/labels/bins.pdf').set('x-csrf-token', agent.csrf).send({ containerIds: [], stock: '100x50' });
    expect(empty.status).toBe(400);
    expect(empty.body.errors[0].field).toBe('containerIds');
  });

  it('an assembler may not print labels (403) and nothing is recorded', async () => {
    const { placed } = await screened([120]);
    const { agent } = await signedIn(ctx, 'assembler');
    const res = await agent.post('/api/labels/bins.pdf').set('x-csrf-token', agent.csrf).send({ containerIds: containerIds(placed), stock: '100x50' });
    expect(res.status).toBe(403);
    const [{ n }] = await ctx.ds.query(`SELECT count(*)::int AS n FROM label_print WHERE container_id = ANY($1)`, [containerIds(placed)]);
    expect(n).toBe(0);
  });
});
