import { spawnSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express, RequestHandler } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { readConfig } from '../../server/config.ts';
import { passwordProblem } from '../../server/modules/users/password-rules.ts';
import { LotDocument } from '../../server/modules/lots/lot.entity.ts';
import { DEFAULT_MAPPING, DEFAULT_UNITS, makeBenchLot, testerCsv } from './bench-fixtures.ts';
import { createPart, createSupplierVia } from './catalog-helpers.ts';
import { agentFor, makeUser, signedIn, TEST_PASSWORD, useTestApp, type Agent } from './helpers.ts';

const base = useTestApp();
// Documents of this file go to a folder of their own (the throwaway database restarts its ids).
const dataDir = path.join(readConfig().dataDir, `security-${process.pid}-${Date.now()}`);
const ctx = {} as typeof base;
beforeAll(() => {
  ctx.ds = base.ds;
  ctx.app = createApp({ dataSource: base.ds, config: { ...readConfig(), dataDir } });
});
afterAll(() => {
  fs.rmSync(dataDir, { recursive: true, force: true });
});

const sidOf = (res: request.Response): string | undefined => {
  const raw = res.headers['set-cookie'] as unknown as string[] | undefined;
  return raw?.find((c) => c.startsWith('bw.sid='))?.split(';')[0].slice('bw.sid='.length);
};

const binary = (req: request.Test) =>
  req.buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => cb(null, Buffer.concat(chunks)));
  });

function pdfText(pdf: Buffer): string {
  const file = path.join(os.tmpdir(), `bw-security-${randomUUID()}.pdf`);
  fs.writeFileSync(file, pdf);
  try {
    const out = spawnSync('pdftotext', ['-raw', file, '-'], { encoding: 'utf8' });
    if (out.status !== 0) throw new Error(`pdftotext failed: ${out.stderr}`);
    return out.stdout;
  } finally {
    fs.rmSync(file, { force: true });
  }
}

describe('sessions and cookies', () => {
  it('signing in issues a new session id: the one held before sign-in is not signed in afterwards (no fixation)', async () => {
    const user = await makeUser(ctx.ds, 'inspector');
    const agent = request.agent(ctx.app);
    const first = await agent.get('/api/auth/csrf').expect(200);
    const before = sidOf(first);
    expect(before).toBeDefined();
    const login = await agent.post('/api/auth/login').set('x-csrf-token', first.body.csrfToken).send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    const after = sidOf(login);
    expect(after).toBeDefined();
    expect(after).not.toBe(before);
    await request(ctx.app).get('/api/auth/me').set('Cookie', `bw.sid=${before}`).expect(401);
    await request(ctx.app).get('/api/auth/me').set('Cookie', `bw.sid=${after}`).expect(200);
  });

  it('a session id chosen by someone else (unsigned or forged) is ignored: sign-in gets a fresh one', async () => {
    const user = await makeUser(ctx.ds, 'buyer');
    const planted = 'attacker-chosen-session-id';
    const csrf = await request(ctx.app).get('/api/auth/csrf').set('Cookie', `bw.sid=${planted}`).expect(200);
    const issued = sidOf(csrf)!;
    expect(decodeURIComponent(issued)).not.toContain(planted);
    const login = await request(ctx.app).post('/api/auth/login').set('Cookie', `bw.sid=${issued}`).set('x-csrf-token', csrf.body.csrfToken).send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    expect(decodeURIComponent(sidOf(login)!)).not.toContain(planted);
    await request(ctx.app).get('/api/auth/me').set('Cookie', `bw.sid=s%3A${planted}.forged`).expect(401);
  });

  it('the session cookie is HttpOnly, SameSite=Lax, path /, host-only, 12 hours, and signed', async () => {
    const user = await makeUser(ctx.ds, 'buyer');
    const agent = await agentFor(ctx.app);
    const res = await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    const cookie = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('bw.sid='))!;
    const attrs = cookie.split(';').map((a) => a.trim().toLowerCase());
    expect(attrs).toContain('httponly');
    expect(attrs).toContain('samesite=lax');
    expect(attrs).toContain('path=/');
    expect(attrs.some((a) => a.startsWith('domain='))).toBe(false);
    expect(attrs).not.toContain('secure'); // plain HTTP here: see the next test
    const expires = Date.parse(cookie.split(';').find((a) => /^\s*expires=/i.test(a))!.split('=')[1]);
    expect(Math.abs(expires - Date.now() - 12 * 3600_000)).toBeLessThan(120_000);
    expect(decodeURIComponent(sidOf(res)!)).toMatch(/^s:[^.]+\.[A-Za-z0-9+/=_-]+$/);
  });

  it('behind a TLS-terminating proxy on loopback (X-Forwarded-Proto https) the cookie is also Secure', async () => {
    const user = await makeUser(ctx.ds, 'buyer');
    const csrf = await request(ctx.app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https').expect(200);
    const res = await request(ctx.app)
      .post('/api/auth/login')
      .set('X-Forwarded-Proto', 'https')
      .set('Cookie', `bw.sid=${sidOf(csrf)}`)
      .set('x-csrf-token', csrf.body.csrfToken)
      .send({ email: user.email, password: TEST_PASSWORD })
      .expect(200);
    const cookie = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('bw.sid='))!;
    expect(cookie.split(';').map((a) => a.trim().toLowerCase())).toContain('secure');
  });

  it('after sign-out the old cookie is worthless, even replayed', async () => {
    const { agent } = await signedIn(ctx, 'assembler');
    const me = await agent.get('/api/auth/me').expect(200);
    const cookie = (me.request as unknown as { cookies: string }).cookies;
    await agent.post('/api/auth/logout').set('x-csrf-token', agent.csrf).expect(204);
    await request(ctx.app).get('/api/auth/me').set('Cookie', cookie).expect(401);
  });
});

interface Layer {
  route?: { path: string; methods: Record<string, boolean> };
  handle: RequestHandler & { stack?: Layer[] };
  rawPath?: string;
}

/** Every method + path of the API, from Express's router (like the route × role matrix). */
function apiRoutes(app: Express): { method: string; path: string }[] {
  const out: { method: string; path: string }[] = [];
  const walk = (stack: Layer[], prefix: string) => {
    for (const l of stack) {
      if (l.route) {
        for (const m of Object.keys(l.route.methods)) if (m !== '_all') out.push({ method: m.toUpperCase(), path: prefix + l.route.path });
      } else if (l.handle.stack) {
        walk(l.handle.stack, prefix + (l.rawPath && l.rawPath !== '/' ? l.rawPath : ''));
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  return out.filter((r) => r.path.startsWith('/api/'));
}

describe('CSRF', () => {
  it('every state-changing API route refuses a signed-in quality engineer who sends no token (403 csrf)', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const writes = apiRoutes(ctx.app).filter((r) => !['GET', 'HEAD', 'OPTIONS'].includes(r.method));
    expect(writes.length).toBeGreaterThan(20);
    for (const r of writes) {
      const url = r.path.replace(/:(\w+)/g, '1');
      const res = await agent[r.method.toLowerCase() as 'post' | 'put' | 'patch' | 'delete'](url).send({});
      expect([res.status, res.body.code], `${r.method} ${r.path}`).toEqual([403, 'csrf']);
    }
  });

  it('a token of another session, or one sent in the body or query instead of the header, is refused', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const { agent: other } = await signedIn(ctx, 'quality');
    const body = { email: `csrf-${randomUUID().slice(0, 8)}@example.test`, name: 'Csrf Probe', role: 'buyer', password: 'long-enough-password' };
    const foreign = await agent.post('/api/users').set('x-csrf-token', other.csrf).send(body).expect(403);
    expect(foreign.body.code).toBe('csrf');
    await agent.post(`/api/users?_csrf=${agent.csrf}`).send(body).expect(403);
    await agent.post('/api/users').send({ ...body, _csrf: agent.csrf }).expect(403);
    // A cross-site HTML form can only send form-encoded bodies and no custom header.
    await agent.post('/api/users').type('form').send({ ...body, _csrf: agent.csrf }).expect(403);
    await agent.post('/api/users').set('x-csrf-token', agent.csrf).send(body).expect(201);
  });
});

describe('sign-in rate limiting', () => {
  it('counts failures per e-mail: another e-mail still signs in, a success does not count', async () => {
    const app = createApp({ dataSource: ctx.ds, config: { ...readConfig(), loginRateLimit: 3 } });
    const victim = await makeUser(ctx.ds, 'buyer');
    const bystander = await makeUser(ctx.ds, 'buyer');
    const agent = await agentFor(app);
    const login = (email: string, password: string) => agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email, password });
    await login(victim.email, TEST_PASSWORD).expect(200);
    for (let i = 0; i < 3; i++) await login(victim.email, `wrong-guess-${i}`).expect(401);
    const limited = await login(victim.email, TEST_PASSWORD).expect(429);
    expect(limited.headers['content-type']).toMatch(/problem\+json/);
    expect(limited.body.detail).toMatch(/this e-mail/);
    expect(limited.headers).toHaveProperty('ratelimit');
    await login(bystander.email, TEST_PASSWORD).expect(200);
  });

  it('also limits failures from one address across many e-mails (password spraying)', async () => {
    const app = createApp({ dataSource: ctx.ds, config: { ...readConfig(), loginRateLimit: 2 } });
    const agent = await agentFor(app);
    // 2 × 10 = 20 failed sign-ins from this address, one per e-mail, then the address is limited.
    for (let i = 0; i < 20; i++) {
      await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: `spray-${i}@example.test`, password: 'Summer2026!' }).expect(401);
    }
    const res = await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: 'spray-20@example.test', password: 'Summer2026!' }).expect(429);
    expect(res.body.detail).toMatch(/from this address/);
  });
});

describe('password rules (POST /api/users)', () => {
  it.each([
    ['shorter than 10 characters', 'Sh0rt-pw', 'password must have at least 10 characters'],
    ['longer than 200 characters', 'x1-'.repeat(70), 'password must be shorter than or equal to 200 characters'],
    ['the e-mail address itself', '<email>', 'password must not contain the e-mail address'],
    ['the e-mail local part with digits', '<local>2026', 'password must not contain the e-mail address'],
    ['the user’s name', 'Petra Novak 2026', 'password must not contain the name'],
    ['a common password', 'Password123', 'password is one of the most common passwords; choose another'],
    ['one character repeated', 'aaaaaaaaaaaa', 'password must use at least 5 different characters'],
  ])('refuses a password that is %s, naming the password field', async (_what, pw, message) => {
    const { agent } = await signedIn(ctx, 'quality');
    const local = `petra.novak.${randomUUID().slice(0, 6)}`;
    const email = `${local}@example.test`;
    const password = pw.replace('<email>', email).replace('<local>', local);
    const res = await agent.post('/api/users').set('x-csrf-token', agent.csrf).send({ email, name: 'Petra Novak', role: 'buyer', password }).expect(400);
    expect(res.body.errors).toContainEqual({ field: 'password', message });
  });

  it('accepts a long passphrase unrelated to the person', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    await agent
      .post('/api/users')
      .set('x-csrf-token', agent.csrf)
      .send({ email: `ok-${randomUUID().slice(0, 8)}@example.test`, name: 'Petra Novak', role: 'buyer', password: 'copper kettle on a slow bench' })
      .expect(201);
    expect(passwordProblem('copper kettle on a slow bench', { email: 'x@example.test', name: 'Petra Novak' })).toBeNull();
  });
});

/** Hostile text that must come back exactly as sent and print literally (pdftotext). */
const HOSTILE_SHORT = {
  sql: `'); DROP TABLE lot; --`,
  script: `<script>alert("x")</script>`,
  html: `<img src=x onerror=alert(1)>`,
  unicode: 'Ω ≤ 5 µA · naïve Ünïcödé',
};
/** Stored and returned exactly; not necessarily printable by the PDF fonts. */
const HOSTILE_ODD = {
  rtl: 'PO\u202Efdp.exe',
  zeroWidth: 'A\u200B\u200DB\uFEFF',
  emoji: 'lot 🧪🔬',
  combining: 'e\u0301\u0323',
  controls: 'tab\there\u0007bell',
};

describe('hostile text in text fields is stored and shown inert', () => {
  it.each(Object.entries({ ...HOSTILE_SHORT, ...HOSTILE_ODD }))('%s: part type description and supplier name round-trip exactly through the API', async (_k, text) => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent, { description: `Desc ${text}` });
    const supplier = await createSupplierVia(agent, { name: `Dist ${text}` });
    expect((await agent.get(`/api/part-types/${part.id}`).expect(200)).body.description).toBe(`Desc ${text}`.trim());
    expect((await agent.get(`/api/suppliers/${supplier.id}`).expect(200)).body.name).toBe(`Dist ${text}`.trim());
    const found = await agent.get('/api/suppliers').query({ search: text.slice(0, 20) }).expect(200);
    expect(found.headers['content-type']).toMatch(/application\/json/);
  });

  it('SQL fragments, script tags and odd characters in a lot and its readings print literally on the traveler and the inspection report', async () => {
    const { agent: qe } = await signedIn(ctx, 'quality');
    const { agent } = await signedIn(ctx, 'inspector');
    const part = await createPart(qe, { description: `Desc ${HOSTILE_SHORT.script}` });
    const supplier = await createSupplierVia(qe, { name: `Dist ${HOSTILE_SHORT.html}`.slice(0, 120) });
    const lot = await agent
      .post('/api/lots')
      .set('x-csrf-token', agent.csrf)
      .send({ supplierId: supplier.id, partTypeId: part.id, quantity: 5, dryBag: 'not-applicable', purchaseOrder: HOSTILE_SHORT.sql, supplierLot: HOSTILE_SHORT.unicode })
      .expect(201);
    const detail = await agent.get(`/api/lots/${lot.body.id}`).expect(200);
    expect(detail.body.purchaseOrder).toBe(HOSTILE_SHORT.sql);
    expect(detail.body.supplierLot).toBe(HOSTILE_SHORT.unicode);
    // The lots table is still there and the search treats the fragment as text.
    const search = await agent.get('/api/lots').query({ search: `'); DROP` }).expect(200);
    expect(search.body.items.map((l: { id: number }) => l.id)).toContain(lot.body.id);
    await agent.get('/api/lots').query({ search: `%' OR '1'='1` }).expect(200);

    const traveler = await binary(agent.get(`/api/lots/${lot.body.id}/traveler.pdf`)).expect(200);
    const tText = pdfText(traveler.body as Buffer);
    expect(tText).toContain(HOSTILE_SHORT.sql);
    expect(tText).toContain(HOSTILE_SHORT.unicode);
    expect(tText).toContain(HOSTILE_SHORT.html);

    const s = await agent.post(`/api/lots/${lot.body.id}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: `Meter ${HOSTILE_SHORT.script}`.slice(0, 80), ambientC: 25, mode: 'sample' }).expect(201);
    const first = await agent.post(`/api/lots/${lot.body.id}/measurements`).set('x-csrf-token', agent.csrf).send({ sessionId: s.body.id, position: 1, hfe: 180, vbe: 650, vbeUnit: 'mV' }).expect(201);
    const reason = `${HOSTILE_SHORT.sql} ${HOSTILE_SHORT.script}`;
    await agent.post(`/api/lots/${lot.body.id}/measurements/${first.body.id}/corrections`).set('x-csrf-token', agent.csrf).send({ sessionId: s.body.id, hfe: 181, vbe: 650, vbeUnit: 'mV', reason }).expect(201);
    const history = await agent.get(`/api/lots/${lot.body.id}/measurements?history=true`).expect(200);
    expect(history.body.items.map((m: { correctionReason: string | null }) => m.correctionReason)).toContain(reason);
    for (let p = 2; p <= 5; p++) await agent.post(`/api/lots/${lot.body.id}/measurements`).set('x-csrf-token', agent.csrf).send({ sessionId: s.body.id, position: p, hfe: 180 + p, vbe: 650, vbeUnit: 'mV' }).expect(201);
    const proposal = `Accept ${HOSTILE_SHORT.sql} ${HOSTILE_SHORT.unicode}`;
    await agent.post(`/api/lots/${lot.body.id}/disposition`).set('x-csrf-token', agent.csrf).send({ decision: 'accept', reason: proposal }).expect(200);

    const report = await binary(agent.get(`/api/lots/${lot.body.id}/report.pdf`)).expect(200);
    const rText = pdfText(report.body as Buffer).replace(/\s+/g, ' ');
    // The report's text font has no Ω or ≤: its pdfText() spells them "ohm" and "<=" on purpose.
    expect(rText).toContain(`Accept ${HOSTILE_SHORT.sql} ohm <= 5 µA · naïve Ünïcödé`);
    expect(rText).toContain(HOSTILE_SHORT.script);
    expect(rText).toContain(HOSTILE_SHORT.html);
  });

  it.each([
    ['part type description', 'description', (a: Agent, v: string) => a.post('/api/part-types').set('x-csrf-token', a.csrf).send({ ...PART, partNumber: `T-L${randomUUID().slice(0, 6)}`, description: v })],
    ['supplier name', 'name', (a: Agent, v: string) => a.post('/api/suppliers').set('x-csrf-token', a.csrf).send({ code: `S${randomUUID().slice(0, 6)}`, name: v, approval: 'approved' })],
    ['user name', 'name', (a: Agent, v: string) => a.post('/api/users').set('x-csrf-token', a.csrf).send({ email: `l-${randomUUID().slice(0, 6)}@example.test`, name: v, role: 'buyer', password: 'long-enough-password' })],
  ])('a 10 000-character %s answers 400 naming %s', async (_what, field, send) => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await send(agent, 'x'.repeat(10_000)).expect(400);
    expect(res.body.errors.map((e: { field: string }) => e.field)).toContain(field);
  });

  it('a long purchase order and a long correction reason answer 400 naming the field', async () => {
    const { agent: qe } = await signedIn(ctx, 'quality');
    const part = await createPart(qe);
    const supplier = await createSupplierVia(qe);
    const { agent } = await signedIn(ctx, 'inspector');
    const lot = await agent.post('/api/lots').set('x-csrf-token', agent.csrf).send({ supplierId: supplier.id, partTypeId: part.id, quantity: 5, dryBag: 'not-applicable', purchaseOrder: 'P'.repeat(61) }).expect(400);
    expect(lot.body.errors).toContainEqual({ field: 'purchaseOrder', message: 'purchaseOrder must be at most 60 characters' });
    const f = await makeBenchLot(ctx.ds);
    const s = await agent.post(`/api/lots/${f.lot.id}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: 'Meter', ambientC: 25, mode: 'sample' }).expect(201);
    const m = await agent.post(`/api/lots/${f.lot.id}/measurements`).set('x-csrf-token', agent.csrf).send({ sessionId: s.body.id, position: 1, hfe: 180, vbe: 650, vbeUnit: 'mV' }).expect(201);
    const corr = await agent.post(`/api/lots/${f.lot.id}/measurements/${m.body.id}/corrections`).set('x-csrf-token', agent.csrf).send({ sessionId: s.body.id, hfe: 181, vbe: 650, vbeUnit: 'mV', reason: 'r'.repeat(5000) }).expect(400);
    expect(corr.body.errors.map((e: { field: string }) => e.field)).toEqual(['reason']);
  });

  it('a JSON body over 1 MB answers 413 problem+json', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await agent.post('/api/suppliers').set('x-csrf-token', agent.csrf).send({ code: 'BIG', name: 'y'.repeat(1_100_000), approval: 'approved' }).expect(413);
    expect(res.headers['content-type']).toMatch(/problem\+json/);
  });

  it('a NUL character in a JSON field, a query parameter or the path answers 400 naming it (never a 500)', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const body = await agent.post('/api/suppliers').set('x-csrf-token', agent.csrf).send({ code: `S${randomUUID().slice(0, 6)}`, name: 'Nul\u0000Distributor', approval: 'approved' }).expect(400);
    expect(body.body.errors).toEqual([{ field: 'name', message: 'name contains a NUL character (U+0000)' }]);
    const nested = await agent.post('/api/part-types').set('x-csrf-token', agent.csrf).send({ ...PART, partNumber: 'T-NUL1', description: ['a', 'b\u0000'] }).expect(400);
    expect(nested.body.errors[0].field).toBe('description[1]');
    const query = await agent.get('/api/lots?search=abc%00def').expect(400);
    expect(query.body.errors).toEqual([{ field: 'search', message: 'search contains a NUL character (U+0000)' }]);
    const pathParam = await agent.get('/api/instrument-mappings/abc%00').expect(400);
    expect(pathParam.body.errors[0].field).toBe('path');
  });

  it('an unpaired UTF-16 surrogate (valid JSON, not valid Unicode) answers 400 naming the field, never a 500', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    // Sent as raw JSON text: the escape \ud800 stands alone.
    const res = await agent
      .post('/api/suppliers')
      .set('x-csrf-token', agent.csrf)
      .set('content-type', 'application/json')
      .send(`{"code":"S${randomUUID().slice(0, 6)}","name":"Half \\ud800 pair","approval":"approved"}`)
      .expect(400);
    expect(res.body.errors).toEqual([{ field: 'name', message: 'name contains an unpaired surrogate (not valid Unicode text)' }]);
    // A proper pair (an emoji) is fine.
    await agent.post('/api/suppliers').set('x-csrf-token', agent.csrf).send({ code: `S${randomUUID().slice(0, 6)}`, name: 'Whole 🧪 pair', approval: 'approved' }).expect(201);
  });

  it('a NUL inside a multipart form field (the import mapping) answers 400 naming it', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await agent.post(`/api/lots/${f.lot.id}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: 'Tester', ambientC: 25, mode: 'sample' }).expect(201);
    const res = await agent
      .post(`/api/lots/${f.lot.id}/measurements/import`)
      .set('x-csrf-token', agent.csrf)
      .field('sessionId', String(s.body.id))
      .field('mapping', JSON.stringify({ ...DEFAULT_MAPPING, position: 'Pos\u0000' }))
      .field('units', JSON.stringify(DEFAULT_UNITS))
      .attach('file', Buffer.from(testerCsv([[1, 200, 0.65]])), 't.csv')
      .expect(400);
    expect(res.body.errors[0].field).toBe('mapping.position');
  });

  it('operator-like query values (objects, arrays) are refused, not passed to the database', async () => {
    const { agent } = await signedIn(ctx, 'buyer');
    const obj = await agent.get('/api/lots?search[$ne]=x').expect(400);
    expect(obj.body.errors.map((e: { field: string }) => e.field).join(' ')).toMatch(/^search/);
    const arr = await agent.get('/api/lots?status=received&status=accepted').expect(400);
    expect(arr.body.errors.map((e: { field: string }) => e.field)).toContain('status');
  });
});

const PART = {
  description: 'Test small-signal NPN',
  polarity: 'NPN',
  packageName: 'TO-92',
  hfeIcMa: 2,
  hfeVceV: 5,
  vbeIcMa: 2,
  hfeMin: 100,
  hfeMax: 300,
  vbeMinMv: 600,
  vbeMaxMv: 720,
  msl: 'not-classified',
  esdHbmClass: '2',
};

const TINY_PDF = (tag: string) =>
  Buffer.from(`%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[]/Count 0>>endobj\n% ${tag}\ntrailer<</Root 1 0 R>>\n%%EOF\n`);

describe('uploads', () => {
  async function lotWithAgent() {
    const { agent: qe } = await signedIn(ctx, 'quality');
    const part = await createPart(qe);
    const supplier = await createSupplierVia(qe);
    const { agent } = await signedIn(ctx, 'inspector');
    const lot = await agent.post('/api/lots').set('x-csrf-token', agent.csrf).send({ supplierId: supplier.id, partTypeId: part.id, quantity: 50, dryBag: 'not-applicable' }).expect(201);
    return { agent, lotId: lot.body.id as number };
  }
  const upload = (agent: Agent, lotId: number, bytes: Buffer, filename: string) =>
    agent.post(`/api/lots/${lotId}/documents`).set('x-csrf-token', agent.csrf).field('kind', 'coc').attach('file', bytes, { filename, contentType: 'application/pdf' });

  it.each([
    ['../../etc/passwd', 'passwd'],
    ['../../../../tmp/evil.pdf', 'evil.pdf'],
    ['/etc/cron.d/job.pdf', 'job.pdf'],
    ['C:\\Windows\\System32\\drivers\\etc\\hosts.pdf', 'hosts.pdf'],
    ['..\\..\\boot.ini', 'boot.ini'],
  ])('a file named %j is stored under our own key inside the documents folder; the name is only display text (%j)', async (name, display) => {
    const { agent, lotId } = await lotWithAgent();
    const bytes = TINY_PDF(`path trick ${randomUUID()}`);
    const res = await upload(agent, lotId, bytes, name).expect(201);
    expect(res.body.originalName).toBe(display);
    const row = await ctx.ds.getRepository(LotDocument).findOneByOrFail({ id: res.body.id });
    expect(row.storageKey).toMatch(new RegExp(`^${lotId}/${res.body.id}-[0-9a-f]{8}$`));
    const docs = path.join(dataDir, 'documents');
    const stored = path.resolve(docs, row.storageKey);
    expect(stored.startsWith(path.resolve(docs) + path.sep)).toBe(true);
    expect(fs.readFileSync(stored).equals(bytes)).toBe(true);
    // Nothing was written where the name pointed.
    expect(fs.readdirSync(path.join(docs, String(lotId)))).toEqual([path.basename(row.storageKey)]);
    const dl = await binary(agent.get(res.body.contentUrl)).expect(200);
    expect(dl.headers['content-disposition']).toMatch(/^attachment;/);
    expect(dl.headers['content-disposition']).not.toMatch(/[/\\]|\.\.[/\\]/);
  });

  it.each([
    ['a NUL inside the file name (a malformed part header)', 'coc\u0000.pdf'],
    ['a name that is only ".."', '..'],
    ['a name that is only "."', '.'],
  ])('%s answers 400 naming file, and nothing is stored', async (_what, name) => {
    const { agent, lotId } = await lotWithAgent();
    const res = await upload(agent, lotId, TINY_PDF(`refused ${randomUUID()}`), name).expect(400);
    expect(res.headers['content-type']).toMatch(/problem\+json/);
    expect(res.body.errors[0].field).toBe('file');
    expect(await ctx.ds.getRepository(LotDocument).countBy({ lotId })).toBe(0);
    expect(fs.existsSync(path.join(dataDir, 'documents', String(lotId)))).toBe(false);
  });

  // Zip bombs do not apply: no accepted document type (PDF, PNG, JPEG, CSV) is an archive, and the
  // type is read from the bytes, so an archive is refused before anything is unpacked or stored.
  it('a ZIP archive (also renamed .pdf) is refused with 415 and nothing is stored', async () => {
    const { agent, lotId } = await lotWithAgent();
    // Local file header signature PK\x03\x04 (PKWARE APPNOTE 4.3.7) and a stored entry "a.txt".
    const zip = Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0, 0, 0, 0, 0]), Buffer.alloc(16, 0), Buffer.from([5, 0, 0, 0]), Buffer.from('a.txt'), Buffer.from('hello')]);
    const res = await upload(agent, lotId, zip, 'certificate.pdf').expect(415);
    expect(res.body.detail).toMatch(/ZIP archive/);
    expect(res.body.errors[0].field).toBe('file');
    expect(await ctx.ds.getRepository(LotDocument).countBy({ lotId })).toBe(0);
  });

  it('a tester import that is not a text table (a ZIP, or binary) answers 4xx naming the problem and writes nothing', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const s = await agent.post(`/api/lots/${f.lot.id}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: 'Tester', ambientC: 25, mode: 'sample' }).expect(201);
    const zip = Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04]), Buffer.alloc(200, 7)]);
    for (const [bytes, name] of [
      [zip, 'export.csv'],
      [Buffer.from(testerCsv([[1, 200, 0.65]]).replace('200', '2\u00000')), '../../evil.csv'],
    ] as const) {
      const res = await agent
        .post(`/api/lots/${f.lot.id}/measurements/import`)
        .set('x-csrf-token', agent.csrf)
        .field('sessionId', String(s.body.id))
        .field('mapping', JSON.stringify(DEFAULT_MAPPING))
        .field('units', JSON.stringify(DEFAULT_UNITS))
        .attach('file', bytes, name);
      expect(res.status, JSON.stringify(res.body)).toBeGreaterThanOrEqual(400);
      expect(res.status).toBeLessThan(500);
      expect(res.body.errors?.length).toBeGreaterThan(0);
    }
    const [{ n }] = (await ctx.ds.query('SELECT count(*)::int AS n FROM measurement WHERE lot_id = $1', [f.lot.id])) as { n: number }[];
    expect(n).toBe(0);
  });
});
