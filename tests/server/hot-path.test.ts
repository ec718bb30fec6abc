import { Store, type SessionData } from 'express-session';
import pg from 'pg';
import { describe, expect, it, vi } from 'vitest';
import { AppError } from '../../server/http/app-error.ts';
import { guardStoreErrors, throttleTouch } from '../../server/http/session-store.ts';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { Lot } from '../../server/modules/lots/lot.entity.ts';
import { makeBenchLot } from './bench-fixtures.ts';
import { signedIn, useTestApp, type Agent } from './helpers.ts';

// The request paths the load bench (scripts/bench-load.ts) drives: recording a reading and the lots list.
const ctx = useTestApp();

async function openSession(agent: Agent, lotId: number): Promise<number> {
  const res = await agent.post(`/api/lots/${lotId}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: 'Bench meter', ambientC: 25, mode: 'sample' }).expect(201);
  return res.body.id as number;
}

function record(agent: Agent, lotId: number, sessionId: number, position: number) {
  return agent.post(`/api/lots/${lotId}/measurements`).set('x-csrf-token', agent.csrf).send({ sessionId, position, hfe: 200 + position, vbe: 650, vbeUnit: 'mV' });
}

const rows = async (lotId: number) => Number(((await ctx.ds.query('SELECT count(*)::int AS n FROM measurement WHERE lot_id = $1', [lotId])) as { n: number }[])[0].n);

describe('recording readings on one lot from many benches at once', () => {
  it('thirty readings of different positions sent together are all stored', async () => {
    const { lot } = await makeBenchLot(ctx.ds, { quantity: 500 });
    const { agent } = await signedIn(ctx, 'inspector');
    const sessionId = await openSession(agent, lot.id);
    const answers = await Promise.all(Array.from({ length: 30 }, (_, i) => record(agent, lot.id, sessionId, i + 1)));
    expect(answers.map((a) => a.status)).toEqual(Array(30).fill(201));
    expect(await rows(lot.id)).toBe(30);
  });

  it('ten readings of the same position sent together: one is stored, nine answer 409 naming position', async () => {
    const { lot } = await makeBenchLot(ctx.ds, { quantity: 500 });
    const { agent } = await signedIn(ctx, 'inspector');
    const sessionId = await openSession(agent, lot.id);
    const answers = await Promise.all(Array.from({ length: 10 }, () => record(agent, lot.id, sessionId, 7)));
    const statuses = answers.map((a) => a.status).sort();
    expect(statuses).toEqual([201, ...Array(9).fill(409)]);
    const stored = answers.find((a) => a.status === 201)!.body.id as string;
    for (const a of answers.filter((x) => x.status === 409)) {
      expect(a.body.errors).toEqual([{ field: 'position', message: 'position 7 already measured' }]);
      expect(a.body.detail).toContain(`#${stored}`);
    }
    expect(await rows(lot.id)).toBe(1);
  });

  it('the first readings of a received lot sent together: no deadlock, the lot moves to inspecting once', async () => {
    const { lot } = await makeBenchLot(ctx.ds, { quantity: 500 });
    const { agent } = await signedIn(ctx, 'inspector');
    const sessionId = await openSession(agent, lot.id);
    // Starting the session already moves the lot; put it back to "received" to race the first readings.
    await ctx.ds.query(`UPDATE lot SET status = 'received' WHERE id = $1`, [lot.id]);
    const before = await ctx.ds.getRepository(AuditEntry).countBy({ entityType: 'lot', entityId: String(lot.id), action: 'lot.status' });
    const answers = await Promise.all(Array.from({ length: 12 }, (_, i) => record(agent, lot.id, sessionId, i + 1)));
    expect(answers.map((a) => a.status)).toEqual(Array(12).fill(201));
    expect((await ctx.ds.getRepository(Lot).findOneByOrFail({ id: lot.id })).status).toBe('inspecting');
    expect(await ctx.ds.getRepository(AuditEntry).countBy({ entityType: 'lot', entityId: String(lot.id), action: 'lot.status' })).toBe(before + 1);
  });

  it('a reading in a session of another lot, or in a closed session, is refused as before', async () => {
    const a = await makeBenchLot(ctx.ds);
    const b = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const sessionOfA = await openSession(agent, a.lot.id);
    const foreign = await record(agent, b.lot.id, sessionOfA, 1).expect(422);
    expect(foreign.body.errors[0].field).toBe('sessionId');
    await agent.post(`/api/lots/${a.lot.id}/sessions/${sessionOfA}/close`).set('x-csrf-token', agent.csrf).send({}).expect(200);
    const closed = await record(agent, a.lot.id, sessionOfA, 1).expect(409);
    expect(closed.body.errors[0]).toEqual({ field: 'sessionId', message: 'session closed' });
    await record(agent, 999_999_999, sessionOfA, 1).expect(404);
  });
});

describe('SQL statements per request on the hot paths', () => {
  async function statementsFor(fn: () => Promise<unknown>): Promise<string[]> {
    const seen: string[] = [];
    const original = pg.Client.prototype.query;
    const spy = vi.spyOn(pg.Client.prototype, 'query').mockImplementation(function (this: pg.Client, ...args: unknown[]) {
      const q = args[0] as string | { text: string };
      seen.push((typeof q === 'string' ? q : q.text).replace(/\s+/g, ' ').slice(0, 60));
      return (original as (...a: unknown[]) => unknown).apply(this, args) as never;
    });
    try {
      await fn();
    } finally {
      spy.mockRestore();
    }
    return seen;
  }

  it('recording a reading takes 7: session, user, begin, session of the lot, locked lot with part type, insert, commit', async () => {
    const { lot } = await makeBenchLot(ctx.ds, { quantity: 500 });
    const { agent } = await signedIn(ctx, 'inspector');
    const sessionId = await openSession(agent, lot.id);
    await record(agent, lot.id, sessionId, 1).expect(201); // the session's expiry is touched on this one
    const seen = await statementsFor(() => record(agent, lot.id, sessionId, 2).expect(201));
    expect(seen, seen.join('\n')).toHaveLength(7);
    expect(seen.filter((q) => /^UPDATE "session"/.test(q))).toEqual([]);
  });

  it('reading the lots list takes 4: session, user, one page with supplier and part type, the count', async () => {
    await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'buyer');
    await agent.get('/api/lots').expect(200);
    const seen = await statementsFor(() => agent.get('/api/lots?pageSize=10').expect(200));
    expect(seen, seen.join('\n')).toHaveLength(4);
    expect(seen.filter((q) => q.includes('DISTINCT "distinctAlias"'))).toEqual([]);
  });
});

class FakeStore extends Store {
  touches = 0;
  getError: unknown = null;
  get(_sid: string, cb: (err: unknown, session?: SessionData | null) => void) {
    cb(this.getError, null);
  }
  set(_sid: string, _s: SessionData, cb?: (err?: unknown) => void) {
    cb?.();
  }
  destroy(_sid: string, cb?: (err?: unknown) => void) {
    cb?.();
  }
  touch(_sid: string, _s: SessionData, cb?: (err?: unknown) => void) {
    this.touches++;
    cb?.();
  }
}

describe('session store wrappers', () => {
  it('throttleTouch writes the expiry of a session at most once per interval, and always calls back', () => {
    const now = vi.spyOn(Date, 'now').mockReturnValue(1_000_000);
    try {
      const store = throttleTouch(new FakeStore(), 60_000);
      const done = vi.fn();
      const sess = {} as SessionData;
      store.touch!('a', sess, done);
      store.touch!('a', sess, done);
      store.touch!('b', sess, done);
      expect(store.touches).toBe(2);
      now.mockReturnValue(1_000_000 + 59_999);
      store.touch!('a', sess, done);
      expect(store.touches).toBe(2);
      now.mockReturnValue(1_000_000 + 60_000);
      store.touch!('a', sess, done);
      expect(store.touches).toBe(3);
      expect(done).toHaveBeenCalledTimes(5);
    } finally {
      now.mockRestore();
    }
  });

  it('guardStoreErrors turns a vanished PostgreSQL socket (ENOENT on connect) into the 503 problem, not "no session"', () => {
    const store = guardStoreErrors(new FakeStore());
    store.getError = Object.assign(new Error('connect ENOENT /tmp/.s.PGSQL.5432'), { code: 'ENOENT', syscall: 'connect' });
    let got: unknown;
    store.get('x', (err) => (got = err));
    expect(got).toBeInstanceOf(AppError);
    expect(got).toMatchObject({ status: 503, code: 'database-unavailable' });
    // A missing session (no error) stays a missing session.
    store.getError = null;
    store.get('x', (err) => (got = err));
    expect(got).toBeNull();
  });
});
