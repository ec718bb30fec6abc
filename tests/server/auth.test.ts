import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { ROLES } from '../../shared/api/roles.ts';
import { agentFor, makeUser, signedIn, TEST_PASSWORD, useTestApp } from './helpers.ts';

const ctx = useTestApp();

describe('GET /api/health', () => {
  it('when the database answers, reports ok for both', async () => {
    const res = await request(ctx.app).get('/api/health').expect(200);
    expect(res.body).toEqual({ status: 'ok', database: 'ok' });
  });
});

describe('POST /api/auth/login', () => {
  it('with the right password, answers the user with id, email, name and role', async () => {
    const user = await makeUser(ctx.ds, 'buyer');
    const agent = await agentFor(ctx.app);
    const res = await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    expect(res.body).toEqual({ user: { id: user.id, email: user.email, name: user.name, role: 'buyer' } });
    const me = await agent.get('/api/auth/me').expect(200);
    expect(me.body.user.email).toBe(user.email);
  });

  it('with a wrong password or an unknown e-mail, answers the same 401 problem', async () => {
    const user = await makeUser(ctx.ds, 'inspector');
    const agent = await agentFor(ctx.app);
    const wrong = await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: user.email, password: 'not-the-password' }).expect(401);
    const unknown = await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: 'nobody-here@example.test', password: 'whatever-it-is' }).expect(401);
    expect(wrong.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(wrong.body.detail).toBe(unknown.body.detail);
    expect(wrong.body.status).toBe(401);
    expect(wrong.body).not.toHaveProperty('user');
  });

  it('for a deactivated user, answers 401 like a wrong password', async () => {
    const user = await makeUser(ctx.ds, 'assembler', { active: false });
    const agent = await agentFor(ctx.app);
    await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: user.email, password: TEST_PASSWORD }).expect(401);
  });

  it('without the CSRF token, answers 403', async () => {
    const user = await makeUser(ctx.ds, 'buyer');
    const res = await request(ctx.app).post('/api/auth/login').send({ email: user.email, password: TEST_PASSWORD }).expect(403);
    expect(res.body.code).toBe('csrf');
  });

  it('with an unknown field in the body, answers 400 naming it', async () => {
    const agent = await agentFor(ctx.app);
    const res = await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: 'a@example.test', password: 'x', remember: true }).expect(400);
    expect(res.body.errors).toContainEqual({ field: 'remember', message: 'remember is not a known field' });
  });

  it('with a malformed e-mail, answers 400 naming the email field', async () => {
    const agent = await agentFor(ctx.app);
    const res = await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: 'not-an-email', password: 'x' }).expect(400);
    expect(res.body.errors.map((e: { field: string }) => e.field)).toContain('email');
  });

  it('after too many failed attempts for one e-mail, answers 429', async () => {
    const user = await makeUser(ctx.ds, 'buyer');
    const agent = await agentFor(ctx.app);
    for (let i = 0; i < 10; i++) {
      await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: user.email, password: `wrong-${i}` }).expect(401);
    }
    const res = await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: user.email, password: TEST_PASSWORD }).expect(429);
    expect(res.body.detail).toMatch(/Too many/);
  });

  it('sets an httpOnly, SameSite session cookie and helmet headers', async () => {
    const user = await makeUser(ctx.ds, 'buyer');
    const agent = await agentFor(ctx.app);
    const res = await agent.post('/api/auth/login').set('x-csrf-token', agent.csrf).send({ email: user.email, password: TEST_PASSWORD }).expect(200);
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
  });
});

describe('GET /api/auth/me and POST /api/auth/logout', () => {
  it('without a session, me answers 401 problem+json', async () => {
    const res = await request(ctx.app).get('/api/auth/me').expect(401);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
  });

  it('logout answers 204 and ends the session', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    await agent.post('/api/auth/logout').set('x-csrf-token', agent.csrf).expect(204);
    await agent.get('/api/auth/me').expect(401);
  });

  it('the CSRF token fetched before sign-in keeps working after it', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    await agent.post('/api/users').set('x-csrf-token', agent.csrf).send({ email: `kept-${Date.now()}@example.test`, name: 'Kept Token', role: 'buyer', password: 'long-enough-pw' }).expect(201);
  });
});

describe('roles on state-changing routes', () => {
  it.each(ROLES.filter((r) => r !== 'quality'))('a %s creating a user gets 403', async (role) => {
    const { agent } = await signedIn(ctx, role);
    const res = await agent.post('/api/users').set('x-csrf-token', agent.csrf).send({ email: `x-${role}@example.test`, name: 'Nope', role: 'buyer', password: 'long-enough-pw' }).expect(403);
    expect(res.body.status).toBe(403);
  });

  it.each(ROLES.filter((r) => r !== 'quality'))('a %s changing a user gets 403', async (role) => {
    const { agent } = await signedIn(ctx, role);
    const target = await makeUser(ctx.ds, 'buyer');
    await agent.patch(`/api/users/${target.id}`).set('x-csrf-token', agent.csrf).send({ role: 'inspector' }).expect(403);
  });

  it('a buyer reading the admin users list or the audit trail gets 403', async () => {
    const { agent } = await signedIn(ctx, 'buyer');
    await agent.get('/api/users').expect(403);
    await agent.get('/api/audit').expect(403);
  });

  it('a signed-in request without the CSRF token gets 403 even for a quality engineer', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await agent.post('/api/users').send({ email: 'no-token@example.test', name: 'No Token', role: 'buyer', password: 'long-enough-pw' }).expect(403);
    expect(res.body.code).toBe('csrf');
  });

  it('an anonymous call to an API route answers 401', async () => {
    await request(ctx.app).get('/api/users').expect(401);
  });

  it('an unknown API route answers 404 problem+json', async () => {
    const { agent } = await signedIn(ctx, 'buyer');
    const res = await agent.get('/api/nothing-here').expect(404);
    expect(res.headers['content-type']).toMatch(/problem\+json/);
  });
});
