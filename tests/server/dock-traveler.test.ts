import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { TRAVELER_STOCKS } from '../../shared/api/lots.ts';
import { agentFor, signedIn, useTestApp } from './helpers.ts';
import { lotBody, makeCatalog, postLot } from './dock-fixtures.ts';

const ctx = useTestApp();
const has = (bin: string) => spawnSync('sh', ['-c', `command -v ${bin}`]).status === 0;
const TOOLS = { pdftoppm: has('pdftoppm'), pdftotext: has('pdftotext'), pdffonts: has('pdffonts'), zbarimg: has('zbarimg'), dmtxread: has('dmtxread') };

/** Renders page 1 at 300 dpi and returns the PNG path (poppler-utils pdftoppm). */
function render(pdf: Buffer): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'bw-traveler-'));
  fs.writeFileSync(path.join(dir, 't.pdf'), pdf);
  const r = spawnSync('pdftoppm', ['-r', '300', '-png', '-f', '1', '-l', '1', '-singlefile', path.join(dir, 't.pdf'), path.join(dir, 'page')]);
  expect(r.status).toBe(0);
  return path.join(dir, 'page.png');
}

async function receivedLot() {
  const c = await makeCatalog(ctx.ds, { msl: '3', esdHbmClass: '1B' });
  const { agent } = await signedIn(ctx, 'inspector');
  const lot = await postLot(agent, lotBody(c, { quantity: 3000, dateCode: '2331', supplierLot: 'Z2331B', purchaseOrder: 'PO-20458', msl: '3', dryBag: 'sealed' })).expect(201);
  return { agent, c, lot: lot.body as { id: number; code: string } };
}

describe('GET /api/lots/:id/traveler.pdf', () => {
  it.each(TRAVELER_STOCKS.map((s) => [s.id, s] as const))('on stock %s: a one-page PDF of the stock size whose Code 128 and Data Matrix decode to the lot code', async (_id, stock) => {
    const { agent, lot } = await receivedLot();
    const res = await agent.get(`/api/lots/${lot.id}/traveler.pdf?stock=${stock.id}`).buffer(true).expect(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toBe(`inline; filename="traveler-${lot.code}-${stock.id}.pdf"`);
    const pdf = Buffer.from(res.body);
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    // Page size in points: 72 pt per inch, 25.4 mm per inch.
    const text = pdf.toString('latin1');
    const box = /\/MediaBox \[0 0 ([\d.]+) ([\d.]+)\]/.exec(text);
    expect(Number(box?.[1])).toBeCloseTo((stock.widthMm * 72) / 25.4, 0);
    expect(Number(box?.[2])).toBeCloseTo((stock.heightMm * 72) / 25.4, 0);
    expect(text.match(/\/Type \/Page\b/g)).toHaveLength(1);

    if (!TOOLS.pdftoppm) {
      console.warn('[dock-traveler] pdftoppm (poppler-utils) is not installed: barcode decoding not checked');
      return;
    }
    const png = render(pdf);
    if (TOOLS.zbarimg) {
      const code128 = spawnSync('zbarimg', ['--quiet', '--raw', '-Scode128.enable=1', png], { encoding: 'utf8' });
      expect(code128.stdout.trim().split('\n')).toContain(lot.code);
    } else console.warn('[dock-traveler] zbarimg (zbar-tools) is not installed: Code 128 decoding not checked');
    if (TOOLS.dmtxread) {
      const dm = spawnSync('dmtxread', ['-N1', '-m', '20000', png], { encoding: 'utf8' });
      expect(dm.stdout.trim()).toBe(lot.code);
    } else console.warn('[dock-traveler] dmtxread (dmtx-utils) is not installed: Data Matrix decoding not checked');
  }, 60_000);

  it('carries the part, supplier, quantity, date code and our ESD and MSL marks, in embedded Source Sans 3', async () => {
    const { agent, c, lot } = await receivedLot();
    const res = await agent.get(`/api/lots/${lot.id}/traveler.pdf?stock=100x150`).buffer(true).expect(200);
    if (!TOOLS.pdftotext) {
      console.warn('[dock-traveler] pdftotext is not installed: traveler text not checked');
      return;
    }
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'bw-traveler-'));
    const file = path.join(dir, 't.pdf');
    fs.writeFileSync(file, Buffer.from(res.body));
    const text = spawnSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).stdout.replace(/\s+/g, ' ');
    for (const expected of [lot.code, c.partType.partNumber, c.supplier.name, '3 000 pcs', '2331', 'Z2331B', 'PO-20458']) expect(text).toContain(expected);
    // Our marks: ESD class per ANSI/ESDA/JEDEC JS-001 (1B = 500 V to < 1000 V) and the MSL 3 floor life of J-STD-033 (168 h), reference.md §6.
    expect(text).toContain('ESD SENSITIVE — HBM class 1B (500 V to < 1000 V)');
    expect(text).toContain('MSL 3 — floor life 168 h after bag opening at ≤ 30 °C');
    expect(text).toContain('bake if exceeded (J-STD-033, local procedure)');
    if (TOOLS.pdffonts) {
      const fonts = spawnSync('pdffonts', [file], { encoding: 'utf8' }).stdout;
      expect(fonts).toMatch(/SourceSans3-Regular/);
      expect(fonts).toMatch(/SourceSans3-Bold/);
      for (const row of fonts.split('\n').filter((l) => l.includes('SourceSans3'))) expect(row).toMatch(/ yes /);
    }
  });

  it('with the default stock answers a 100 × 50 mm label; an unknown stock answers 400 naming stock', async () => {
    const { agent, lot } = await receivedLot();
    const res = await agent.get(`/api/lots/${lot.id}/traveler.pdf`).buffer(true).expect(200);
    expect(res.headers['content-disposition']).toContain('-100x50.pdf');
    const bad = await agent.get(`/api/lots/${lot.id}/traveler.pdf?stock=b5`).expect(400);
    expect(bad.body.errors[0]).toMatchObject({ field: 'stock' });
  });

  it('a buyer can print it; without a session it answers 401; a missing lot 404', async () => {
    const { lot } = await receivedLot();
    const { agent: buyer } = await signedIn(ctx, 'buyer');
    await buyer.get(`/api/lots/${lot.id}/traveler.pdf`).expect(200);
    await (await agentFor(ctx.app)).get(`/api/lots/${lot.id}/traveler.pdf`).expect(401);
    await buyer.get('/api/lots/99999999/traveler.pdf').expect(404);
  });
});
