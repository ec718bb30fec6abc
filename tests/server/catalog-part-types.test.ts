import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { agentFor, signedIn, useTestApp } from './helpers.ts';
import { NON_QUALITY_ROLES, createPart, fields, partBody, uniq } from './catalog-helpers.ts';

const ctx = useTestApp();

describe('POST /api/part-types', () => {
  it('when a quality engineer sends a valid part, creates it with defaults and audits it', async () => {
    const { agent, user } = await signedIn(ctx, 'quality');
    const body = partBody();
    const res = await agent.post('/api/part-types').set('x-csrf-token', agent.csrf).send(body).expect(201);
    expect(res.body).toMatchObject({
      partNumber: body.partNumber,
      polarity: 'NPN',
      hfeMin: 100,
      hfeMax: 300,
      vbeTcMvPerC: -2,
      samplingMethod: 'attribute',
      inspectionLevel: 'II',
      aql: 1,
      matchHfePct: 5,
      matchVbeMv: 2,
      active: true,
      currentSchemeVersion: null,
    });
    const entries = await ctx.ds.getRepository(AuditEntry).findBy({ entityType: 'part-type', entityId: String(res.body.id) });
    expect(entries).toHaveLength(1);
    expect(entries[0]).toMatchObject({ action: 'part-type.create', actorId: user.id });
    expect(entries[0].after).toMatchObject({ partNumber: body.partNumber, hfeMax: 300 });
  });

  it('when required fields are missing, answers 400 naming each of them', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await agent.post('/api/part-types').set('x-csrf-token', agent.csrf).send({}).expect(400);
    expect(fields(res.body)).toEqual(
      expect.arrayContaining(['partNumber', 'description', 'polarity', 'packageName', 'hfeIcMa', 'hfeVceV', 'vbeIcMa', 'msl']),
    );
  });

  it.each([
    ['polarity', { polarity: 'NPNP' }],
    ['hfeIcMa', { hfeIcMa: 0 }],
    ['hfeVceV', { hfeVceV: -5 }],
    ['vbeIcMa', { vbeIcMa: 'two' }],
    ['hfeMax', { hfeMin: 300, hfeMax: 300 }],
    ['vbeMaxMv', { vbeMinMv: 720, vbeMaxMv: 600 }],
    ['msl', { msl: '7' }],
    ['msl', { msl: 'MSL 3' }],
    ['esdHbmClass', { esdHbmClass: '4C' }],
    ['samplingMethod', { samplingMethod: 'double' }],
    ['inspectionLevel', { inspectionLevel: 'IV' }],
    ['aql', { aql: 0.3 }],
    ['aql', { samplingMethod: 'variables', aql: 0.065 }],
    ['matchHfePct', { matchHfePct: 0 }],
    ['matchVbeMv', { matchVbeMv: -1 }],
    ['vbeTcMvPerC', { vbeTcMvPerC: -50 }],
    ['partNumber', { partNumber: ' ' }],
  ])('when %s is wrong (%j), answers 400 naming it', async (field, override) => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await agent.post('/api/part-types').set('x-csrf-token', agent.csrf).send(partBody(override as never)).expect(400);
    expect(fields(res.body)).toContain(field);
  });

  it('accepts open limits, MSL 2a, an unknown ESD class and the zero-acceptance method', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await agent
      .post('/api/part-types')
      .set('x-csrf-token', agent.csrf)
      .send(partBody({ hfeMin: 80, hfeMax: null, vbeMinMv: null, vbeMaxMv: null, msl: '2a', esdHbmClass: null, samplingMethod: 'zero-acceptance', aql: 0.065 }))
      .expect(201);
    expect(res.body).toMatchObject({ hfeMin: 80, hfeMax: null, msl: '2a', esdHbmClass: null, samplingMethod: 'zero-acceptance', aql: 0.065 });
  });

  it('when the body has an unknown field, answers 400 naming it', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await agent.post('/api/part-types').set('x-csrf-token', agent.csrf).send({ ...partBody(), colour: 'blue' }).expect(400);
    expect(res.body.errors).toContainEqual({ field: 'colour', message: 'colour is not a known field' });
  });

  it('when the part number is already in the catalog (any case), answers 409 naming partNumber', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const first = await createPart(agent);
    const res = await agent
      .post('/api/part-types')
      .set('x-csrf-token', agent.csrf)
      .send(partBody({ partNumber: first.partNumber.toLowerCase() }))
      .expect(409);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(fields(res.body)).toEqual(['partNumber']);
  });
});

describe('GET /api/part-types', () => {
  it('pages, filters by search, polarity, package and active, and sorts by a column', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const tag = uniq();
    await createPart(agent, { partNumber: `F-${tag}-1`, polarity: 'NPN', packageName: `PK-${tag}`, hfeMin: 110 });
    await createPart(agent, { partNumber: `F-${tag}-2`, polarity: 'PNP', packageName: `PK-${tag}`, hfeMin: 120 });
    await createPart(agent, { partNumber: `F-${tag}-3`, polarity: 'PNP', packageName: `PK-${tag}`, hfeMin: 130, active: false });
    await createPart(agent, { partNumber: `F-${tag}-4`, polarity: 'PNP', packageName: 'SOT-23', hfeMin: 140 });

    const all = await agent.get(`/api/part-types?search=F-${tag}&sort=hfeMin&dir=desc`).expect(200);
    expect(all.body.total).toBe(4);
    expect(all.body.items.map((p: { hfeMin: number }) => p.hfeMin)).toEqual([140, 130, 120, 110]);

    const pnpInPackage = await agent.get(`/api/part-types?search=F-${tag}&polarity=PNP&package=pk-${tag}`).expect(200);
    expect(pnpInPackage.body.items.map((p: { partNumber: string }) => p.partNumber)).toEqual([`F-${tag}-2`, `F-${tag}-3`]);

    const activeOnly = await agent.get(`/api/part-types?search=F-${tag}&polarity=PNP&active=true`).expect(200);
    expect(activeOnly.body.items.map((p: { partNumber: string }) => p.partNumber)).toEqual([`F-${tag}-2`, `F-${tag}-4`]);

    const page2 = await agent.get(`/api/part-types?search=F-${tag}&pageSize=3&page=2`).expect(200);
    expect(page2.body).toMatchObject({ total: 4, page: 2, pageSize: 3 });
    expect(page2.body.items).toHaveLength(1);
  });

  it.each([
    ['sort', 'sort=colour'],
    ['polarity', 'polarity=XYZ'],
    ['active', 'active=maybe'],
    ['dir', 'dir=up'],
  ])('with a bad %s, answers 400 naming it', async (field, query) => {
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.get(`/api/part-types?${query}`).expect(400);
    expect(fields(res.body)).toEqual([field]);
  });

  it.each(['inspector', 'buyer', 'assembler', 'quality'] as const)('a signed-in %s can read the list, a part and the packages', async (role) => {
    const { agent: qe } = await signedIn(ctx, 'quality');
    const part = await createPart(qe);
    const { agent } = await signedIn(ctx, role);
    await agent.get('/api/part-types').expect(200);
    const one = await agent.get(`/api/part-types/${part.id}`).expect(200);
    expect(one.body).toMatchObject({ partNumber: part.partNumber, suppliers: [] });
    const packages = await agent.get('/api/part-types/packages').expect(200);
    expect(packages.body).toContain('TO-92');
  });

  it('without a session, answers 401', async () => {
    const anon = await agentFor(ctx.app);
    await anon.get('/api/part-types').expect(401);
  });

  it('an unknown id answers 404 and a malformed one 400', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    await agent.get('/api/part-types/99999999').expect(404);
    const bad = await agent.get('/api/part-types/abc').expect(400);
    expect(fields(bad.body)).toEqual(['id']);
  });
});

describe('PATCH /api/part-types/:id', () => {
  it('changes fields and audits only what changed, before and after', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const res = await agent
      .patch(`/api/part-types/${part.id}`)
      .set('x-csrf-token', agent.csrf)
      .send({ description: 'Renamed', hfeMax: 320, msl: '3', active: false })
      .expect(200);
    expect(res.body).toMatchObject({ description: 'Renamed', hfeMax: 320, msl: '3', active: false });
    const [entry] = await ctx.ds.getRepository(AuditEntry).findBy({ entityType: 'part-type', entityId: String(part.id), action: 'part-type.update' });
    expect(entry.before).toEqual({ description: 'Test small-signal NPN', hfeMax: 300, msl: 'not-classified', active: true });
    expect(entry.after).toEqual({ description: 'Renamed', hfeMax: 320, msl: '3', active: false });
  });

  it('checks min < max against the stored values: hfeMin above the stored hfeMax answers 400 naming hfeMax', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const res = await agent.patch(`/api/part-types/${part.id}`).set('x-csrf-token', agent.csrf).send({ hfeMin: 400 }).expect(400);
    expect(fields(res.body)).toEqual(['hfeMax']);
  });

  it('refuses null for a required field and an empty body, naming the problem', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const part = await createPart(agent);
    const res = await agent.patch(`/api/part-types/${part.id}`).set('x-csrf-token', agent.csrf).send({ description: null }).expect(400);
    expect(fields(res.body)).toContain('description');
    await agent.patch(`/api/part-types/${part.id}`).set('x-csrf-token', agent.csrf).send({}).expect(400);
  });

  it('renaming to a part number in use answers 409 naming partNumber', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const a = await createPart(agent);
    const b = await createPart(agent);
    const res = await agent.patch(`/api/part-types/${b.id}`).set('x-csrf-token', agent.csrf).send({ partNumber: a.partNumber }).expect(409);
    expect(fields(res.body)).toEqual(['partNumber']);
  });

  it('an unknown part type answers 404', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    await agent.patch('/api/part-types/99999999').set('x-csrf-token', agent.csrf).send({ description: 'x y' }).expect(404);
  });
});

describe('part-type writes need the quality role', () => {
  const routes = [
    ['POST /api/part-types', 'post', () => '/api/part-types'],
    ['PATCH /api/part-types/:id', 'patch', (id: number) => `/api/part-types/${id}`],
    ['POST /api/part-types/:id/bin-schemes', 'post', (id: number) => `/api/part-types/${id}/bin-schemes`],
    ['PUT /api/part-types/:id/bin-schemes/:version', 'put', (id: number) => `/api/part-types/${id}/bin-schemes/1`],
  ] as const;
  const cases = NON_QUALITY_ROLES.flatMap((role) => routes.map(([name, method, url]) => ({ role, name, method, url })));

  it.each(cases)('$name as $role answers 403 and changes nothing', async ({ role, method, url }) => {
    const { agent: qe } = await signedIn(ctx, 'quality');
    const part = await createPart(qe);
    const { agent } = await signedIn(ctx, role);
    const before = await ctx.ds.getRepository(AuditEntry).count();
    const res = await agent[method](url(part.id)).set('x-csrf-token', agent.csrf).send(partBody()).expect(403);
    expect(res.body.detail).toMatch(/quality/);
    expect(await ctx.ds.getRepository(AuditEntry).count()).toBe(before);
  });
});
