import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { signedIn, useTestApp, type Agent } from './helpers.ts';
import { NON_QUALITY_ROLES, createPart, createSupplierVia, fields, insertLot, uniq } from './catalog-helpers.ts';

const ctx = useTestApp();

const auditOf = (supplierId: number) => ctx.ds.getRepository(AuditEntry).find({ where: { entityType: 'supplier', entityId: String(supplierId) }, order: { id: 'ASC' } });

function send(agent: Agent, method: 'post' | 'patch' | 'delete', url: string, body?: object) {
  const req = agent[method](url).set('x-csrf-token', agent.csrf);
  return body ? req.send(body) : req;
}

describe('POST /api/suppliers', () => {
  it('creates a supplier with an upper-case code and audits it', async () => {
    const { agent, user } = await signedIn(ctx, 'quality');
    const code = `k${uniq()}`.toLowerCase();
    const res = await send(agent, 'post', '/api/suppliers', { code, name: 'Fictional Parts GmbH', approval: 'conditional', notes: '  trial  ' }).expect(201);
    expect(res.body).toMatchObject({ code: code.toUpperCase(), name: 'Fictional Parts GmbH', approval: 'conditional', notes: 'trial', contacts: [], parts: [] });
    const entries = await auditOf(res.body.id);
    expect(entries.map((e) => [e.action, e.actorId])).toEqual([['supplier.create', user.id]]);
  });

  it('with missing, bad and unknown fields answers 400 naming each', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await send(agent, 'post', '/api/suppliers', { code: 'has space', approval: 'maybe', rating: 5 }).expect(400);
    expect(fields(res.body)).toEqual(expect.arrayContaining(['code', 'name', 'approval', 'rating']));
  });

  it('a code already in use (any case) answers 409 naming code', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const first = await createSupplierVia(agent);
    const res = await send(agent, 'post', '/api/suppliers', { code: first.code.toLowerCase(), name: 'Copy Cat' }).expect(409);
    expect(fields(res.body)).toEqual(['code']);
  });
});

describe('GET /api/suppliers', () => {
  it('filters by approval and search, sorts, pages and counts contacts and parts', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const tag = uniq();
    const a = await createSupplierVia(agent, { code: `A${tag}`, name: `Alpha ${tag}`, approval: 'approved' });
    await createSupplierVia(agent, { code: `B${tag}`, name: `Beta ${tag}`, approval: 'not-approved' });
    await createSupplierVia(agent, { code: `C${tag}`, name: `Gamma ${tag}`, approval: 'approved' });
    await send(agent, 'post', `/api/suppliers/${a.id}/contacts`, { name: 'Ann Example', email: 'ann@example.test' }).expect(201);

    const approved = await agent.get(`/api/suppliers?search=${tag}&approval=approved&sort=name&dir=desc`).expect(200);
    expect(approved.body.items.map((s: { name: string }) => s.name)).toEqual([`Gamma ${tag}`, `Alpha ${tag}`]);
    expect(approved.body.items[1]).toMatchObject({ contactCount: 1, partCount: 0 });

    const paged = await agent.get(`/api/suppliers?search=${tag}&pageSize=2&page=2&sort=code`).expect(200);
    expect(paged.body).toMatchObject({ total: 3, page: 2 });
    expect(paged.body.items.map((s: { code: string }) => s.code)).toEqual([`C${tag}`]);

    const bad = await agent.get('/api/suppliers?approval=sometimes').expect(400);
    expect(fields(bad.body)).toEqual(['approval']);
  });

  it.each(['inspector', 'buyer', 'assembler'] as const)('a signed-in %s can read the list and a supplier', async (role) => {
    const { agent: qe } = await signedIn(ctx, 'quality');
    const s = await createSupplierVia(qe);
    const { agent } = await signedIn(ctx, role);
    await agent.get('/api/suppliers').expect(200);
    await agent.get(`/api/suppliers/${s.id}`).expect(200);
  });
});

describe('PATCH /api/suppliers/:id', () => {
  it('an approval change is its own audit entry carrying the reason; other fields are a plain update', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const s = await createSupplierVia(agent);
    const res = await send(agent, 'patch', `/api/suppliers/${s.id}`, {
      approval: 'not-approved',
      approvalReason: 'two counterfeit lots',
      name: 'Renamed Distribution',
    }).expect(200);
    expect(res.body).toMatchObject({ approval: 'not-approved', name: 'Renamed Distribution' });
    const entries = await auditOf(s.id);
    const approval = entries.find((e) => e.action === 'supplier.approval-change')!;
    expect(approval.before).toEqual({ approval: 'approved' });
    expect(approval.after).toEqual({ approval: 'not-approved' });
    expect(approval.note).toBe('Approved → Not approved: two counterfeit lots');
    const update = entries.find((e) => e.action === 'supplier.update')!;
    expect(update.before).toEqual({ name: 'Test Distribution Ltd' });
    expect(update.after).toEqual({ name: 'Renamed Distribution' });
  });

  it('a code in use answers 409; an unknown supplier 404; a bad approval 400 naming approval', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const a = await createSupplierVia(agent);
    const b = await createSupplierVia(agent);
    expect(fields((await send(agent, 'patch', `/api/suppliers/${b.id}`, { code: a.code }).expect(409)).body)).toEqual(['code']);
    await send(agent, 'patch', '/api/suppliers/99999999', { name: 'Nobody' }).expect(404);
    expect(fields((await send(agent, 'patch', `/api/suppliers/${a.id}`, { approval: 'great' }).expect(400)).body)).toEqual(['approval']);
  });
});

describe('supplier contacts', () => {
  it('adds, changes and removes a contact, auditing each step on the supplier', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const s = await createSupplierVia(agent);
    const added = await send(agent, 'post', `/api/suppliers/${s.id}/contacts`, { name: 'Mira Holt', email: 'Mira.Holt@Example.test', duty: 'quality' }).expect(201);
    expect(added.body).toMatchObject({ name: 'Mira Holt', email: 'mira.holt@example.test', duty: 'quality', phone: null });
    const changed = await send(agent, 'patch', `/api/suppliers/${s.id}/contacts/${added.body.id}`, { phone: '+44 1632 960000' }).expect(200);
    expect(changed.body.phone).toBe('+44 1632 960000');
    const detail = await agent.get(`/api/suppliers/${s.id}`).expect(200);
    expect(detail.body.contacts).toHaveLength(1);
    await send(agent, 'delete', `/api/suppliers/${s.id}/contacts/${added.body.id}`).expect(204);
    expect((await agent.get(`/api/suppliers/${s.id}`).expect(200)).body.contacts).toEqual([]);
    expect((await auditOf(s.id)).map((e) => e.action)).toEqual(['supplier.create', 'supplier.contact-add', 'supplier.contact-update', 'supplier.contact-remove']);
  });

  it('a bad e-mail answers 400 naming email; the same e-mail twice answers 409 naming email', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const s = await createSupplierVia(agent);
    expect(fields((await send(agent, 'post', `/api/suppliers/${s.id}/contacts`, { name: 'No Mail', email: 'not-an-address' }).expect(400)).body)).toEqual(['email']);
    await send(agent, 'post', `/api/suppliers/${s.id}/contacts`, { name: 'Ann One', email: 'ann@example.test' }).expect(201);
    const dup = await send(agent, 'post', `/api/suppliers/${s.id}/contacts`, { name: 'Ann Two', email: 'ANN@example.test' }).expect(409);
    expect(fields(dup.body)).toEqual(['email']);
  });

  it("a contact of another supplier answers 404 and is left alone", async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const a = await createSupplierVia(agent);
    const b = await createSupplierVia(agent);
    const c = await send(agent, 'post', `/api/suppliers/${a.id}/contacts`, { name: 'Kept Contact', email: 'kept@example.test' }).expect(201);
    await send(agent, 'delete', `/api/suppliers/${b.id}/contacts/${c.body.id}`).expect(404);
    await send(agent, 'patch', `/api/suppliers/${b.id}/contacts/${c.body.id}`, { name: 'Hijack' }).expect(404);
    expect((await agent.get(`/api/suppliers/${a.id}`).expect(200)).body.contacts[0].name).toBe('Kept Contact');
  });
});

describe('supplier part-number mappings and the look-up', () => {
  it('maps supplier part numbers to part types; the look-up finds them across suppliers, ignoring case', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const a = await createSupplierVia(agent, { approval: 'conditional' });
    const b = await createSupplierVia(agent, { approval: 'approved' });
    const spn = `SPN-${uniq()}`;
    const m = await send(agent, 'post', `/api/suppliers/${a.id}/parts`, { supplierPartNumber: spn, partTypeId: part.id }).expect(201);
    expect(m.body).toMatchObject({ supplierPartNumber: spn, partTypeId: part.id, partNumber: part.partNumber, lotCount: 0 });
    await send(agent, 'post', `/api/suppliers/${b.id}/parts`, { supplierPartNumber: spn, partTypeId: part.id }).expect(201);

    const { agent: inspector } = await signedIn(ctx, 'inspector');
    const look = await inspector.get(`/api/suppliers/part-lookup?supplierPartNumber=${encodeURIComponent(` ${spn.toLowerCase()} `)}`).expect(200);
    expect(look.body).toHaveLength(2);
    // Approved suppliers come first.
    expect(look.body.map((r: { supplier: { id: number } }) => r.supplier.id)).toEqual([b.id, a.id]);
    expect(look.body[0]).toMatchObject({ supplierPartNumber: spn, partType: { id: part.id, partNumber: part.partNumber, polarity: 'NPN', msl: 'not-classified' } });

    const none = await inspector.get('/api/suppliers/part-lookup?supplierPartNumber=NOTHING-LIKE-THIS').expect(200);
    expect(none.body).toEqual([]);
    const missing = await inspector.get('/api/suppliers/part-lookup').expect(400);
    expect(fields(missing.body)).toEqual(['supplierPartNumber']);

    const partDetail = await agent.get(`/api/part-types/${part.id}`).expect(200);
    expect(partDetail.body.suppliers.map((s: { supplierId: number }) => s.supplierId).sort()).toEqual([a.id, b.id].sort());
  });

  it('a supplier part number mapped twice answers 409; an unknown part type 422; both name the field', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const s = await createSupplierVia(agent);
    await send(agent, 'post', `/api/suppliers/${s.id}/parts`, { supplierPartNumber: 'XK-100', partTypeId: part.id }).expect(201);
    const dup = await send(agent, 'post', `/api/suppliers/${s.id}/parts`, { supplierPartNumber: 'xk-100', partTypeId: part.id }).expect(409);
    expect(fields(dup.body)).toEqual(['supplierPartNumber']);
    const unknown = await send(agent, 'post', `/api/suppliers/${s.id}/parts`, { supplierPartNumber: 'XK-200', partTypeId: 99999999 }).expect(422);
    expect(fields(unknown.body)).toEqual(['partTypeId']);
    const bad = await send(agent, 'post', `/api/suppliers/${s.id}/parts`, { supplierPartNumber: '', partTypeId: 'one' }).expect(400);
    expect(fields(bad.body)).toEqual(expect.arrayContaining(['supplierPartNumber', 'partTypeId']));
  });

  it('removing a mapping that lots were received under is allowed: the lots keep their part type and the audit notes them', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const s = await createSupplierVia(agent);
    const m = await send(agent, 'post', `/api/suppliers/${s.id}/parts`, { supplierPartNumber: 'ZZ-1', partTypeId: part.id }).expect(201);
    const lotId = await insertLot(ctx.ds, { supplierId: s.id, partTypeId: part.id, supplierPartNumber: 'ZZ-1' });
    const detail = await agent.get(`/api/suppliers/${s.id}`).expect(200);
    expect(detail.body.parts[0].lotCount).toBe(1);

    await send(agent, 'delete', `/api/suppliers/${s.id}/parts/${m.body.id}`).expect(204);
    const [lot] = await ctx.ds.query(`SELECT part_type_id FROM lot WHERE id = $1`, [lotId]);
    expect(lot.part_type_id).toBe(part.id);
    const unmap = (await auditOf(s.id)).find((e) => e.action === 'supplier.part-unmap')!;
    expect(unmap.before).toMatchObject({ supplierPartNumber: 'ZZ-1', partNumber: part.partNumber });
    expect(unmap.note).toMatch(/1 lot was received/);
    await send(agent, 'delete', `/api/suppliers/${s.id}/parts/${m.body.id}`).expect(404);
  });
});

describe('supplier writes need the quality role', () => {
  const routes = [
    ['POST /api/suppliers', 'post', () => '/api/suppliers'],
    ['PATCH /api/suppliers/:id', 'patch', (s: number) => `/api/suppliers/${s}`],
    ['POST /api/suppliers/:id/contacts', 'post', (s: number) => `/api/suppliers/${s}/contacts`],
    ['PATCH /api/suppliers/:id/contacts/:contactId', 'patch', (s: number, c: number) => `/api/suppliers/${s}/contacts/${c}`],
    ['DELETE /api/suppliers/:id/contacts/:contactId', 'delete', (s: number, c: number) => `/api/suppliers/${s}/contacts/${c}`],
    ['POST /api/suppliers/:id/parts', 'post', (s: number) => `/api/suppliers/${s}/parts`],
    ['DELETE /api/suppliers/:id/parts/:mappingId', 'delete', (s: number, _c: number, m: number) => `/api/suppliers/${s}/parts/${m}`],
  ] as const;
  const cases = NON_QUALITY_ROLES.flatMap((role) => routes.map(([name, method, url]) => ({ role, name, method, url })));

  it.each(cases)('$name as $role answers 403 and changes nothing', async ({ role, method, url }) => {
    const { agent: qe } = await signedIn(ctx, 'quality');
    const part = await createPart(qe);
    const s = await createSupplierVia(qe);
    const contact = await send(qe, 'post', `/api/suppliers/${s.id}/contacts`, { name: 'Guarded Contact', email: 'guard@example.test' }).expect(201);
    const mapping = await send(qe, 'post', `/api/suppliers/${s.id}/parts`, { supplierPartNumber: 'G-1', partTypeId: part.id }).expect(201);
    const before = await ctx.ds.getRepository(AuditEntry).count();
    const { agent } = await signedIn(ctx, role);
    const res = await send(agent, method, url(s.id, contact.body.id, mapping.body.id), { name: 'Intruder Ltd', code: `X${uniq()}` }).expect(403);
    expect(res.body.detail).toMatch(/quality/);
    expect(await ctx.ds.getRepository(AuditEntry).count()).toBe(before);
    const after = await qe.get(`/api/suppliers/${s.id}`).expect(200);
    expect(after.body).toMatchObject({ name: 'Test Distribution Ltd', contactCount: 1, partCount: 1 });
  });
});
