import pg from 'pg';
import { describe, expect, it, vi } from 'vitest';
import type { SessionUser } from '../../shared/api/auth.ts';
import type { MeasurementRow, RecordMeasurementRequest } from '../../shared/api/measurements.ts';
import { AppError } from '../../server/http/app-error.ts';
import { ReadingBatcher } from '../../server/modules/measurements/reading-batcher.ts';
import { startSession } from '../../server/modules/measurements/sessions.service.ts';
import { toSessionUser } from '../../server/modules/users/users.service.ts';
import { makeBenchLot } from './bench-fixtures.ts';
import { makeUser, signedIn, useTestApp, type Agent } from './helpers.ts';

// Group commit of grid readings (server/modules/measurements/reading-batcher.ts): readings that
// arrive together are written by one transaction, and each request still gets its own answer.
const ctx = useTestApp();

async function measuringLot(quantity = 100): Promise<{ lotId: number; sessionId: number; actor: SessionUser }> {
  const { lot } = await makeBenchLot(ctx.ds, { quantity, status: 'inspecting' });
  const actor = toSessionUser(await makeUser(ctx.ds, 'inspector'));
  const session = await startSession(ctx.ds, actor, lot.id, { instrument: 'Batch meter', ambientC: 35, mode: 'sample' });
  return { lotId: lot.id, sessionId: session.id, actor };
}

const reading = (sessionId: number, position: number, hfe = 200 + position): RecordMeasurementRequest => ({ sessionId, position, hfe, vbe: 0.65, vbeUnit: 'V' });

/** Settles every promise; a synchronous throw of record() (a refused reading) counts as a rejection. */
function settle(calls: (() => Promise<MeasurementRow>)[]): Promise<PromiseSettledResult<MeasurementRow>[]> {
  const started = calls.map((call) => {
    try {
      return call();
    } catch (e) {
      return Promise.reject(e);
    }
  });
  return Promise.allSettled(started);
}

const stored = async (lotId: number) =>
  (await ctx.ds.query('SELECT id, position, hfe, hfe_25, created_by FROM measurement WHERE lot_id = $1 ORDER BY position, id', [lotId])) as {
    id: string;
    position: number;
    hfe: number;
    hfe_25: number;
    created_by: number;
  }[];

function problemOf(r: PromiseSettledResult<MeasurementRow>): AppError {
  expect(r.status).toBe('rejected');
  const reason = (r as PromiseRejectedResult).reason as unknown;
  expect(reason).toBeInstanceOf(AppError);
  return reason as AppError;
}

describe('ReadingBatcher', () => {
  it('twenty readings queued together are written by one transaction; a taken position, a repeated one, a refused reading and one beyond the lot each get their own answer', async () => {
    const { lotId, sessionId, actor } = await measuringLot(100);
    const batcher = new ReadingBatcher(ctx.ds);
    const first = await batcher.record(actor, lotId, reading(sessionId, 50));
    expect(batcher.stats).toMatchObject({ batches: 1, batched: 1 });

    const seen: string[] = [];
    const original = pg.Client.prototype.query;
    const spy = vi.spyOn(pg.Client.prototype, 'query').mockImplementation(function (this: pg.Client, ...args: unknown[]) {
      const q = args[0] as string | { text: string };
      seen.push((typeof q === 'string' ? q : q.text).trim().slice(0, 30));
      return (original as (...a: unknown[]) => unknown).apply(this, args) as never;
    });
    let results: PromiseSettledResult<MeasurementRow>[];
    try {
      // All queued in one turn of the event loop: they leave in one batch.
      results = await settle([
        ...Array.from({ length: 20 }, (_, i) => () => batcher.record(actor, lotId, reading(sessionId, i + 1))),
        () => batcher.record(actor, lotId, reading(sessionId, 50)), // 20: already stored
        () => batcher.record(actor, lotId, reading(sessionId, 3, 999)), // 21: same position as #2 in this batch
        () => batcher.record(actor, lotId, reading(sessionId, 30, -5)), // 22: refused before queueing
        () => batcher.record(actor, lotId, reading(sessionId, 101)), // 23: beyond the lot of 100
      ]);
    } finally {
      spy.mockRestore();
    }

    const rows = await stored(lotId);
    const idOf = (position: number) => rows.filter((r) => r.position === position).map((r) => r.id);
    for (let i = 0; i < 20; i++) {
      const r = results[i];
      expect(r.status, `position ${i + 1}`).toBe('fulfilled');
      const row = (r as PromiseFulfilledResult<MeasurementRow>).value;
      expect(row).toMatchObject({ position: i + 1, sessionId, hfe: 201 + i, ambientC: 35, createdByName: actor.name, source: 'grid', superseded: false });
      expect(idOf(i + 1)).toEqual([row.id]);
      // Referred to 25 °C with the part type's +0.5 %/°C (bench-fixtures): 10 °C above.
      expect(row.hfe25).toBeCloseTo(rows.find((x) => x.id === row.id)!.hfe_25, 9);
      expect(row.hfe25).toBeLessThan(row.hfe);
    }
    const taken = problemOf(results[20]);
    expect(taken.status).toBe(409);
    expect(taken.errors).toEqual([{ field: 'position', message: 'position 50 already measured' }]);
    expect(taken.detail).toContain(`#${first.id}`);
    const repeated = problemOf(results[21]);
    expect(repeated.status).toBe(409);
    expect(repeated.detail).toContain(`#${idOf(3)[0]}`);
    expect(rows.find((r) => r.position === 3)!.hfe).toBe(203);
    const refused = problemOf(results[22]);
    expect(refused.status).toBe(422);
    expect(refused.errors?.[0].field).toBe('hfe');
    const beyond = problemOf(results[23]);
    expect(beyond.status).toBe(422);
    expect(beyond.errors).toEqual([{ field: 'position', message: 'position must be 1–100' }]);

    expect(rows).toHaveLength(21);
    expect(new Set(rows.map((r) => r.position)).size).toBe(21);
    expect(rows.every((r) => r.created_by === actor.id)).toBe(true);
    // Batch 2: twenty readings, the taken position and the one beyond the lot (sent on alone
    // afterwards). Batch 3: the repeated position, which waits for batch 2 to commit.
    expect(batcher.stats).toMatchObject({ batches: 3, largestBatch: 22, single: 1, failedBatches: 0 });
    // The lot's context is known from batch 1: batch 2's twenty readings go in by one statement
    // (no transaction block); the taken position then gets the full transaction, which finds the
    // reading it collides with. Batch 3 likewise: its one-statement insert collides, and the full
    // transaction answers it.
    expect(seen.filter((q) => q === 'BEGIN')).toHaveLength(2);
    expect(seen.filter((q) => q.startsWith('INSERT INTO measurement'))).toHaveLength(4);
    expect(seen.filter((q) => q.startsWith('SELECT m.id, m.lot_id'))).toHaveLength(2);
  });

  it('a lot whose context changed after a batch read it: the one-statement insert stores nothing, and the full write answers with the new context', async () => {
    const { lotId, sessionId, actor } = await measuringLot(100);
    const batcher = new ReadingBatcher(ctx.ds);
    await batcher.record(actor, lotId, reading(sessionId, 1)); // reads and keeps the context
    const partTypeId = ((await ctx.ds.query('SELECT part_type_id FROM lot WHERE id = $1', [lotId])) as { part_type_id: number }[])[0].part_type_id;

    // The part type's temperature coefficient changes: the reading is referred to 25 °C with the
    // new one, not the kept one.
    await ctx.ds.query('UPDATE part_type SET hfe_tc_pct_per_c = 0 WHERE id = $1', [partTypeId]);
    const changed = await batcher.record(actor, lotId, reading(sessionId, 2));
    expect(changed.hfe25).toBeCloseTo(202, 9); // 0 %/°C: the same as measured at 35 °C
    expect((await stored(lotId)).find((r) => r.position === 2)!.hfe_25).toBeCloseTo(202, 9);
    // Its hFE limits change: the answer flags the reading against the new limits.
    await ctx.ds.query('UPDATE part_type SET hfe_min = 250 WHERE id = $1', [partTypeId]);
    expect((await batcher.record(actor, lotId, reading(sessionId, 6))).flags).toContain('hfe-low');

    // A quantity cut below the next position: refused as beyond the lot, as before.
    await ctx.ds.query('UPDATE lot SET quantity = 2 WHERE id = $1', [lotId]);
    const beyond = problemOf((await settle([() => batcher.record(actor, lotId, reading(sessionId, 3))]))[0]);
    expect(beyond.status).toBe(422);
    await ctx.ds.query('UPDATE lot SET quantity = 100 WHERE id = $1', [lotId]);
    await batcher.record(actor, lotId, reading(sessionId, 3));

    // The session closed through another path: refused as a closed session.
    await ctx.ds.query('UPDATE measurement_session SET closed_at = now() WHERE id = $1', [sessionId]);
    const closed = problemOf((await settle([() => batcher.record(actor, lotId, reading(sessionId, 4))]))[0]);
    expect(closed.status).toBe(409);
    expect(closed.errors).toEqual([{ field: 'sessionId', message: 'session closed' }]);
    await ctx.ds.query('UPDATE measurement_session SET closed_at = NULL WHERE id = $1', [sessionId]);
    await batcher.record(actor, lotId, reading(sessionId, 7)); // the kept context is current again

    // The lot decided meanwhile (no longer inspecting): refused as the full path refuses it.
    await ctx.ds.query(`UPDATE lot SET status = 'accepted' WHERE id = $1`, [lotId]);
    const decided = problemOf((await settle([() => batcher.record(actor, lotId, reading(sessionId, 5))]))[0]);
    expect(decided.status).toBe(409);
    expect((await stored(lotId)).map((r) => r.position)).toEqual([1, 2, 3, 6, 7]);
  });

  it('the first readings of a received lot queued together: one moves the lot to inspecting, the others wait for it and go in one batch', async () => {
    const { lotId, sessionId, actor } = await measuringLot(100);
    await ctx.ds.query(`UPDATE lot SET status = 'received' WHERE id = $1`, [lotId]);
    const audits = async () => Number(((await ctx.ds.query(`SELECT count(*)::int AS n FROM audit_entry WHERE entity_type = 'lot' AND entity_id = $1 AND action = 'lot.status'`, [String(lotId)])) as { n: number }[])[0].n);
    const before = await audits();
    const batcher = new ReadingBatcher(ctx.ds);
    const results = await settle(Array.from({ length: 12 }, (_, i) => () => batcher.record(actor, lotId, reading(sessionId, i + 1))));
    expect(results.map((r) => r.status)).toEqual(Array(12).fill('fulfilled'));
    expect((await stored(lotId)).map((r) => r.position)).toEqual(Array.from({ length: 12 }, (_, i) => i + 1));
    expect(((await ctx.ds.query('SELECT status FROM lot WHERE id = $1', [lotId])) as { status: string }[])[0].status).toBe('inspecting');
    expect(await audits()).toBe(before + 1);
    // Batch 1: the context says "received": one reading moves the lot, eleven wait. Batch 2: the eleven.
    expect(batcher.stats).toMatchObject({ batches: 2, single: 1, batched: 11, largestBatch: 12 });
  });

  it('a batch the database refuses is retried reading by reading: the refused one fails with its error, the others are stored, none is answered before it is stored', async () => {
    const { lotId, sessionId, actor } = await measuringLot();
    const fn = `test_refuse_batch_${lotId}`;
    await ctx.ds.query(`CREATE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RAISE EXCEPTION 'refused by the test'; END $$`);
    await ctx.ds.query(`CREATE TRIGGER ${fn} BEFORE INSERT ON measurement FOR EACH ROW WHEN (NEW.lot_id = ${lotId} AND NEW.position = 4) EXECUTE FUNCTION ${fn}()`);
    const batcher = new ReadingBatcher(ctx.ds);
    let results: PromiseSettledResult<MeasurementRow>[];
    try {
      results = await settle(Array.from({ length: 8 }, (_, i) => () => batcher.record(actor, lotId, reading(sessionId, i + 1))));
    } finally {
      await ctx.ds.query(`DROP TRIGGER ${fn} ON measurement`);
      await ctx.ds.query(`DROP FUNCTION ${fn}()`);
    }
    expect(batcher.stats).toMatchObject({ batches: 1, failedBatches: 1, single: 8, batched: 0 });
    expect(results.map((r) => r.status)).toEqual(['fulfilled', 'fulfilled', 'fulfilled', 'rejected', 'fulfilled', 'fulfilled', 'fulfilled', 'fulfilled']);
    expect(String((results[3] as PromiseRejectedResult).reason)).toMatch(/refused by the test/);
    const rows = await stored(lotId);
    expect(rows.map((r) => r.position)).toEqual([1, 2, 3, 5, 6, 7, 8]);
    for (const r of results.filter((x) => x.status === 'fulfilled')) {
      const row = (r as PromiseFulfilledResult<MeasurementRow>).value;
      expect(rows.find((x) => x.position === row.position)?.id).toBe(row.id);
    }
  });

  it('when the connection breaks during the insert, every reading of the batch fails with the 503 problem and none is stored', async () => {
    const { lotId, sessionId, actor } = await measuringLot();
    const batcher = new ReadingBatcher(ctx.ds);
    const original = pg.Client.prototype.query;
    const spy = vi.spyOn(pg.Client.prototype, 'query').mockImplementation(function (this: pg.Client, ...args: unknown[]) {
      const q = args[0] as string | { text: string };
      if ((typeof q === 'string' ? q : q.text).trim().startsWith('INSERT INTO measurement')) {
        return Promise.reject(Object.assign(new Error('read ECONNRESET'), { code: 'ECONNRESET', syscall: 'read' })) as never;
      }
      return (original as (...a: unknown[]) => unknown).apply(this, args) as never;
    });
    let results: PromiseSettledResult<MeasurementRow>[];
    try {
      results = await settle(Array.from({ length: 8 }, (_, i) => () => batcher.record(actor, lotId, reading(sessionId, i + 1))));
    } finally {
      spy.mockRestore();
    }
    for (const r of results) {
      expect(r.status).toBe('rejected');
      expect((r as PromiseRejectedResult).reason).toMatchObject({ code: 'ECONNRESET' });
    }
    expect(await stored(lotId)).toEqual([]);
    expect(batcher.stats).toMatchObject({ batches: 1, single: 0 });
  });
});

describe('POST /api/lots/:id/measurements from many benches at once', () => {
  async function openSession(agent: Agent, lotId: number): Promise<number> {
    const res = await agent.post(`/api/lots/${lotId}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: 'Bench meter', ambientC: 25, mode: 'sample' }).expect(201);
    return res.body.id as number;
  }
  const post = (agent: Agent, lotId: number, body: object) => agent.post(`/api/lots/${lotId}/measurements`).set('x-csrf-token', agent.csrf).send(body);

  it('forty readings sent together, one repeating a position, one with a bad unit and one implausible, each answered right and stored exactly once', async () => {
    const { lot } = await makeBenchLot(ctx.ds, { quantity: 200 });
    const { agent } = await signedIn(ctx, 'inspector');
    const sessionId = await openSession(agent, lot.id);
    await post(agent, lot.id, { sessionId, position: 1, hfe: 150, vbe: 650, vbeUnit: 'mV' }).expect(201);

    const bodies: object[] = Array.from({ length: 40 }, (_, i) => ({ sessionId, position: i + 2, hfe: 150 + i, vbe: 650, vbeUnit: 'mV' }));
    bodies.push({ sessionId, position: 1, hfe: 151, vbe: 650, vbeUnit: 'mV' }); // 40: position 1 is taken
    bodies.push({ sessionId, position: 60, hfe: 150, vbe: 650, vbeUnit: 'kV' }); // 41: unknown unit
    bodies.push({ sessionId, position: 61, hfe: 150, vbe: 0.65, vbeUnit: 'mV' }); // 42: volts typed as mV
    const answers = await Promise.all(bodies.map((b) => post(agent, lot.id, b)));

    const rows = (await ctx.ds.query('SELECT id, position FROM measurement WHERE lot_id = $1', [lot.id])) as { id: string; position: number }[];
    const byPosition = new Map(rows.map((r) => [r.position, r.id]));
    for (let i = 0; i < 40; i++) {
      expect(answers[i].status, `position ${i + 2}: ${JSON.stringify(answers[i].body)}`).toBe(201);
      expect(answers[i].body).toMatchObject({ position: i + 2, hfe: 150 + i });
      expect(byPosition.get(i + 2)).toBe(answers[i].body.id);
    }
    expect(answers[40].status).toBe(409);
    expect(answers[40].body.errors).toEqual([{ field: 'position', message: 'position 1 already measured' }]);
    expect(answers[40].body.detail).toContain(`#${byPosition.get(1)}`);
    expect(answers[41].status).toBe(400);
    expect(answers[41].body.errors.map((e: { field: string }) => e.field)).toEqual(['vbeUnit']);
    expect(answers[42].status).toBe(422);
    expect(answers[42].body.errors[0].field).toBe('vbe');
    expect(answers[42].body.errors[0].message).toMatch(/looks like volts/);
    expect(rows).toHaveLength(41);
    expect(new Set(rows.map((r) => r.position)).size).toBe(41);
  });

  it('when the database refuses the batch, every request answers a 500 problem, none answers 2xx, and nothing is stored', async () => {
    const { lot } = await makeBenchLot(ctx.ds, { quantity: 200 });
    const { agent } = await signedIn(ctx, 'inspector');
    const sessionId = await openSession(agent, lot.id);
    // A trigger of this lot only (other test files write readings at the same time).
    const fn = `test_refuse_lot_${lot.id}`;
    await ctx.ds.query(`CREATE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RAISE EXCEPTION 'refused by the test'; END $$`);
    await ctx.ds.query(`CREATE TRIGGER ${fn} BEFORE INSERT ON measurement FOR EACH ROW WHEN (NEW.lot_id = ${lot.id}) EXECUTE FUNCTION ${fn}()`);
    const error = vi.spyOn(console, 'error').mockImplementation(() => {});
    try {
      const answers = await Promise.all(Array.from({ length: 12 }, (_, i) => post(agent, lot.id, { sessionId, position: i + 1, hfe: 150, vbe: 650, vbeUnit: 'mV' })));
      for (const a of answers) {
        expect(a.status).toBe(500);
        expect(a.headers['content-type']).toMatch(/application\/problem\+json/);
        expect(a.body).toMatchObject({ status: 500, code: 'internal' });
      }
    } finally {
      error.mockRestore();
      await ctx.ds.query(`DROP TRIGGER ${fn} ON measurement`);
      await ctx.ds.query(`DROP FUNCTION ${fn}()`);
    }
    expect(await ctx.ds.query('SELECT id FROM measurement WHERE lot_id = $1', [lot.id])).toEqual([]);
  });

  it('when the database refuses one reading of a batch, only that request fails; the others are stored', async () => {
    const { lot } = await makeBenchLot(ctx.ds, { quantity: 200 });
    const { agent } = await signedIn(ctx, 'inspector');
    const sessionId = await openSession(agent, lot.id);
    const fn = `test_refuse_part_${lot.id}`;
    await ctx.ds.query(`CREATE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RAISE EXCEPTION 'refused by the test'; END $$`);
    await ctx.ds.query(`CREATE TRIGGER ${fn} BEFORE INSERT ON measurement FOR EACH ROW WHEN (NEW.lot_id = ${lot.id} AND NEW.position = 7) EXECUTE FUNCTION ${fn}()`);
    const error = vi.spyOn(console, 'error').mockImplementation(() => {});
    let answers: { status: number }[];
    try {
      answers = await Promise.all(Array.from({ length: 12 }, (_, i) => post(agent, lot.id, { sessionId, position: i + 1, hfe: 150, vbe: 650, vbeUnit: 'mV' })));
    } finally {
      error.mockRestore();
      await ctx.ds.query(`DROP TRIGGER ${fn} ON measurement`);
      await ctx.ds.query(`DROP FUNCTION ${fn}()`);
    }
    expect(answers.map((a) => a.status)).toEqual(Array.from({ length: 12 }, (_, i) => (i + 1 === 7 ? 500 : 201)));
    const positions = ((await ctx.ds.query('SELECT position FROM measurement WHERE lot_id = $1 ORDER BY position', [lot.id])) as { position: number }[]).map((r) => r.position);
    expect(positions).toEqual([1, 2, 3, 4, 5, 6, 8, 9, 10, 11, 12]);
  });
});
