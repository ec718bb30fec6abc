import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { Lot } from '../../server/modules/lots/lot.entity.ts';
import { Measurement } from '../../server/modules/measurements/measurement.entity.ts';
import { DEFAULT_MAPPING, DEFAULT_UNITS, makeBenchLot, testerCsv } from './bench-fixtures.ts';
import { signedIn, useTestApp, type Agent } from './helpers.ts';

const ctx = useTestApp();

async function session(agent: Agent, lotId: number, ambientC = 25, instrument = 'Bench tester A') {
  const res = await agent.post(`/api/lots/${lotId}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument, ambientC, mode: 'sample' }).expect(201);
  return res.body as { id: number };
}

function importCsv(agent: Agent, lotId: number, sessionId: number, csv: string, mapping: object = DEFAULT_MAPPING, units: object = DEFAULT_UNITS) {
  return agent
    .post(`/api/lots/${lotId}/measurements/import`)
    .set('x-csrf-token', agent.csrf)
    .field('sessionId', String(sessionId))
    .field('mapping', JSON.stringify(mapping))
    .field('units', JSON.stringify(units))
    .attach('file', Buffer.from(csv), 'tester.csv');
}

describe('measurement sessions', () => {
  it('starting a session moves a received lot to inspecting and records instrument, ambient and operator', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent, user } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id, 23.5);
    const list = await agent.get(`/api/lots/${f.lot.id}/sessions`).expect(200);
    expect(list.body.sessions[0]).toMatchObject({ id: s.id, instrument: 'Bench tester A', ambientC: 23.5, mode: 'sample', operatorId: user.id, closedAt: null });
    expect((await ctx.ds.getRepository(Lot).findOneByOrFail({ id: f.lot.id })).status).toBe('inspecting');
  });

  it('with an ambient temperature out of range and no instrument, answers 400 naming both fields', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.post(`/api/lots/${f.lot.id}/sessions`).set('x-csrf-token', agent.csrf).send({ ambientC: 120, mode: 'sample' }).expect(400);
    expect(res.body.errors.map((e: { field: string }) => e.field)).toEqual(expect.arrayContaining(['instrument', 'ambientC']));
  });
});

describe('POST /api/lots/:id/measurements (entry grid)', () => {
  it('stores the raw reading and the values referred to 25 °C with the part coefficients, and flags limits', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id, 35);
    // At 35 °C: hFE₂₅ = 330 / (1 + 0.005·10) = 314.29 > 300 → hfe-high; Vbe₂₅ = 620 − (−2)(10) = 640 mV.
    const res = await agent
      .post(`/api/lots/${f.lot.id}/measurements`)
      .set('x-csrf-token', agent.csrf)
      .send({ sessionId: s.id, position: 1, hfe: 330, vbe: 0.62, vbeUnit: 'V' })
      .expect(201);
    expect(res.body).toMatchObject({ position: 1, hfe: 330, vbeMv: 620, ambientC: 35, flags: ['hfe-high'] });
    expect(res.body.hfe25).toBeCloseTo(314.2857, 3);
    expect(res.body.vbeMv25).toBeCloseTo(640, 9);
  });

  it('a second reading for the same position answers 409 naming position', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id);
    const body = { sessionId: s.id, position: 4, hfe: 200, vbe: 650, vbeUnit: 'mV' };
    await agent.post(`/api/lots/${f.lot.id}/measurements`).set('x-csrf-token', agent.csrf).send(body).expect(201);
    const res = await agent.post(`/api/lots/${f.lot.id}/measurements`).set('x-csrf-token', agent.csrf).send(body).expect(409);
    expect(res.body.errors[0].field).toBe('position');
  });

  it('a Vbe of 0.65 stated in mV answers 422 suggesting volts', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id);
    const res = await agent
      .post(`/api/lots/${f.lot.id}/measurements`)
      .set('x-csrf-token', agent.csrf)
      .send({ sessionId: s.id, position: 1, hfe: 200, vbe: 0.65, vbeUnit: 'mV' })
      .expect(422);
    expect(res.body.errors[0]).toMatchObject({ field: 'vbe' });
    expect(res.body.errors[0].message).toMatch(/choose V/);
  });

  it('a correction inserts a new reading that supersedes the old one, which is kept, and is audited', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id);
    const first = await agent.post(`/api/lots/${f.lot.id}/measurements`).set('x-csrf-token', agent.csrf).send({ sessionId: s.id, position: 7, hfe: 20, vbe: 650, vbeUnit: 'mV' }).expect(201);
    const fix = await agent
      .post(`/api/lots/${f.lot.id}/measurements/${first.body.id}/corrections`)
      .set('x-csrf-token', agent.csrf)
      .send({ sessionId: s.id, hfe: 200, vbe: 650, vbeUnit: 'mV', reason: 'typo: 20 for 200' })
      .expect(201);
    expect(fix.body).toMatchObject({ position: 7, hfe: 200, supersedesId: first.body.id, superseded: false, correctionReason: 'typo: 20 for 200' });
    const rows = await ctx.ds.getRepository(Measurement).find({ where: { lotId: f.lot.id }, order: { id: 'ASC' } });
    expect(rows.map((r) => [r.hfe, r.superseded])).toEqual([
      [20, true],
      [200, false],
    ]);
    const current = await agent.get(`/api/lots/${f.lot.id}/measurements`).expect(200);
    expect(current.body.items.map((r: { hfe: number }) => r.hfe)).toEqual([200]);
    const history = await agent.get(`/api/lots/${f.lot.id}/measurements?history=true`).expect(200);
    expect(history.body.total).toBe(2);
    const audit = await ctx.ds.getRepository(AuditEntry).findOneByOrFail({ entityType: 'lot', entityId: String(f.lot.id), action: 'measurement.correct' });
    expect(audit.before).toMatchObject({ hfe: 20 });
    expect(audit.after).toMatchObject({ hfe: 200 });
    // Correcting the superseded reading again is refused.
    await agent
      .post(`/api/lots/${f.lot.id}/measurements/${first.body.id}/corrections`)
      .set('x-csrf-token', agent.csrf)
      .send({ sessionId: s.id, hfe: 210, vbe: 650, vbeUnit: 'mV', reason: 'again' })
      .expect(409);
  });

  it('the database refuses to change or delete a stored reading', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id);
    const r = await agent.post(`/api/lots/${f.lot.id}/measurements`).set('x-csrf-token', agent.csrf).send({ sessionId: s.id, position: 1, hfe: 150, vbe: 650, vbeUnit: 'mV' }).expect(201);
    await expect(ctx.ds.query('UPDATE measurement SET hfe = 151 WHERE id = $1', [r.body.id])).rejects.toThrow(/never changed/);
    await expect(ctx.ds.query('DELETE FROM measurement WHERE id = $1', [r.body.id])).rejects.toThrow(/never deleted/);
  });

  it('lists readings paged and sorted on the server, and only the flagged ones on request', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id);
    for (const [pos, hfe] of [[1, 150], [2, 90], [3, 250], [4, 310]]) {
      await agent.post(`/api/lots/${f.lot.id}/measurements`).set('x-csrf-token', agent.csrf).send({ sessionId: s.id, position: pos, hfe, vbe: 650, vbeUnit: 'mV' }).expect(201);
    }
    const page = await agent.get(`/api/lots/${f.lot.id}/measurements?sort=hfe25&dir=desc&pageSize=2&page=1`).expect(200);
    expect(page.body.total).toBe(4);
    expect(page.body.items.map((r: { hfe: number }) => r.hfe)).toEqual([310, 250]);
    const flagged = await agent.get(`/api/lots/${f.lot.id}/measurements?flagged=true`).expect(200);
    expect(flagged.body.items.map((r: { position: number; flags: string[] }) => [r.position, r.flags])).toEqual([
      [2, ['hfe-low']],
      [4, ['hfe-high']],
    ]);
  });
});

describe('POST /api/lots/:id/measurements/import (tester CSV)', () => {
  const goodRows = (n: number, from = 1): [number, number, number][] => Array.from({ length: n }, (_, i) => [from + i, 150 + i, 0.64]);

  it('with a bad row 17, answers 422 naming row 17 and writes nothing', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id);
    const rows: [number, number | string, number | string][] = goodRows(30);
    rows[16] = [17, 'n/a', 0.64];
    const res = await importCsv(agent, f.lot.id, s.id, testerCsv(rows)).expect(422);
    expect(res.body.errors).toHaveLength(1);
    expect(res.body.errors[0].field).toBe('row 17');
    expect(res.body.errors[0].message).toMatch(/line 18: hFE must be a number/);
    expect(res.body.detail).toMatch(/nothing was imported/);
    expect(await ctx.ds.getRepository(Measurement).countBy({ lotId: f.lot.id })).toBe(0);
  });

  it('lists every bad row with its reason: repeated position, position beyond the lot, implausible Vbe', async () => {
    const f = await makeBenchLot(ctx.ds, { quantity: 50 });
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id);
    const rows: [number, number | string, number | string][] = goodRows(10);
    rows[3] = [3, 150, 0.64];
    rows[5] = [60, 150, 0.64];
    rows[8] = [9, 150, 640];
    const res = await importCsv(agent, f.lot.id, s.id, testerCsv(rows)).expect(422);
    expect(res.body.errors.map((e: { field: string }) => e.field)).toEqual(['row 4', 'row 6', 'row 9']);
    expect(res.body.errors[0].message).toMatch(/position 3 repeats row 3/);
    expect(res.body.errors[1].message).toMatch(/beyond the lot of 50/);
    expect(res.body.errors[2].message).toMatch(/looks like millivolts/);
    expect(await ctx.ds.getRepository(Measurement).countBy({ lotId: f.lot.id })).toBe(0);
  });

  it('a mapping naming a column the file lacks answers 422 naming the mapping field', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id);
    const res = await importCsv(agent, f.lot.id, s.id, testerCsv(goodRows(3)), { ...DEFAULT_MAPPING, hfe: 'Gain' }).expect(422);
    expect(res.body.errors[0]).toMatchObject({ field: 'mapping.hfe' });
  });

  it('imports a good file in one go, normalised to 25 °C, remembers the mapping for the instrument, and audits', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const instrument = `Tester ${Date.now()}`;
    const s = await session(agent, f.lot.id, 30, instrument);
    const csv = `Serial,Pos,HFE,VBE_V,VCESAT\n${goodRows(40).map(([p, h, v]) => `S${p},${p},${h},${v},0.12`).join('\n')}\n`;
    const mapping = { ...DEFAULT_MAPPING, vceSat: 'VCESAT', leakage: null };
    const units = { vbe: 'V', vceSat: 'V', leakage: 'nA' };
    const res = await importCsv(agent, f.lot.id, s.id, csv, mapping, units).expect(201);
    expect(res.body).toMatchObject({ imported: 40, sessionId: s.id });
    const first = await ctx.ds.getRepository(Measurement).findOneByOrFail({ lotId: f.lot.id, position: 1 });
    expect(first).toMatchObject({ hfe: 150, vbeMv: 640, vceSatMv: 120, source: 'import', sourceRow: 1 });
    expect(first.hfe25).toBeCloseTo(150 / 1.025, 9);
    expect(first.vbeMv25).toBeCloseTo(650, 9);
    const remembered = await agent.get(`/api/instrument-mappings/${encodeURIComponent(instrument)}`).expect(200);
    expect(remembered.body).toMatchObject({ mapping, units });
    const audit = await ctx.ds.getRepository(AuditEntry).findOneByOrFail({ entityId: String(f.lot.id), action: 'measurement.import' });
    expect(audit.after).toMatchObject({ rows: 40, instrument });
    // A second file naming a position already measured is refused as a whole.
    const clash = await importCsv(agent, f.lot.id, s.id, testerCsv([[41, 150, 0.64], [5, 150, 0.64]])).expect(422);
    expect(clash.body.errors.map((e: { field: string }) => e.field)).toEqual(['row 2']);
    expect(await ctx.ds.getRepository(Measurement).countBy({ lotId: f.lot.id })).toBe(40);
  });

  it('reports the server-side phase for the client token', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id);
    await agent
      .post(`/api/lots/${f.lot.id}/measurements/import`)
      .set('x-csrf-token', agent.csrf)
      .field('sessionId', String(s.id))
      .field('mapping', JSON.stringify(DEFAULT_MAPPING))
      .field('units', JSON.stringify(DEFAULT_UNITS))
      .field('progressToken', 'token-12345678')
      .attach('file', Buffer.from(testerCsv(goodRows(5))), 'tester.csv')
      .expect(201);
    const p = await agent.get(`/api/lots/${f.lot.id}/measurements/import/progress/token-12345678`).expect(200);
    expect(p.body).toMatchObject({ phase: 'done', done: 5, total: 5 });
  });

  it('without a file answers 400 naming file', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id);
    const res = await agent
      .post(`/api/lots/${f.lot.id}/measurements/import`)
      .set('x-csrf-token', agent.csrf)
      .field('sessionId', String(s.id))
      .field('mapping', JSON.stringify(DEFAULT_MAPPING))
      .field('units', JSON.stringify(DEFAULT_UNITS))
      .expect(400);
    expect(res.body.errors[0].field).toBe('file');
  });
});

describe('GET /api/lots/:id/measurements.csv', () => {
  it('exports the current readings, raw and at 25 °C, with a formula-safe instrument name', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await session(agent, f.lot.id, 25, '=HYPERLINK("x")');
    await agent.post(`/api/lots/${f.lot.id}/measurements`).set('x-csrf-token', agent.csrf).send({ sessionId: s.id, position: 2, hfe: 90, vbe: 650, vbeUnit: 'mV' }).expect(201);
    const res = await agent.get(`/api/lots/${f.lot.id}/measurements.csv`).expect(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const lines = res.text.trim().split('\r\n');
    expect(lines[0]).toMatch(/^position,hfe,vbe_mv,/);
    expect(lines).toHaveLength(2);
    expect(lines[1]).toMatch(/^2,90,650,,,25,90,650,hfe-low,"'=HYPERLINK\(""x""\)",/);
  });
});
