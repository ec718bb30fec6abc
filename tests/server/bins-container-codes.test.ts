import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { BinaryBitmap, DataMatrixReader, HybridBinarizer, RGBLuminanceSource } from '@zxing/library';
import { afterAll, describe, expect, it } from 'vitest';
import type { ContainerRow, PlaceScreenedResponse, StockResponse } from '../../shared/api/bins.ts';
import { parseLabel } from '../../shared/domain/labels/index.ts';
import { AppError } from '../../server/http/app-error.ts';
import { binLabelGeometry, MM } from '../../server/modules/bins/bin-label-pdf.ts';
import { nextContainerCodes } from '../../server/modules/bins/container-code.ts';
import { agentFor, useTestApp, type Agent } from './helpers.ts';
import { addReadings, makeScreenLot, type ScreenLot } from './bins-fixtures.ts';

// Container codes C-YYYYMMDD-NNNN grow from four to six digits (shared/domain/labels/own-codes.ts):
// these tests use days far from today, so moving their counters never touches the codes that
// other test files issue on the shared test database today.
const ctx = useTestApp();
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'bw-container-codes-'));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

const usedDays = new Set<string>();
/** A day in the 2100s no other test in this file uses: a fresh counter row. */
function freshDay(): { date: Date; ymd: string } {
  for (;;) {
    const date = new Date(Date.UTC(2100 + Math.floor(Math.random() * 100), Math.floor(Math.random() * 12), 1 + Math.floor(Math.random() * 28), 10));
    const ymd = date.toISOString().slice(0, 10).replace(/-/g, '');
    if (!usedDays.has(ymd)) {
      usedDays.add(ymd);
      return { date, ymd };
    }
  }
}

async function setCounter(date: Date, last: number): Promise<void> {
  await ctx.ds.query(`INSERT INTO container_code_counter (day, last) VALUES ($1, $2) ON CONFLICT (day) DO UPDATE SET last = $2`, [date.toISOString().slice(0, 10), last]);
}

async function counter(date: Date): Promise<number> {
  const [row] = (await ctx.ds.query(`SELECT last FROM container_code_counter WHERE day = $1`, [date.toISOString().slice(0, 10)])) as { last: number }[];
  return row.last;
}

describe('nextContainerCodes on the day counter', () => {
  it('the 10 000th container of a day gets C-…-10000, and the numbers go on in five digits', async () => {
    const { date, ymd } = freshDay();
    await setCounter(date, 9_998);
    const codes = await ctx.ds.transaction((m) => nextContainerCodes(m, date, 3));
    expect(codes).toEqual([`C-${ymd}-9999`, `C-${ymd}-10000`, `C-${ymd}-10001`]);
    expect(await counter(date)).toBe(10_001);
  });

  it('the 100 000th gets six digits, and the last of the day is C-…-999999', async () => {
    const { date, ymd } = freshDay();
    await setCounter(date, 99_999);
    expect(await ctx.ds.transaction((m) => nextContainerCodes(m, date, 1))).toEqual([`C-${ymd}-100000`]);
    await setCounter(date, 999_998);
    expect(await ctx.ds.transaction((m) => nextContainerCodes(m, date, 1))).toEqual([`C-${ymd}-999999`]);
  });

  it('past 999 999 in a day, answers 409 naming containers, and the rollback gives the numbers back', async () => {
    const { date } = freshDay();
    await setCounter(date, 999_998);
    const err = await ctx.ds.transaction((m) => nextContainerCodes(m, date, 2)).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(AppError);
    expect(err).toMatchObject({ status: 409, errors: [{ field: 'containers', message: 'no container numbers left for today' }] });
    expect((err as AppError).detail).toMatch(/1,000,000 containers needed, 999,999 per day/);
    expect(await counter(date)).toBe(999_998);
  });
});

async function screenedInto(n: number): Promise<{ f: ScreenLot; agent: Agent; ids: number[] }> {
  const f = await makeScreenLot(ctx.ds, { setup: { kind: 'strip', capacity: 1, hasPositions: true, location: 'Rack 6' } });
  const agent = await agentFor(ctx.app, f.inspector);
  await addReadings(ctx.ds, f, Array.from({ length: n }, (_, i) => 120 + i));
  const placed = (await agent.post(`/api/lots/${f.lotId}/screening/place`).set('x-csrf-token', agent.csrf).send({}).expect(200)).body as PlaceScreenedResponse;
  const ids = [...new Set(placed.placements.map((p) => p.containerId))];
  expect(ids).toHaveLength(n);
  return { f, agent, ids };
}

/** Gives the containers the codes a busy day issues (the codes as nextContainerCodes writes them, tested above). */
async function recode(ids: number[], codes: string[]): Promise<void> {
  for (const [i, id] of ids.entries()) await ctx.ds.query(`UPDATE container SET code = $2 WHERE id = $1`, [id, codes[i]]);
}

describe('containers with 5- and 6-digit codes', () => {
  it('open by scanned code in any case; a zero-padded wide form answers 422 naming code and the accepted form', async () => {
    const { agent, ids } = await screenedInto(1);
    const { ymd } = freshDay();
    const code = `C-${ymd}-123456`;
    await recode(ids, [code]);
    const d = (await agent.get(`/api/containers/by-code/${code.toLowerCase()}`).expect(200)).body;
    expect(d).toMatchObject({ id: ids[0], code });
    const padded = await agent.get(`/api/containers/by-code/C-${ymd}-012345`).expect(422);
    expect(padded.body.errors).toEqual([{ field: 'code', message: 'not a container code' }]);
    expect(padded.body.detail).toContain('C-YYYYMMDD-NNNN, 4–6 digits');
    await agent.get(`/api/containers/by-code/C-${ymd}-10000`).expect(404);
  });

  it('sorted by code, …-9999 comes before …-10000 and …-999999, in the list (both directions) and in stock', async () => {
    const { f, agent, ids } = await screenedInto(3);
    const { ymd } = freshDay();
    const want = [`C-${ymd}-9999`, `C-${ymd}-10000`, `C-${ymd}-999999`];
    // Given in a shuffled order, so the container ids do not already give the answer.
    await recode(ids, [want[2], want[0], want[1]] as string[]);
    const asc = (await agent.get(`/api/containers?lotId=${f.lotId}&sort=code&dir=asc`).expect(200)).body.items as ContainerRow[];
    expect(asc.map((c) => c.code)).toEqual(want);
    const desc = (await agent.get(`/api/containers?lotId=${f.lotId}&sort=code&dir=desc`).expect(200)).body.items as ContainerRow[];
    expect(desc.map((c) => c.code)).toEqual([...want].reverse());
    const stock = (await agent.get(`/api/stock?partTypeId=${f.partTypeId}`).expect(200)).body as StockResponse;
    expect(stock.partTypes[0]?.bins[0]?.containers.map((c) => c.code)).toEqual(want);
  });
});

describe('bin labels of a 6-digit container code', () => {
  function render(pdf: Buffer, name: string, dpi = 600): { w: number; h: number; px: Buffer; png: string } {
    const base = path.join(tmp, name);
    fs.writeFileSync(`${base}.pdf`, pdf);
    execFileSync('pdftoppm', ['-r', String(dpi), '-gray', '-singlefile', `${base}.pdf`, base]);
    execFileSync('pdftoppm', ['-r', String(dpi), '-png', '-singlefile', `${base}.pdf`, base]);
    // A copy to look at (test-results/screens), as the other label tests do.
    const screens = path.resolve('test-results/screens');
    fs.mkdirSync(screens, { recursive: true });
    fs.copyFileSync(`${base}.png`, path.join(screens, `${name}.png`));
    const raw = fs.readFileSync(`${base}.pgm`);
    const header = raw.subarray(0, 40).toString('latin1').match(/^P5\s+(\d+)\s+(\d+)\s+(\d+)\s/);
    if (!header) throw new Error('not a binary PGM');
    return { w: Number(header[1]), h: Number(header[2]), px: raw.subarray(header[0].length), png: `${base}.png` };
  }

  it.each([['100x50'], ['62x29'], ['57x32'], ['a4-3x8']])(
    'on %s, the Code 128 reads the whole code and the printed code is not cut',
    async (stock) => {
      const { agent, ids } = await screenedInto(1);
      const { ymd } = freshDay();
      const code = `C-${ymd}-999999`;
      await recode(ids, [code]);
      const res = await agent
        .post('/api/labels/bins.pdf')
        .set('x-csrf-token', agent.csrf)
        .send({ containerIds: ids, stock })
        .buffer(true)
        .parse((r, cb) => {
          const chunks: Buffer[] = [];
          r.on('data', (c: Buffer) => chunks.push(c));
          r.on('end', () => cb(null, Buffer.concat(chunks)));
        });
      expect(res.status).toBe(200);
      const pdf = res.body as Buffer;
      const text = execFileSync('pdftotext', ['-layout', '-', '-'], { input: pdf, encoding: 'utf8' });
      expect(text).toContain(code);
      const img = render(pdf, `bin-label-6-digit-${stock}`, stock.startsWith('a4') ? 300 : 600);
      const bars = execFileSync('zbarimg', ['-q', '--raw', '-Sdisable', '-Scode128.enable', img.png], { encoding: 'utf8' }).trim();
      expect(bars).toBe(code);
      if (stock === '100x50') {
        // The Data Matrix (ZXing, test-only) carries the code as element T.
        const g = binLabelGeometry(100 * MM, 50 * MM);
        const k = 600 / 72;
        const m = 1.5 * MM * k;
        const x0 = Math.max(0, Math.floor(g.dm.x * k - m));
        const y0 = Math.max(0, Math.floor(g.dm.y * k - m));
        const w = Math.min(img.w, Math.ceil((g.dm.x + g.dm.w) * k + m)) - x0;
        const h = Math.min(img.h, Math.ceil((g.dm.y + g.dm.h) * k + m)) - y0;
        const lum = new Uint8ClampedArray(w * h);
        for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) lum[y * w + x] = img.px[(y + y0) * img.w + x + x0] as number;
        const decoded = new DataMatrixReader().decode(new BinaryBitmap(new HybridBinarizer(new RGBLuminanceSource(lum, w, h)))).getText();
        expect(parseLabel(decoded).elements).toContainEqual({ di: 'T', value: code });
      }
    },
  );
});
