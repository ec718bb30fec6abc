import type { IncomingMessage } from 'node:http';
import { gzipSync } from 'node:zlib';
import type { Express } from 'express';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { parseBody } from '../../server/http/validate.ts';
import { createApp } from '../../server/app.ts';
import { plainReading, RecordMeasurementDto } from '../../server/modules/measurements/measurements.dto.ts';
import { isSecure, type ReadingLaneStats } from '../../server/modules/measurements/reading-lane.ts';
import { toSessionUser, updateUser } from '../../server/modules/users/users.service.ts';
import { makeBenchLot } from './bench-fixtures.ts';
import { makeUser, signedIn, TEST_PASSWORD, useTestApp, type Agent, type TestContext } from './helpers.ts';

// The reading lane (server/modules/measurements/reading-lane.ts): POST /api/lots/:id/measurements
// answered without the general middleware when the session, the user and the CSRF token are known
// in memory. It must answer exactly what the full path answers, and pass every refusal on to it.
const ctx = useTestApp();

let cached: TestContext;
let uncached: TestContext;
beforeAll(() => {
  // Sessions and users kept for a minute, so the lane's conditions do not depend on the machine's speed.
  cached = { ds: ctx.ds, app: createApp({ dataSource: ctx.ds, authCacheMs: 60_000 }) };
  // Nothing kept: the lane never applies, every reading goes the full way.
  uncached = { ds: ctx.ds, app: createApp({ dataSource: ctx.ds, authCacheMs: 0 }) };
});

const stats = (app: Express) => ({ ...(app.locals.readingLane as ReadingLaneStats) });

async function openSession(agent: Agent, lotId: number): Promise<number> {
  const res = await agent.post(`/api/lots/${lotId}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: 'Lane meter', ambientC: 25, mode: 'sample' }).expect(201);
  return res.body.id as number;
}

const post = (agent: Agent, lotId: number, body: unknown) => agent.post(`/api/lots/${lotId}/measurements`).set('x-csrf-token', agent.csrf).send(body as object);

/** A signed-in inspector with a sampling session open on a lot being inspected, the session and user cached. */
async function bench(t: TestContext) {
  const { lot } = await makeBenchLot(ctx.ds, { quantity: 500, status: 'inspecting' });
  const { agent, user } = await signedIn(t, 'inspector');
  const sessionId = await openSession(agent, lot.id); // full path: loads the session and user into the caches
  return { lotId: lot.id, sessionId, agent, user };
}

const SECURITY_HEADERS = [
  'content-security-policy',
  'cross-origin-opener-policy',
  'cross-origin-resource-policy',
  'origin-agent-cluster',
  'referrer-policy',
  'strict-transport-security',
  'x-content-type-options',
  'x-dns-prefetch-control',
  'x-download-options',
  'x-frame-options',
  'x-permitted-cross-domain-policies',
  'x-xss-protection',
];

describe('the reading lane answers like the full path', () => {
  it('a reading of a cached session goes through the lane, with the same body, security headers and renewed session cookie as the full path', async () => {
    const a = await bench(cached);
    const b = await bench(uncached);
    const before = stats(cached.app);
    const viaLane = await post(a.agent, a.lotId, { sessionId: a.sessionId, position: 1, hfe: 211.5, vbe: 652, vbeUnit: 'mV', vceSat: 0.12, vceSatUnit: 'V' }).expect(201);
    expect(stats(cached.app)).toEqual({ taken: before.taken + 1, passed: before.passed });
    const viaFull = await post(b.agent, b.lotId, { sessionId: b.sessionId, position: 1, hfe: 211.5, vbe: 652, vbeUnit: 'mV', vceSat: 0.12, vceSatUnit: 'V' }).expect(201);

    const strip = (x: Record<string, unknown>) => ({ ...x, id: 'id', sessionId: 'session', createdAt: 'at', createdByName: 'who' });
    expect(strip(viaLane.body)).toEqual(strip(viaFull.body));
    expect(Object.keys(viaLane.body).sort()).toEqual(Object.keys(viaFull.body).sort());
    expect(viaLane.headers['content-type']).toBe(viaFull.headers['content-type']);
    for (const h of SECURITY_HEADERS) expect(viaLane.headers[h], h).toBe(viaFull.headers[h]);
    expect(viaLane.headers['content-security-policy']).toContain("default-src 'self'");

    // express-session with rolling: the same cookie again, its expiry twelve hours from now.
    const laneCookie = (viaLane.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('bw.sid='))!;
    const fullCookie = (viaFull.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('bw.sid='))!;
    const attrs = (c: string) => c.split('; ').slice(1).filter((x) => !x.startsWith('Expires=')).sort();
    expect(attrs(laneCookie)).toEqual(attrs(fullCookie));
    expect(laneCookie.split(';')[0]).toBe(/bw\.sid=[^;]*/.exec((viaLane.request as unknown as { cookies: string }).cookies)![0]);
    const expires = Date.parse(/Expires=([^;]+)/.exec(laneCookie)![1]);
    expect(Math.abs(expires - (Date.now() + 12 * 3600_000))).toBeLessThan(60_000);

    // The reading is stored once, by the same group commit.
    const rows = (await ctx.ds.query('SELECT id FROM measurement WHERE lot_id = $1', [a.lotId])) as { id: string }[];
    expect(rows.map((r) => r.id)).toEqual([viaLane.body.id]);
  });

  it('behind a TLS proxy on loopback the renewed cookie keeps the Secure flag its session was created with, as express-session does', async () => {
    const sid = (r: request.Response) => (r.headers['set-cookie'] as unknown as string[] | undefined)?.find((c) => c.startsWith('bw.sid='));
    /** Signs in with or without the proxy's X-Forwarded-Proto: https, by hand (an agent would not send a Secure cookie over HTTP). */
    const signIn = async (t: TestContext, https: boolean) => {
      const user = await makeUser(ctx.ds, 'inspector');
      const proto = (r: request.Test) => (https ? r.set('X-Forwarded-Proto', 'https') : r);
      const first = await proto(request(t.app).get('/api/auth/csrf')).expect(200);
      const login = await proto(request(t.app).post('/api/auth/login'))
        .set('Cookie', sid(first)!.split(';')[0])
        .set('x-csrf-token', first.body.csrfToken)
        .send({ email: user.email, password: TEST_PASSWORD })
        .expect(200);
      const cookie = sid(login)!.split(';')[0];
      const { lot } = await makeBenchLot(ctx.ds, { quantity: 50, status: 'inspecting' });
      const opened = await request(t.app).post(`/api/lots/${lot.id}/sessions`).set('Cookie', cookie).set('x-csrf-token', first.body.csrfToken)
        .send({ instrument: 'Lane meter', ambientC: 25, mode: 'sample' }).expect(201);
      let position = 0;
      const read = (viaHttps: boolean) => {
        const r = request(t.app).post(`/api/lots/${lot.id}/measurements`).set('Cookie', cookie).set('x-csrf-token', first.body.csrfToken);
        return (viaHttps ? r.set('X-Forwarded-Proto', 'https') : r).send({ sessionId: opened.body.id, position: ++position, hfe: 190, vbe: 651, vbeUnit: 'mV' }).expect(201);
      };
      return { read, createdSecure: sid(login)!.includes('; Secure') };
    };
    for (const createdOverHttps of [true, false]) {
      const a = await signIn(cached, createdOverHttps);
      const b = await signIn(uncached, createdOverHttps);
      expect(a.createdSecure).toBe(createdOverHttps);
      for (const readOverHttps of [true, false]) {
        const what = `created over ${createdOverHttps ? 'HTTPS' : 'HTTP'}, reading over ${readOverHttps ? 'HTTPS' : 'HTTP'}`;
        const taken = stats(cached.app).taken;
        const viaLane = await a.read(readOverHttps);
        expect(stats(cached.app).taken, what).toBe(taken + 1);
        const viaFull = await b.read(readOverHttps);
        const flags = (c: string | undefined) => c?.split('; ').slice(1).filter((x) => !x.startsWith('Expires=')).sort();
        expect(flags(sid(viaLane)), what).toEqual(flags(sid(viaFull)));
        // A Secure session's cookie is not sent back over plain HTTP; otherwise it is renewed.
        expect(sid(viaLane) === undefined, what).toBe(createdOverHttps && !readOverHttps);
        if (sid(viaLane)) expect(sid(viaLane)!.includes('; Secure'), what).toBe(createdOverHttps);
      }
    }
  });

  it('isSecure follows Express: the socket, or X-Forwarded-Proto (first value) only from a trusted peer', () => {
    const req = (remoteAddress: string, proto?: string | string[], encrypted = false) =>
      ({ socket: { remoteAddress, encrypted }, headers: proto === undefined ? {} : { 'x-forwarded-proto': proto } }) as unknown as IncomingMessage;
    const loopback = (addr: string | undefined) => addr === '127.0.0.1' || addr === '::1' || addr === '::ffff:127.0.0.1';
    expect(isSecure(req('127.0.0.1'), loopback)).toBe(false);
    expect(isSecure(req('127.0.0.1', 'https'), loopback)).toBe(true);
    expect(isSecure(req('127.0.0.1', 'https, http'), loopback)).toBe(true);
    expect(isSecure(req('127.0.0.1', ' http ,https'), loopback)).toBe(false);
    expect(isSecure(req('203.0.113.9', 'https'), loopback)).toBe(false); // an untrusted peer cannot claim https
    expect(isSecure(req('203.0.113.9', 'http', true), loopback)).toBe(true); // its own TLS socket counts
    expect(isSecure(req('127.0.0.1', 'http', true), loopback)).toBe(false); // a trusted proxy's word wins, as in Express
  });

  it('bad readings get the same problem answers through the lane as through the full path', async () => {
    const a = await bench(cached);
    const b = await bench(uncached);
    const ok = (t: { sessionId: number }, position: number) => ({ sessionId: t.sessionId, position, hfe: 180, vbe: 650, vbeUnit: 'mV' });
    await post(a.agent, a.lotId, ok(a, 7)).expect(201);
    await post(b.agent, b.lotId, ok(b, 7)).expect(201);
    const cases: [string, (t: typeof a) => [number, unknown]][] = [
      ['a field of the wrong type', (t) => [t.lotId, { ...ok(t, 8), hfe: 'high' }]],
      ['an unknown field', (t) => [t.lotId, { ...ok(t, 8), operator: 'x' }]],
      ['a missing field', (t) => [t.lotId, { sessionId: t.sessionId, position: 8, hfe: 180, vbe: 650 }]],
      ['a body that is not an object', (t) => [t.lotId, [ok(t, 8)]]],
      ['volts typed as millivolts', (t) => [t.lotId, { ...ok(t, 8), vbe: 0.65 }]],
      ['a position already measured', (t) => [t.lotId, ok(t, 7)]],
      ['a position beyond the lot', (t) => [t.lotId, ok(t, 501)]],
      ['a lot that does not exist', (t) => [999_999_999, ok(t, 8)]],
      ['text that cannot be stored', (t) => [t.lotId, { ...ok(t, 8), vbeUnit: 'm\u0000V' }]],
    ];
    for (const [what, make] of cases) {
      const taken = stats(cached.app).taken;
      const [lotA, bodyA] = make(a);
      const [lotB, bodyB] = make(b);
      const viaLane = await post(a.agent, lotA, bodyA);
      const viaFull = await post(b.agent, lotB, bodyB);
      expect(stats(cached.app).taken, what).toBe(taken + 1);
      expect(viaLane.status, what).toBe(viaFull.status);
      expect(viaLane.status, what).toBeGreaterThanOrEqual(400);
      expect(viaLane.headers['content-type'], what).toMatch(/application\/problem\+json/);
      const same = (x: { detail: string }) => ({ ...x, detail: x.detail.replace(/#\d+/g, '#id') });
      expect(same(viaLane.body), what).toEqual(same(viaFull.body));
    }

    // Not JSON at all: the same 400 as express.json's refusal.
    const taken = stats(cached.app).taken;
    const laneBad = await a.agent.post(`/api/lots/${a.lotId}/measurements`).set('x-csrf-token', a.agent.csrf).set('content-type', 'application/json').send('{"sessionId": 1,');
    const fullBad = await b.agent.post(`/api/lots/${b.lotId}/measurements`).set('x-csrf-token', b.agent.csrf).set('content-type', 'application/json').send('{"sessionId": 1,');
    expect(stats(cached.app).taken).toBe(taken + 1);
    expect(laneBad.status).toBe(400);
    expect(laneBad.body).toEqual(fullBad.body);
    expect(laneBad.body.code).toBe('invalid-json');

    // A body that starts with a byte-order mark is read as express.json reads it.
    const bom = (ag: Agent, lotId: number, sessionId: number) =>
      ag.post(`/api/lots/${lotId}/measurements`).set('x-csrf-token', ag.csrf).set('content-type', 'application/json').send(`\ufeff${JSON.stringify(ok({ sessionId }, 9))}`);
    const laneBom = await bom(a.agent, a.lotId, a.sessionId);
    const fullBom = await bom(b.agent, b.lotId, b.sessionId);
    expect(laneBom.status).toBe(fullBom.status);
    expect(laneBom.status).toBe(201);
  });
});

describe('the reading lane passes everything it cannot vouch for to the full path', () => {
  it('no CSRF token, a wrong one, a role that may not record, a tampered cookie, a signed-out cookie and a deactivated user are refused by the full path', async () => {
    const a = await bench(cached);
    const body = { sessionId: a.sessionId, position: 3, hfe: 180, vbe: 650, vbeUnit: 'mV' };
    const url = `/api/lots/${a.lotId}/measurements`;
    const expectPassed = async (what: string, send: () => Promise<request.Response>, status: number, code?: string) => {
      const before = stats(cached.app);
      const res = await send();
      expect(res.status, what).toBe(status);
      if (code) expect(res.body.code, what).toBe(code);
      expect(stats(cached.app).taken, what).toBe(before.taken);
      expect(stats(cached.app).passed, what).toBe(before.passed + 1);
    };
    await expectPassed('no CSRF token', () => a.agent.post(url).send(body), 403, 'csrf');
    await expectPassed('a wrong CSRF token', () => a.agent.post(url).set('x-csrf-token', `${a.agent.csrf.slice(0, -2)}xx`).send(body), 403, 'csrf');

    const buyer = (await signedIn(cached, 'buyer')).agent;
    await buyer.get('/api/auth/me').expect(200); // the buyer's session and user are cached too
    await expectPassed('a buyer', () => buyer.post(url).set('x-csrf-token', buyer.csrf).send(body), 403, 'forbidden');

    // The cookie as the agent sends it, with one character of the signature changed.
    const me = await a.agent.get('/api/auth/me').expect(200);
    const cookie = (me.request as unknown as { cookies: string }).cookies;
    const tampered = cookie.replace(/bw\.sid=([^;]*)/, (_m, v: string) => `bw.sid=${v.slice(0, -3)}${v.endsWith('A') ? 'B' : 'A'}${v.slice(-2)}`);
    expect(tampered).not.toBe(cookie);
    // express-session ignores a cookie whose signature fails: a new, empty session, without the token.
    await expectPassed('a tampered cookie', () => request(cached.app).post(url).set('Cookie', tampered).set('x-csrf-token', a.agent.csrf).send(body), 403, 'csrf');
    await expectPassed('no cookie', () => request(cached.app).post(url).set('x-csrf-token', a.agent.csrf).send(body), 403, 'csrf');

    // Through the lane while signed in, then the same cookie after sign-out.
    await post(a.agent, a.lotId, body).expect(201);
    await a.agent.post('/api/auth/logout').set('x-csrf-token', a.agent.csrf).expect(204);
    await expectPassed('a signed-out cookie', () => request(cached.app).post(url).set('Cookie', cookie).set('x-csrf-token', a.agent.csrf).send({ ...body, position: 4 }), 403, 'csrf');

    // A deactivated user: dropped from the user cache at once, refused by the full path.
    const c = await bench(cached);
    await post(c.agent, c.lotId, { ...body, sessionId: c.sessionId }).expect(201);
    const admin = toSessionUser(await makeUser(ctx.ds, 'quality'));
    await updateUser(ctx.ds, admin, c.user.id, { active: false });
    await expectPassed('a deactivated user', () => post(c.agent, c.lotId, { ...body, sessionId: c.sessionId, position: 5 }), 401, 'unauthorized');
    expect(((await ctx.ds.query('SELECT count(*)::int AS n FROM measurement WHERE lot_id = $1', [c.lotId])) as { n: number }[])[0].n).toBe(1);
  });

  it('a query string, a gzip body and another content type go the full way and are answered as before', async () => {
    const a = await bench(cached);
    const url = `/api/lots/${a.lotId}/measurements`;
    const body = (position: number) => ({ sessionId: a.sessionId, position, hfe: 180, vbe: 650, vbeUnit: 'mV' });
    const before = stats(cached.app);
    const q = await a.agent.post(`${url}?from=grid`).set('x-csrf-token', a.agent.csrf).send(body(1));
    expect(q.status, JSON.stringify(q.body)).toBe(201);
    await a.agent
      .post(url)
      .set('x-csrf-token', a.agent.csrf)
      .set('content-type', 'application/json')
      .set('content-encoding', 'gzip')
      .serialize((b: unknown) => b as string) // as is: superagent would write a Buffer as JSON
      .send(gzipSync(Buffer.from(JSON.stringify(body(2)))))
      .then((r) => expect(r.status, JSON.stringify(r.body)).toBe(201));
    const text = await a.agent.post(url).set('x-csrf-token', a.agent.csrf).set('content-type', 'text/plain').send(JSON.stringify(body(3)));
    expect(text.status).toBe(400);
    const after = stats(cached.app);
    expect(after.taken).toBe(before.taken);
    // The address with a query string is not the lane's at all; the other two are passed on.
    expect(after.passed).toBe(before.passed + 2);
    // And a plain one right after is taken.
    await post(a.agent, a.lotId, body(4)).expect(201);
    expect(stats(cached.app).taken).toBe(after.taken + 1);
  });
});

describe('plainReading (the lane shortcut past class-validator)', () => {
  const valid: Record<string, unknown>[] = [
    { sessionId: 1, position: 1, hfe: 150, vbe: 650, vbeUnit: 'mV' },
    { sessionId: 9, position: 500, hfe: 0.5, vbe: 0.65, vbeUnit: 'V', vceSat: 0.1, vceSatUnit: 'V', leakage: 3, leakageUnit: 'nA' },
    { sessionId: 2, position: 3, hfe: -4, vbe: -650, vbeUnit: 'mV', vceSat: null, leakage: null },
    { sessionId: 2, position: 3, hfe: 1e6, vbe: 650, vbeUnit: 'mV', leakage: 12, leakageUnit: 'uA' },
  ];
  const bad: unknown[] = [0, 1.5, -1, '1', null, true, [], {}, Infinity, 2 ** 60 + 0.5, 'mV', 'kV', 'v', ' mV', { x: 1 }];
  const fields = ['sessionId', 'position', 'hfe', 'vbe', 'vbeUnit', 'vceSat', 'vceSatUnit', 'leakage', 'leakageUnit'];
  const corpus: unknown[] = [...valid, null, [], 'text', 42, { ...valid[0], extra: 1 }, { ...valid[0], ['__proto__']: 1 }];
  for (const v of valid) {
    for (const f of fields) {
      for (const x of bad) corpus.push({ ...v, [f]: x });
      const without = { ...v };
      delete without[f];
      corpus.push(without);
    }
  }

  it(`never accepts what parseBody refuses, and takes back the same values (${corpus.length} bodies)`, async () => {
    let accepted = 0;
    for (const body of corpus) {
      const plain = plainReading(body);
      let validated: RecordMeasurementDto | null = null;
      try {
        validated = await parseBody(RecordMeasurementDto, body);
      } catch {
        validated = null;
      }
      if (plain) {
        accepted++;
        expect(validated, JSON.stringify(body)).not.toBeNull();
        for (const f of fields) expect((plain as unknown as Record<string, unknown>)[f], `${f} of ${JSON.stringify(body)}`).toEqual((validated as unknown as Record<string, unknown>)[f]);
      }
    }
    // It does take the plain ones (else the lane would gain nothing).
    for (const v of valid) expect(plainReading(v)).not.toBeNull();
    expect(accepted).toBeGreaterThanOrEqual(valid.length);
  });
});
