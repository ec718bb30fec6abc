import type { SessionData, Store } from 'express-session';
import pg from 'pg';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { AppError } from '../../server/http/app-error.ts';
import { cacheSessions, guardStoreErrors, throttleTouch } from '../../server/http/session-store.ts';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { Lot } from '../../server/modules/lots/lot.entity.ts';
import { makeBenchLot } from './bench-fixtures.ts';
import { createApp } from '../../server/app.ts';
import request from 'supertest';
import { signedIn, useTestApp, type Agent, type TestContext } from './helpers.ts';
import { FakeStore } from './fake-session-store.ts';

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
  // An app whose session and user cache outlives the test, so the counts do not depend on how
  // fast the machine is (the default keeps them for 2 s, authCacheMs), and one without the cache.
  let cached: TestContext;
  let uncached: TestContext;
  beforeAll(() => {
    cached = { ds: ctx.ds, app: createApp({ dataSource: ctx.ds, authCacheMs: 60_000 }) };
    uncached = { ds: ctx.ds, app: createApp({ dataSource: ctx.ds, authCacheMs: 0 }) };
  });

  async function statementsFor(fn: () => Promise<unknown>): Promise<string[]> {
    const seen: string[] = [];
    const original = pg.Client.prototype.query;
    const spy = vi.spyOn(pg.Client.prototype, 'query').mockImplementation(function (this: pg.Client, ...args: unknown[]) {
      const q = args[0] as string | { text: string };
      seen.push((typeof q === 'string' ? q : q.text).replace(/\s+/g, ' ').trim().slice(0, 60));
      return (original as (...a: unknown[]) => unknown).apply(this, args) as never;
    });
    try {
      await fn();
    } finally {
      spy.mockRestore();
    }
    return seen;
  }

  it('recording a reading takes 1 statement with the session, the user and the lot cached: the insert that checks the lot, session and part type under a shared lock', async () => {
    const { lot } = await makeBenchLot(ctx.ds, { quantity: 500, status: 'inspecting' });
    const { agent } = await signedIn(cached, 'inspector');
    const sessionId = await openSession(agent, lot.id);
    // The first reading reads and caches the session and the user, touches the expiry, and reads
    // the lot's context in its transaction (begin, lot + session + part type, insert, commit).
    const first = await statementsFor(() => record(agent, lot.id, sessionId, 1).expect(201));
    expect(first.filter((q) => /^(BEGIN|COMMIT)$/.test(q)), first.join('\n')).toEqual(['BEGIN', 'COMMIT']);
    expect(first.some((q) => /^SELECT s\.id AS session_id/.test(q)), first.join('\n')).toBe(true);
    const seen = await statementsFor(() => record(agent, lot.id, sessionId, 2).expect(201));
    expect(seen, seen.join('\n')).toHaveLength(1);
    expect(seen[0]).toMatch(/^INSERT INTO measurement/);
  });

  it('without the cache, recording a reading takes 3: the session row and the user, then the same insert', async () => {
    const { lot } = await makeBenchLot(ctx.ds, { quantity: 500, status: 'inspecting' });
    const { agent } = await signedIn(uncached, 'inspector');
    const sessionId = await openSession(agent, lot.id);
    await record(agent, lot.id, sessionId, 1).expect(201);
    const seen = await statementsFor(() => record(agent, lot.id, sessionId, 2).expect(201));
    expect(seen, seen.join('\n')).toHaveLength(3);
    expect(seen[2]).toMatch(/^INSERT INTO measurement/);
    expect(seen.filter((q) => /^UPDATE "session"/.test(q))).toEqual([]);
  });

  it('reading the lots list takes 1 with the session and user cached: the page with supplier, part type and the total', async () => {
    await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(cached, 'buyer');
    const first = await agent.get('/api/lots?pageSize=10').expect(200);
    const seen = await statementsFor(() => agent.get('/api/lots?pageSize=10').expect(200));
    expect(seen, seen.join('\n')).toHaveLength(1);
    expect(seen.filter((q) => q.includes('DISTINCT "distinctAlias"'))).toEqual([]);
    // A page past the end has no row to carry the total: it is counted on its own, and the same.
    const past = Math.ceil(first.body.total / 10) + 1;
    const empty = await agent.get(`/api/lots?pageSize=10&page=${past}`).expect(200);
    expect(empty.body.items).toEqual([]);
    expect(empty.body.total).toBeGreaterThanOrEqual(first.body.total);
  });
});


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

describe('the session and user cache (authCacheMs)', () => {
  const sessionOf = (csrfToken: string, expires: Date): SessionData => ({ csrfToken, cookie: { originalMaxAge: 60_000, expires, httpOnly: true, path: '/' } }) as unknown as SessionData;
  const read = (store: Store, sid: string) =>
    new Promise<SessionData | null | undefined>((resolve, reject) => store.get(sid, (err, sess) => (err ? reject(err as Error) : resolve(sess))));

  it('cacheSessions answers a read within the TTL from memory, reads the store again after it, and a write or a sign-out through it drops the entry at once', async () => {
    const now = vi.spyOn(Date, 'now').mockReturnValue(1_000_000);
    try {
      const inner = new FakeStore();
      inner.sessions.set('a', sessionOf('t1', new Date(1_000_000 + 3_600_000)));
      const store = cacheSessions(inner, 2_000);
      expect((await read(store, 'a'))?.csrfToken).toBe('t1');
      expect((await read(store, 'a'))?.csrfToken).toBe('t1');
      expect(inner.gets).toBe(1);
      now.mockReturnValue(1_000_000 + 2_000);
      await read(store, 'a');
      expect(inner.gets).toBe(2);
      await new Promise<void>((resolve) => store.set('a', sessionOf('t2', new Date(1_000_000 + 3_600_000)), () => resolve()));
      expect((await read(store, 'a'))?.csrfToken).toBe('t2');
      expect(inner.gets).toBe(3);
      await new Promise<void>((resolve) => store.destroy('a', () => resolve()));
      expect(await read(store, 'a')).toBeNull();
      expect(inner.gets).toBe(4);
      // A session that is not there is not remembered: the next request asks the store again.
      await read(store, 'a');
      expect(inner.gets).toBe(5);
    } finally {
      now.mockRestore();
    }
  });

  it('a read that started before a sign-out does not put the signed-out session back into the cache', async () => {
    const inner = new FakeStore();
    inner.sessions.set('a', sessionOf('t1', new Date(Date.now() + 3_600_000)));
    const store = cacheSessions(inner, 60_000);
    inner.holdGets = true;
    const slow = read(store, 'a');
    await new Promise<void>((resolve) => store.destroy('a', () => resolve()));
    inner.held.shift()!(); // the old row arrives after the sign-out
    expect((await slow)?.csrfToken).toBe('t1');
    inner.holdGets = false;
    expect(await read(store, 'a')).toBeNull();
    expect(inner.gets).toBe(2);
  });

  it('a cached session past its cookie expiry is read from the store again', async () => {
    const now = vi.spyOn(Date, 'now').mockReturnValue(5_000_000);
    try {
      const inner = new FakeStore();
      inner.sessions.set('a', sessionOf('t1', new Date(5_000_500)));
      const store = cacheSessions(inner, 60_000);
      await read(store, 'a');
      now.mockReturnValue(5_000_600);
      await read(store, 'a');
      expect(inner.gets).toBe(2);
    } finally {
      now.mockRestore();
    }
  });

  it('with sessions and users cached, a signed-out cookie is refused at the next request, even replayed', async () => {
    const app = createApp({ dataSource: ctx.ds, authCacheMs: 60_000 });
    const { agent } = await signedIn({ ds: ctx.ds, app }, 'assembler');
    const me = await agent.get('/api/auth/me').expect(200);
    const cookie = (me.request as unknown as { cookies: string }).cookies;
    await request(app).get('/api/auth/me').set('Cookie', cookie).expect(200);
    await agent.post('/api/auth/logout').set('x-csrf-token', agent.csrf).expect(204);
    await request(app).get('/api/auth/me').set('Cookie', cookie).expect(401);
  });

  it('with sessions and users cached, a role change shows at the next request and a deactivation signs the user out at once', async () => {
    const app = createApp({ dataSource: ctx.ds, authCacheMs: 60_000 });
    const { agent: quality } = await signedIn({ ds: ctx.ds, app }, 'quality');
    const { agent, user } = await signedIn({ ds: ctx.ds, app }, 'inspector');
    expect((await agent.get('/api/auth/me').expect(200)).body.user.role).toBe('inspector');
    await quality.patch(`/api/users/${user.id}`).set('x-csrf-token', quality.csrf).send({ role: 'buyer' }).expect(200);
    expect((await agent.get('/api/auth/me').expect(200)).body.user.role).toBe('buyer');
    await agent.post('/api/lots/1/measurements').set('x-csrf-token', agent.csrf).send({}).expect(403);
    await quality.patch(`/api/users/${user.id}`).set('x-csrf-token', quality.csrf).send({ active: false }).expect(200);
    await agent.get('/api/auth/me').expect(401);
  });
});
