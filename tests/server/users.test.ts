import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { agentFor, signedIn, useTestApp } from './helpers.ts';

const ctx = useTestApp();
const uniq = () => Math.random().toString(36).slice(2, 10);

describe('POST /api/users (quality engineer)', () => {
  it('creates a user who can then sign in, and writes the audit trail without the password', async () => {
    const { agent, user: qe } = await signedIn(ctx, 'quality');
    const email = `new-${uniq()}@example.test`;
    const res = await agent.post('/api/users').set('x-csrf-token', agent.csrf).send({ email, name: 'New Inspector', role: 'inspector', password: 'a-long-password' }).expect(201);
    expect(res.body).toMatchObject({ email, name: 'New Inspector', role: 'inspector', active: true });
    expect(res.body).not.toHaveProperty('passwordHash');

    const other = await agentFor(ctx.app);
    await other.post('/api/auth/login').set('x-csrf-token', other.csrf).send({ email, password: 'a-long-password' }).expect(200);

    const entries = await ctx.ds.getRepository(AuditEntry).findBy({ entityType: 'user', entityId: String(res.body.id) });
    expect(entries).toHaveLength(1);
    expect(entries[0]).toMatchObject({ action: 'user.create', actorId: qe.id, actorName: qe.name });
    expect(JSON.stringify(entries[0].after)).not.toMatch(/password/i);
  });

  it('with missing and bad fields, answers 400 naming each field', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await agent.post('/api/users').set('x-csrf-token', agent.csrf).send({ email: 'nope', role: 'boss', password: 'short' }).expect(400);
    const fields = res.body.errors.map((e: { field: string }) => e.field);
    expect(fields).toEqual(expect.arrayContaining(['email', 'name', 'role', 'password']));
  });

  it('with an e-mail already in use, answers 409 naming email', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const email = `dup-${uniq()}@example.test`;
    const body = { email, name: 'Dup One', role: 'buyer', password: 'a-long-password' };
    await agent.post('/api/users').set('x-csrf-token', agent.csrf).send(body).expect(201);
    const res = await agent.post('/api/users').set('x-csrf-token', agent.csrf).send({ ...body, email: email.toUpperCase() }).expect(409);
    expect(res.body.errors[0].field).toBe('email');
  });
});

describe('PATCH /api/users/:id', () => {
  it('changes a role and records before and after', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const { user: target } = await signedIn(ctx, 'buyer');
    const res = await agent.patch(`/api/users/${target.id}`).set('x-csrf-token', agent.csrf).send({ role: 'assembler' }).expect(200);
    expect(res.body.role).toBe('assembler');
    const [entry] = await ctx.ds.getRepository(AuditEntry).find({ where: { entityType: 'user', entityId: String(target.id), action: 'user.update' } });
    expect(entry.before).toMatchObject({ role: 'buyer' });
    expect(entry.after).toMatchObject({ role: 'assembler' });
  });

  it('deactivating signs the user out at once and blocks sign-in; the row stays', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const { agent: victim, user: target } = await signedIn(ctx, 'inspector');
    await victim.get('/api/auth/me').expect(200);
    await agent.patch(`/api/users/${target.id}`).set('x-csrf-token', agent.csrf).send({ active: false }).expect(200);
    await victim.get('/api/auth/me').expect(401);
    const list = await agent.get(`/api/users?search=${encodeURIComponent(target.email)}`).expect(200);
    expect(list.body.items[0]).toMatchObject({ id: target.id, active: false });
  });

  it('a quality engineer cannot deactivate themself', async () => {
    const { agent, user } = await signedIn(ctx, 'quality');
    await agent.patch(`/api/users/${user.id}`).set('x-csrf-token', agent.csrf).send({ active: false }).expect(409);
  });

  it('there is no delete route: DELETE answers 404', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const { user: target } = await signedIn(ctx, 'buyer');
    await agent.delete(`/api/users/${target.id}`).set('x-csrf-token', agent.csrf).expect(404);
  });
});

describe('GET /api/users', () => {
  it('pages, filters by role and sorts', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await agent.get('/api/users?role=assembler&pageSize=2&page=1&sort=email&dir=desc').expect(200);
    expect(res.body.pageSize).toBe(2);
    expect(res.body.items.length).toBeLessThanOrEqual(2);
    for (const u of res.body.items) expect(u.role).toBe('assembler');
    const emails = res.body.items.map((u: { email: string }) => u.email);
    expect([...emails].sort().reverse()).toEqual(emails);
  });

  it('with a bad page size, answers 400 naming pageSize', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await agent.get('/api/users?pageSize=5000').expect(400);
    expect(res.body.errors[0].field).toBe('pageSize');
  });
});

describe('audit trail', () => {
  it('refuses UPDATE and DELETE at the database', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    await agent.post('/api/users').set('x-csrf-token', agent.csrf).send({ email: `a-${uniq()}@example.test`, name: 'Audited', role: 'buyer', password: 'a-long-password' }).expect(201);
    await expect(ctx.ds.query(`UPDATE audit_entry SET actor_name = 'x'`)).rejects.toThrow(/append-only/);
    await expect(ctx.ds.query(`DELETE FROM audit_entry`)).rejects.toThrow(/append-only/);
  });

  it('GET /api/audit lists entries newest first for a quality engineer', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await agent.get('/api/audit?entityType=user&pageSize=5').expect(200);
    expect(res.body.items.length).toBeGreaterThan(0);
    const ids = res.body.items.map((r: { id: string }) => Number(r.id));
    expect([...ids].sort((a, b) => b - a)).toEqual(ids);
  });
});
