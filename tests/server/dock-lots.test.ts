import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { Lot } from '../../server/modules/lots/lot.entity.ts';
import { signedIn, useTestApp } from './helpers.ts';
import { labelElements, lotBody, makeCatalog, postLot, typedLabel, uniq } from './dock-fixtures.ts';

const ctx = useTestApp();
const HOUR = 3_600_000;

describe('POST /api/lots', () => {
  it('an inspector receives a scanned lot: own code, fields, label elements and fingerprint kept, audited', async () => {
    const c = await makeCatalog(ctx.ds);
    const { agent, user } = await signedIn(ctx, 'inspector');
    const elements = labelElements(c, ['3SPKG-77']);
    const labelText = typedLabel(elements);
    const res = await postLot(
      agent,
      lotBody(c, {
        quantity: 500,
        purchaseOrder: ' PO-20458 ',
        supplierPartNumber: c.supplierPartNumber,
        supplierLot: 'Z2331B',
        dateCode: '2331',
        countryOfOrigin: 'my',
        msl: '3',
        dryBag: 'sealed',
        labelText,
      }),
    ).expect(201);
    expect(res.headers.location).toBe(`/api/lots/${res.body.id}`);
    expect(res.body.code).toMatch(/^L-\d{8}-\d{4}$/);
    expect(res.body.code.slice(2, 10)).toBe(new Date().toISOString().slice(0, 10).replace(/-/g, ''));
    expect(res.body).toMatchObject({
      status: 'received',
      quantity: 500,
      purchaseOrder: 'PO-20458',
      supplierLot: 'Z2331B',
      countryOfOrigin: 'MY',
      msl: '3',
      dryBag: 'sealed',
      bagOpenedAt: null,
      receivedBy: { id: user.id, name: user.name },
      override: null,
      supplier: { id: c.supplier.id, approval: 'approved' },
      partType: { id: c.partType.id, esdHbmClass: '1B' },
    });
    expect(res.body.label.elements).toContainEqual({ di: '3S', value: 'PKG-77' });
    expect(res.body.label.raw).toBe(labelText);
    expect(res.body.floorLife.state).toBe('sealed');

    const row = await ctx.ds.getRepository(Lot).findOneByOrFail({ id: res.body.id });
    expect(row.labelFingerprint).toMatch(/^[0-9a-f]{64}$/);
    const entries = await ctx.ds.getRepository(AuditEntry).findBy({ entityType: 'lot', entityId: String(res.body.id) });
    expect(entries.map((e) => e.action)).toEqual(['lot.create']);
    expect(entries[0].after).toMatchObject({ code: res.body.code, quantity: 500, labelFingerprint: row.labelFingerprint });
  });

  it('two lots received the same day get rising sequence numbers', async () => {
    const c = await makeCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const a = await postLot(agent, lotBody(c)).expect(201);
    const b = await postLot(agent, lotBody(c)).expect(201);
    expect(b.body.code > a.body.code).toBe(true);
    expect(Number(b.body.code.slice(-4))).toBeGreaterThan(Number(a.body.code.slice(-4)));
  });

  it('the same label twice, even typed with other separators, answers 409 with the existing lot code and creates no second lot', async () => {
    const c = await makeCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const elements = labelElements(c);
    const first = await postLot(agent, lotBody(c, { labelText: typedLabel(elements) })).expect(201);
    const again = await postLot(agent, lotBody(c, { labelText: `[)>\u001e06\u001d${elements.join('\u001d')}\u001e\u0004` })).expect(409);
    expect(again.body.detail).toContain(first.body.code);
    expect(again.body.errors).toEqual([{ field: 'labelText', message: `already received as lot ${first.body.code}` }]);
    expect(await ctx.ds.getRepository(Lot).countBy({ supplierId: c.supplier.id })).toBe(1);
  });

  it('a label that is not ISO/IEC 15434 answers 422 naming labelText; a malformed one too', async () => {
    const c = await makeCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const plain = await postLot(agent, lotBody(c, { labelText: 'PO-12345' })).expect(422);
    expect(plain.body.errors[0].field).toBe('labelText');
    const broken = await postLot(agent, lotBody(c, { labelText: '[)>06<GS>1PX' })).expect(422);
    expect(broken.body.errors[0]).toMatchObject({ field: 'labelText' });
  });

  describe('a supplier that is not approved', () => {
    it('refuses an inspector without override (409) and with one (403); no lot is created', async () => {
      const c = await makeCatalog(ctx.ds, { approval: 'not-approved' });
      const { agent } = await signedIn(ctx, 'inspector');
      const plain = await postLot(agent, lotBody(c)).expect(409);
      expect(plain.body.code).toBe('supplier-not-approved');
      expect(plain.body.errors).toEqual([{ field: 'supplierId', message: 'supplier is not approved' }]);
      const withOverride = await postLot(agent, lotBody(c, { override: { reason: 'Sole source for the repair depot order' } })).expect(403);
      expect(withOverride.body.detail).toMatch(/Only a quality engineer/);
      expect(await ctx.ds.getRepository(Lot).countBy({ supplierId: c.supplier.id })).toBe(0);
    });

    it('refuses a quality engineer without override (409)', async () => {
      const c = await makeCatalog(ctx.ds, { approval: 'not-approved' });
      const { agent } = await signedIn(ctx, 'quality');
      await postLot(agent, lotBody(c)).expect(409);
    });

    it('allows a quality engineer with an override; the override is kept on the lot and in the audit trail', async () => {
      const c = await makeCatalog(ctx.ds, { approval: 'not-approved' });
      const { agent, user } = await signedIn(ctx, 'quality');
      const reason = 'Sole source; 100 % screening ordered before use';
      const res = await postLot(agent, lotBody(c, { override: { reason } })).expect(201);
      expect(res.body.override).toEqual({ by: { id: user.id, name: user.name }, reason });
      const entries = await ctx.ds.getRepository(AuditEntry).find({ where: { entityType: 'lot', entityId: String(res.body.id) }, order: { id: 'ASC' } });
      expect(entries.map((e) => e.action)).toEqual(['lot.create', 'lot.supplier-override']);
      expect(entries[1]).toMatchObject({ actorId: user.id, note: reason });
      expect(entries[1].after).toMatchObject({ supplierId: c.supplier.id, approval: 'not-approved', lotCode: res.body.code });
      expect(entries[0].after).toMatchObject({ overrideBy: user.id, overrideReason: reason });
    });

    it('with an override reason that is too short, answers 400 naming override.reason', async () => {
      const c = await makeCatalog(ctx.ds, { approval: 'not-approved' });
      const { agent } = await signedIn(ctx, 'quality');
      const res = await postLot(agent, lotBody(c, { override: { reason: 'ok' } })).expect(400);
      expect(res.body.errors.map((e: { field: string }) => e.field)).toEqual(['override.reason']);
    });
  });

  it('a conditionally approved supplier needs no override', async () => {
    const c = await makeCatalog(ctx.ds, { approval: 'conditional' });
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await postLot(agent, lotBody(c)).expect(201);
    expect(res.body.override).toBeNull();
  });

  it('with missing and bad fields, answers 400 naming each field', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await postLot(agent, { supplierId: 'one', quantity: 0, dryBag: 'torn', countryOfOrigin: 'Malaysia', msl: '7', bagOpenedAt: 'yesterday' }).expect(400);
    const fields = res.body.errors.map((e: { field: string }) => e.field);
    expect(fields).toEqual(expect.arrayContaining(['supplierId', 'partTypeId', 'quantity', 'dryBag', 'countryOfOrigin', 'msl', 'bagOpenedAt']));
    expect(res.body.detail).toMatch(/^Check /);
  });

  it('with an unknown field, answers 400 naming it', async () => {
    const c = await makeCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await postLot(agent, lotBody(c, { code: 'L-20990101-0001' })).expect(400);
    expect(res.body.errors).toEqual([{ field: 'code', message: 'code is not a known field' }]);
  });

  it('with a supplier or part type that does not exist, answers 422 naming it', async () => {
    const c = await makeCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await postLot(agent, lotBody(c, { supplierId: 99_999_999 })).expect(422);
    expect(res.body.errors).toEqual([{ field: 'supplierId', message: 'no supplier with id 99999999' }]);
  });

  it('bagOpenedAt with a sealed bag, or in the future, answers 400 naming bagOpenedAt', async () => {
    const c = await makeCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const sealed = await postLot(agent, lotBody(c, { dryBag: 'sealed', bagOpenedAt: new Date().toISOString() })).expect(400);
    expect(sealed.body.errors[0].field).toBe('bagOpenedAt');
    const future = await postLot(agent, lotBody(c, { dryBag: 'opened', bagOpenedAt: new Date(Date.now() + 2 * HOUR).toISOString() })).expect(400);
    expect(future.body.errors[0].field).toBe('bagOpenedAt');
  });
});

describe('floor life (J-STD-033, MSL floor-life hours per reference.md §6 [from memory])', () => {
  it.each([
    // MSL 3: 168 h at ≤ 30 °C / 60 % RH; warning from 80 % (134.4 h) [common practice default of shared/domain/moisture].
    [10, 'ok'],
    [150, 'warning'],
    [170, 'expired'],
  ])('an MSL 3 bag opened %i h ago is %s', async (hoursAgo, state) => {
    const c = await makeCatalog(ctx.ds, { msl: '3' });
    const { agent } = await signedIn(ctx, 'inspector');
    const openedAt = new Date(Date.now() - hoursAgo * HOUR).toISOString();
    const res = await postLot(agent, lotBody(c, { msl: '3', dryBag: 'opened', bagOpenedAt: openedAt })).expect(201);
    expect(res.body.floorLife).toMatchObject({ state, msl: '3', floorLifeHours: 168, bagOpenedAt: openedAt });
    expect(res.body.floorLife.hoursLeft).toBeCloseTo(Math.max(0, 168 - hoursAgo), 1);
    if (state === 'expired') expect(res.body.floorLife.message).toMatch(/bake/);
    const list = await agent.get(`/api/lots?supplierId=${c.supplier.id}`).expect(200);
    expect(list.body.items[0].floorLife.state).toBe(state);
  });

  it('the part type MSL applies when the lot has none; a not-classified part has no clock', async () => {
    const msl4 = await makeCatalog(ctx.ds, { msl: '4' });
    const none = await makeCatalog(ctx.ds, { msl: 'not-classified' });
    const { agent } = await signedIn(ctx, 'inspector');
    const a = await postLot(agent, lotBody(msl4, { dryBag: 'opened' })).expect(201);
    expect(a.body.floorLife).toMatchObject({ state: 'ok', msl: '4', floorLifeHours: 72 });
    const b = await postLot(agent, lotBody(none, { dryBag: 'not-applicable' })).expect(201);
    expect(b.body.floorLife).toMatchObject({ state: 'not-applicable', msl: null, hoursLeft: null });
    const c = await postLot(agent, lotBody(msl4, { dryBag: 'not-applicable' })).expect(201);
    expect(c.body.floorLife.state).toBe('unknown');
  });

  it('PATCH /api/lots/:id/dry-bag starts the clock once, audited; a second time answers 409', async () => {
    const c = await makeCatalog(ctx.ds, { msl: '3' });
    const { agent, user } = await signedIn(ctx, 'inspector');
    const lot = await postLot(agent, lotBody(c, { dryBag: 'sealed' })).expect(201);
    const openedAt = new Date(Date.now() - 2 * HOUR).toISOString();
    const res = await agent.patch(`/api/lots/${lot.body.id}/dry-bag`).set('x-csrf-token', agent.csrf).send({ state: 'opened', openedAt }).expect(200);
    expect(res.body).toMatchObject({ dryBag: 'opened', bagOpenedAt: openedAt, floorLife: { state: 'ok' } });
    expect(res.body.floorLife.hoursLeft).toBeCloseTo(166, 1);
    const [entry] = await ctx.ds.getRepository(AuditEntry).findBy({ entityType: 'lot', entityId: String(lot.body.id), action: 'lot.dry-bag-open' });
    expect(entry).toMatchObject({ actorId: user.id, before: { dryBag: 'sealed', bagOpenedAt: null }, after: { dryBag: 'opened', bagOpenedAt: openedAt } });
    const again = await agent.patch(`/api/lots/${lot.body.id}/dry-bag`).set('x-csrf-token', agent.csrf).send({ state: 'opened' }).expect(409);
    expect(again.body.detail).toMatch(/already opened/);
  });

  it('PATCH dry-bag with another state, a future time or an unknown field answers 400 naming it', async () => {
    const c = await makeCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const lot = await postLot(agent, lotBody(c)).expect(201);
    const url = `/api/lots/${lot.body.id}/dry-bag`;
    expect((await agent.patch(url).set('x-csrf-token', agent.csrf).send({ state: 'sealed' }).expect(400)).body.errors[0].field).toBe('state');
    const future = new Date(Date.now() + 3 * HOUR).toISOString();
    expect((await agent.patch(url).set('x-csrf-token', agent.csrf).send({ state: 'opened', openedAt: future }).expect(400)).body.errors[0].field).toBe('openedAt');
    expect((await agent.patch(url).set('x-csrf-token', agent.csrf).send({ state: 'opened', by: 'me' }).expect(400)).body.errors[0].field).toBe('by');
    await agent.patch('/api/lots/99999999/dry-bag').set('x-csrf-token', agent.csrf).send({ state: 'opened' }).expect(404);
  });
});

describe('GET /api/lots', () => {
  async function threeLots() {
    const c = await makeCatalog(ctx.ds);
    const other = await makeCatalog(ctx.ds, { supplier: c.supplier });
    const { agent } = await signedIn(ctx, 'inspector');
    const tag = uniq();
    const a = await postLot(agent, lotBody(c, { purchaseOrder: `PO-${tag}`, supplierLot: 'AAA' })).expect(201);
    const b = await postLot(agent, lotBody(c, { quantity: 20, supplierLot: `SL-${tag}` })).expect(201);
    const d = await postLot(agent, lotBody(other, { quantity: 7000 })).expect(201);
    return { c, other, agent, tag, a: a.body, b: b.body, d: d.body };
  }

  it('filters by supplier and part type, sorts and pages on the server', async () => {
    const { c, other, agent, a, b, d } = await threeLots();
    const bySupplier = await agent.get(`/api/lots?supplierId=${c.supplier.id}&sort=quantity&dir=desc`).expect(200);
    expect(bySupplier.body.total).toBe(3);
    expect(bySupplier.body.items.map((l: { id: number }) => l.id)).toEqual([d.id, a.id, b.id]);
    expect(bySupplier.body.items[0]).toMatchObject({ supplier: { id: c.supplier.id, code: c.supplier.code }, partType: { id: other.partType.id } });
    const byPart = await agent.get(`/api/lots?partTypeId=${c.partType.id}`).expect(200);
    expect(byPart.body.items.map((l: { id: number }) => l.id).sort()).toEqual([a.id, b.id].sort());
    const page2 = await agent.get(`/api/lots?supplierId=${c.supplier.id}&sort=code&dir=asc&pageSize=2&page=2`).expect(200);
    expect(page2.body).toMatchObject({ total: 3, page: 2, pageSize: 2 });
    expect(page2.body.items.map((l: { id: number }) => l.id)).toEqual([d.id]);
  });

  it('searches code, PO and supplier lot; filters status and received dates', async () => {
    const { c, agent, tag, a, b } = await threeLots();
    expect((await agent.get(`/api/lots?search=${tag.toLowerCase()}`).expect(200)).body.items.map((l: { id: number }) => l.id).sort()).toEqual([a.id, b.id].sort());
    expect((await agent.get(`/api/lots?search=${a.code}`).expect(200)).body.items.map((l: { id: number }) => l.id)).toEqual([a.id]);
    const today = new Date().toISOString().slice(0, 10);
    const inRange = await agent.get(`/api/lots?supplierId=${c.supplier.id}&receivedFrom=${today}&receivedTo=${today}&status=received`).expect(200);
    expect(inRange.body.total).toBe(3);
    expect((await agent.get(`/api/lots?supplierId=${c.supplier.id}&receivedTo=2020-01-01`).expect(200)).body.total).toBe(0);
    expect((await agent.get(`/api/lots?supplierId=${c.supplier.id}&status=accepted`).expect(200)).body.total).toBe(0);
  });

  it('with bad or unknown parameters, answers 400 naming each', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.get('/api/lots?status=lost&sort=colour&receivedFrom=2026-02-30&supplierId=x').expect(400);
    expect(res.body.errors.map((e: { field: string }) => e.field)).toEqual(['status', 'sort', 'receivedFrom', 'supplierId']);
    const unknown = await agent.get('/api/lots?supplier=3').expect(400);
    expect(unknown.body.errors).toEqual([{ field: 'supplier', message: 'supplier is not a known filter' }]);
  });

  it.each(['buyer', 'assembler'] as const)('a %s can read the lots list and a lot (other areas use them)', async (role) => {
    const { a } = await threeLots();
    const { agent } = await signedIn(ctx, role);
    await agent.get('/api/lots').expect(200);
    const detail = await agent.get(`/api/lots/${a.id}`).expect(200);
    expect(detail.body.code).toBe(a.code);
  });
});

describe('GET /api/lots/:id', () => {
  it('returns the lot with supplier, part type incl. ESD class and range, documents and floor life', async () => {
    const c = await makeCatalog(ctx.ds, { esdHbmClass: '1A' });
    const { agent } = await signedIn(ctx, 'inspector');
    const lot = await postLot(agent, lotBody(c)).expect(201);
    const res = await agent.get(`/api/lots/${lot.body.id}`).expect(200);
    expect(res.body).toMatchObject({
      id: lot.body.id,
      supplier: { id: c.supplier.id, name: c.supplier.name, approval: 'approved' },
      partType: { partNumber: c.partType.partNumber, esdHbmClass: '1A', polarity: 'NPN', packageName: 'SOT-23', msl: '3' },
      // ANSI/ESDA/JEDEC JS-001 HBM class 1A: 250 V to < 500 V (reference.md §6).
      esd: { hbmClass: '1A', range: '250 V to < 500 V' },
      documents: [],
      label: null,
    });
    expect(res.body.floorLife.state).toBe('sealed');
  });

  it('a missing lot answers 404, a bad id 400', async () => {
    const { agent } = await signedIn(ctx, 'buyer');
    await agent.get('/api/lots/99999999').expect(404);
    const bad = await agent.get('/api/lots/abc').expect(400);
    expect(bad.body.errors[0].field).toBe('id');
  });

  it('GET /api/lots/receiving-options lists suppliers with approval and active part types', async () => {
    const c = await makeCatalog(ctx.ds, { approval: 'conditional' });
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.get('/api/lots/receiving-options').expect(200);
    expect(res.body.suppliers).toContainEqual({ id: c.supplier.id, code: c.supplier.code, name: c.supplier.name, approval: 'conditional' });
    expect(res.body.partTypes).toContainEqual(expect.objectContaining({ id: c.partType.id, partNumber: c.partType.partNumber, msl: '3', esdHbmClass: '1B' }));
  });
});
