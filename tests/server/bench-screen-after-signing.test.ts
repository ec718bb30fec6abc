/**
 * Screening after a signed disposition: a lot whose signed disposition is MRB "100 % screen"
 * (`screen-100`) takes 100 % screening sessions, their readings, corrections and imports; it
 * never takes a sample session again, and every other signed disposition keeps the lot closed.
 */
import { describe, expect, it } from 'vitest';
import type { LotScreening } from '../../shared/api/bins.ts';
import type { MeasurementRow } from '../../shared/api/measurements.ts';
import { ROLES } from '../../shared/api/roles.ts';
import { Lot } from '../../server/modules/lots/lot.entity.ts';
import { DEFAULT_MAPPING, DEFAULT_UNITS, makeBenchLot, testerCsv, type BenchFixture } from './bench-fixtures.ts';
import { agentFor, makeUser, signedIn, useTestApp, type Agent } from './helpers.ts';

const ctx = useTestApp();

const BINS = [
  { code: 'A', hfeMin: 100, hfeMax: 200 },
  { code: 'B', hfeMin: 200, hfeMax: 300 },
];

const send = (a: Agent, url: string, body: object) => a.post(url).set('x-csrf-token', a.csrf).send(body);
const startSession = (a: Agent, lotId: number, mode: 'sample' | 'screen') => send(a, `/api/lots/${lotId}/sessions`, { instrument: 'Bench tester S', ambientC: 25, mode });
const record = (a: Agent, lotId: number, sessionId: number, position: number, hfe: number) => send(a, `/api/lots/${lotId}/measurements`, { sessionId, position, hfe, vbe: 650, vbeUnit: 'mV' });
const importCsv = (a: Agent, lotId: number, sessionId: number, rows: [number, number, number][]) =>
  a
    .post(`/api/lots/${lotId}/measurements/import`)
    .set('x-csrf-token', a.csrf)
    .field('sessionId', String(sessionId))
    .field('mapping', JSON.stringify(DEFAULT_MAPPING))
    .field('units', JSON.stringify(DEFAULT_UNITS))
    .attach('file', Buffer.from(testerCsv(rows)), 't.csv');

interface SignedLot {
  f: BenchFixture;
  inspector: Agent;
  /** Ids of the sample readings (positions 1–5) the disposition rests on. */
  sample: MeasurementRow[];
}

/** A lot of 40 with a gain-bin scheme: five parts sampled, the disposition proposed and signed as asked. */
async function signedLot(decision: 'accept' | 'reject' | 'mrb', mrbAction: string | null = null): Promise<SignedLot> {
  const f = await makeBenchLot(ctx.ds, { quantity: 40, bins: BINS });
  const { agent: inspector } = await signedIn(ctx, 'inspector');
  const { agent: qe } = await signedIn(ctx, 'quality');
  const s = await startSession(inspector, f.lot.id, 'sample').expect(201);
  const sample: MeasurementRow[] = [];
  for (const [i, hfe] of [150, 160, 170, 180, 190].entries()) sample.push((await record(inspector, f.lot.id, s.body.id, i + 1, hfe).expect(201)).body);
  const body = { decision, ...(mrbAction ? { mrbAction } : {}), reason: 'Decided for the test.' };
  await send(inspector, `/api/lots/${f.lot.id}/disposition`, body).expect(200);
  await send(qe, `/api/lots/${f.lot.id}/disposition/sign`, body).expect(200);
  return { f, inspector, sample };
}

const screening = async (a: Agent, lotId: number) => (await a.get(`/api/lots/${lotId}/screening`).expect(200)).body as LotScreening;

describe('after a signed MRB "100 % screen" disposition', () => {
  it('a screening session starts; its readings are recorded and placed into bins; a screening reading can be corrected; a tester import goes in; the lot stays MRB', async () => {
    const { f, inspector } = await signedLot('mrb', 'screen-100');
    expect((await screening(inspector, f.lot.id)).benchWork).toBe('screen-only');
    const session = await startSession(inspector, f.lot.id, 'screen');
    expect(session.status).toBe(201);
    expect(session.body.mode).toBe('screen');
    for (const [i, hfe] of [120, 250, 130].entries()) expect((await record(inspector, f.lot.id, session.body.id, 6 + i, hfe)).status).toBe(201);
    const afterGrid = await screening(inspector, f.lot.id);
    expect(afterGrid).toMatchObject({ screened: 3, placed: 3, unplaced: 0 });
    expect(afterGrid.bins.map((b) => [b.code, b.count])).toEqual([
      ['A', 2],
      ['B', 1],
    ]);

    // A corrected screening reading moves to its new bin.
    const rows = (await inspector.get(`/api/lots/${f.lot.id}/measurements?pageSize=50`).expect(200)).body.items as MeasurementRow[];
    const part7 = rows.find((r) => r.position === 7)!;
    const corrected = await send(inspector, `/api/lots/${f.lot.id}/measurements/${part7.id}/corrections`, { sessionId: session.body.id, hfe: 140, vbe: 650, vbeUnit: 'mV', reason: 'Probe slipped.' });
    expect(corrected.status).toBe(201);
    const afterCorrection = await screening(inspector, f.lot.id);
    expect(afterCorrection.bins.map((b) => [b.code, b.count])).toEqual([
      ['A', 3],
      ['B', 0],
    ]);

    const imported = await importCsv(inspector, f.lot.id, session.body.id, [
      [9, 110, 0.65],
      [10, 210, 0.66],
    ]);
    expect(imported.status).toBe(201);
    expect(await screening(inspector, f.lot.id)).toMatchObject({ screened: 5, placed: 5 });
    expect((await ctx.ds.getRepository(Lot).findOneByOrFail({ id: f.lot.id })).status).toBe('mrb');
    const [audit] = (await ctx.ds.query(`SELECT count(*)::int AS n FROM audit_entry WHERE entity_type = 'lot' AND entity_id = $1 AND action = 'session.start'`, [String(f.lot.id)])) as { n: number }[];
    expect(audit!.n).toBe(2); // the sample session before signing and the screening session after
  });

  it('a sample session is refused with 409 naming mode, and nothing is started', async () => {
    const { f, inspector } = await signedLot('mrb', 'screen-100');
    const res = await startSession(inspector, f.lot.id, 'sample');
    expect(res.status).toBe(409);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(res.body.detail).toContain('100 % screen');
    expect(res.body.detail).toContain('only 100 % screening sessions');
    expect(res.body.errors[0].field).toBe('mode');
    const [{ n }] = (await ctx.ds.query(`SELECT count(*)::int AS n FROM measurement_session WHERE lot_id = $1 AND closed_at IS NULL`, [f.lot.id])) as { n: number }[];
    expect(n).toBe(0);
  });

  it('a sample reading the disposition rests on cannot be corrected from a screening session (409 naming measurementId)', async () => {
    const { f, inspector, sample } = await signedLot('mrb', 'screen-100');
    const session = await startSession(inspector, f.lot.id, 'screen').expect(201);
    const res = await send(inspector, `/api/lots/${f.lot.id}/measurements/${sample[0]!.id}/corrections`, { sessionId: session.body.id, hfe: 155, vbe: 650, vbeUnit: 'mV', reason: 'Try to change the sample.' });
    expect(res.status).toBe(409);
    expect(res.body.errors[0].field).toBe('measurementId');
    expect(res.body.detail).toMatch(/sample the signed disposition/);
    const [{ superseded }] = (await ctx.ds.query(`SELECT superseded FROM measurement WHERE id = $1`, [sample[0]!.id])) as { superseded: boolean }[];
    expect(superseded).toBe(false);
  });

  it('only inspectors and quality engineers start the screening session; buyers and assemblers get 403', async () => {
    const { f } = await signedLot('mrb', 'screen-100');
    for (const role of ROLES) {
      const agent = await agentFor(ctx.app, await makeUser(ctx.ds, role));
      const res = await startSession(agent, f.lot.id, 'screen');
      expect([role, res.status]).toEqual([role, role === 'inspector' || role === 'quality' ? 201 : 403]);
    }
  });
});

describe('after any other signed disposition the lot stays closed', () => {
  it.each([
    ['accept', null],
    ['reject', null],
    ['mrb', 'return-to-supplier'],
    ['mrb', 'use-as-is'],
    ['mrb', 'scrap'],
  ] as const)('%s, MRB action %s: a screening session is refused with 409 saying screening needs the MRB screen-100 disposition; a sample session too', async (decision, action) => {
    const { f, inspector } = await signedLot(decision, action);
    expect((await screening(inspector, f.lot.id)).benchWork).toBe('closed');
    const res = await startSession(inspector, f.lot.id, 'screen');
    expect(res.status).toBe(409);
    expect(res.body.detail).toMatch(/its disposition is signed and its measurements are closed/);
    expect(res.body.detail).toMatch(/only when the signed disposition is MRB "100 % screen"/);
    expect(res.body.errors[0].field).toBe('mode');
    const sample = await startSession(inspector, f.lot.id, 'sample');
    expect(sample.status).toBe(409);
    expect(sample.body.detail).toMatch(/measurements are closed/);
  });

  it('before signing both modes start and the lot says so (benchWork open)', async () => {
    const f = await makeBenchLot(ctx.ds, { quantity: 40, bins: BINS });
    const { agent } = await signedIn(ctx, 'inspector');
    expect((await screening(agent, f.lot.id)).benchWork).toBe('open');
    expect((await startSession(agent, f.lot.id, 'sample')).status).toBe(201);
    expect((await startSession(agent, f.lot.id, 'screen')).status).toBe(201);
  });
});
