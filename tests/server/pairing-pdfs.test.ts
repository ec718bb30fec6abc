import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { BinaryBitmap, DataMatrixReader, HybridBinarizer, RGBLuminanceSource } from '@zxing/library';
import { afterAll, describe, expect, it } from 'vitest';
import type { KitDetail } from '../../shared/api/pairing.ts';
import { parseKitPartReferences } from '../../shared/domain/kitting/index.ts';
import { parseLabel } from '../../shared/domain/labels/index.ts';
import { kitLabelGeometry } from '../../server/modules/pairing/kit-label-pdf.ts';
import { signedIn, useTestApp, type Agent } from './helpers.ts';
import { makePairingPartType, makeStockLot, setLocation } from './pairing-fixtures.ts';

const ctx = useTestApp();
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'bw-kit-pdfs-'));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

function getPdf(agent: Agent, url: string) {
  return agent
    .get(url)
    .buffer(true)
    .parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
}

function file(pdf: Buffer): string {
  const f = path.join(tmp, `k-${Math.random().toString(36).slice(2)}.pdf`);
  fs.writeFileSync(f, pdf);
  return f;
}

const pdfText = (pdf: Buffer) => execFileSync('pdftotext', ['-layout', file(pdf), '-'], { encoding: 'utf8' });

function render(pdf: Buffer, dpi = 300): { png: string; w: number; h: number; px: Buffer } {
  const base = path.join(tmp, `r-${Math.random().toString(36).slice(2)}`);
  const f = file(pdf);
  execFileSync('pdftoppm', ['-r', String(dpi), '-png', '-f', '1', '-l', '1', '-singlefile', f, base]);
  execFileSync('pdftoppm', ['-r', String(dpi), '-gray', '-f', '1', '-l', '1', '-singlefile', f, base]);
  const raw = fs.readFileSync(`${base}.pgm`);
  const header = raw.subarray(0, 40).toString('latin1').match(/^P5\s+(\d+)\s+(\d+)\s+(\d+)\s/);
  if (!header) throw new Error('not a binary PGM');
  return { png: `${base}.png`, w: Number(header[1]), h: Number(header[2]), px: raw.subarray(header[0].length) };
}

/** Crops the kit label's Data Matrix from a 300 dpi rendering and decodes it with ZXing (test-only). */
function decodeDataMatrix(img: { w: number; h: number; px: Buffer }, dpi = 300): string {
  const g = kitLabelGeometry();
  const k = dpi / 72;
  const margin = 6;
  const x0 = Math.max(0, Math.floor(g.dm.x * k - margin));
  const y0 = Math.max(0, Math.floor(g.dm.y * k - margin));
  const x1 = Math.min(img.w, Math.ceil((g.dm.x + g.dm.w) * k + margin));
  const y1 = Math.min(img.h, Math.ceil((g.dm.y + g.dm.h) * k + margin));
  const w = x1 - x0;
  const h = y1 - y0;
  const lum = new Uint8ClampedArray(w * h);
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) lum[y * w + x] = img.px[(y + y0) * img.w + x + x0] as number;
  return new DataMatrixReader().decode(new BinaryBitmap(new HybridBinarizer(new RGBLuminanceSource(lum, w, h)))).getText();
}

/** A kit of three pairs from two containers at two locations. */
async function kit(): Promise<{ agent: Agent; kit: KitDetail; partNumber: string }> {
  const pt = await makePairingPartType(ctx.ds, { matchHfePct: 5, matchVbeMv: 2 });
  const parts = [100, 150, 200].flatMap((h, i) => [
    { hfe: h, vbeMv: 640 + i * 5 },
    { hfe: h * 1.01, vbeMv: 640.2 + i * 5 },
  ]);
  const s = await makeStockLot(ctx.ds, pt, parts, { capacity: 4, location: 'Drawer 12' });
  await setLocation(ctx.ds, s.containers[1]!.id, 'Drawer 3');
  const { agent } = await signedIn(ctx, 'assembler');
  const res = await agent.post('/api/kits').set('x-csrf-token', agent.csrf).send({ partTypeId: pt.partTypeId, mode: 'same', setSize: 2, setsWanted: 3, note: 'Front-end pairs' }).expect(201);
  return { agent, kit: res.body as KitDetail, partNumber: pt.partNumber };
}

describe('GET /api/kits/:id/pick-list.pdf', () => {
  it('lists every part by storage location with container, position, set, lot and supplier lot, the tolerance definition, the sets with their meaning and the ESD caution; the Code 128 reads the kit code', async () => {
    const { agent, kit: k, partNumber } = await kit();
    const res = await getPdf(agent, `/api/kits/${k.id}/pick-list.pdf`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/application\/pdf/);
    const pdf = res.body as Buffer;
    const text = pdfText(pdf);
    for (const t of ['Pick list', k.code, partNumber, '|h1 − h2| / min(h1, h2) ≤ t', 't = 5.0 %', 'Front-end pairs', 'Mirror IC1/IC2', 'exp(ΔVbe/VT)', 'ESD', '0 of 6 pulled']) expect(text).toContain(t);
    // Drawer 3 comes before Drawer 12 on the list.
    const rows = text.split('\n').filter((l) => /C-\d{8}-\d{4}\s+\d+\s+\d+\s/.test(l));
    expect(rows).toHaveLength(6);
    expect(rows.slice(0, 2).every((r) => r.includes('Drawer 3'))).toBe(true);
    expect(rows.slice(2).every((r) => r.includes('Drawer 12'))).toBe(true);
    for (const p of k.pickList) expect(text).toContain(`${p.lotCode} / ${p.supplierLot}`);
    const fonts = execFileSync('pdffonts', [file(pdf)], { encoding: 'utf8' });
    expect(fonts).toMatch(/SourceSans3/);
    const bars = execFileSync('zbarimg', ['-q', '--raw', '-Sdisable', '-Scode128.enable', render(pdf, 200).png], { encoding: 'utf8' }).trim();
    expect(bars).toBe(k.code);
    // After a pull, the list shows the pull time and the progress.
    const first = k.pickList[0]!;
    await agent.post(`/api/kits/${k.id}/pull`).set('x-csrf-token', agent.csrf).send({ containerCode: first.containerCode, position: first.position }).expect(200);
    expect(pdfText((await getPdf(agent, `/api/kits/${k.id}/pick-list.pdf`)).body as Buffer)).toContain('1 of 6 pulled');
  });
});

describe('GET /api/kits/:id/label.pdf', () => {
  it('the Data Matrix decodes to an ISO/IEC 15434 format-06 message (T kit code, P part, Q parts, 11Z the parts by container and position); the Code 128 reads the kit code', async () => {
    const { agent, kit: k, partNumber } = await kit();
    const res = await getPdf(agent, `/api/kits/${k.id}/label.pdf`);
    expect(res.status).toBe(200);
    expect(res.headers['x-label-parts-omitted']).toBe('0');
    const pdf = res.body as Buffer;
    const box = /\/MediaBox \[0 0 ([\d.]+) ([\d.]+)\]/.exec(pdf.toString('latin1'));
    expect(Number(box?.[1])).toBeCloseTo((100 * 72) / 25.4, 0);
    expect(Number(box?.[2])).toBeCloseTo((50 * 72) / 25.4, 0);
    const text = pdfText(pdf);
    for (const t of [k.code, partNumber, '3 pairs', '6 parts', 'ESD']) expect(text).toContain(t);
    const img = render(pdf);
    const parsed = parseLabel(decodeDataMatrix(img));
    expect(parsed.format).toBe('06');
    expect(parsed.warnings).toEqual([]);
    expect(parsed.elements.slice(0, 3)).toEqual([
      { di: 'T', value: k.code },
      { di: 'P', value: partNumber },
      { di: 'Q', value: '6' },
    ]);
    const refs = parsed.elements.find((e) => e.di === '11Z')!.value;
    const back = parseKitPartReferences(refs);
    expect(back.omitted).toBe(0);
    const key = (p: { containerCode: string; position: number }) => `${p.containerCode}/${p.position}`;
    expect(back.parts.map(key).sort()).toEqual(k.pickList.map(key).sort());
    const dm = execFileSync('dmtxread', ['-N1', '-m', '20000', img.png], { encoding: 'latin1' });
    expect(dm).toContain(k.code);
    const bars = execFileSync('zbarimg', ['-q', '--raw', '-Sdisable', '-Scode128.enable', img.png], { encoding: 'utf8' }).trim();
    expect(bars).toBe(k.code);
    const fonts = execFileSync('pdffonts', [file(pdf)], { encoding: 'utf8' });
    expect(fonts).toMatch(/SourceSans3/);
    // A reprint is byte-identical.
    const again = await getPdf(agent, `/api/kits/${k.id}/label.pdf`);
    expect(Buffer.compare(pdf, again.body as Buffer)).toBe(0);
  });

  it('a cancelled kit with no part left has nothing to label: 409', async () => {
    const { agent, kit: k } = await kit();
    await agent.post(`/api/kits/${k.id}/cancel`).set('x-csrf-token', agent.csrf).send({}).expect(200);
    expect((await agent.get(`/api/kits/${k.id}/label.pdf`)).status).toBe(409);
    expect((await agent.get('/api/kits/99999999/label.pdf')).status).toBe(404);
  });
});
