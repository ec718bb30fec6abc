import { describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../../shared/api/roles.ts';
import { SiteSetting } from '../../server/modules/settings/site-setting.entity.ts';
import { Lot, LotDocument } from '../../server/modules/lots/lot.entity.ts';
import { signedIn, useTestApp } from './helpers.ts';
import { lotBody, makeCatalog, postLot } from './dock-fixtures.ts';

const ctx = useTestApp();
const RECEIVERS: Role[] = ['inspector', 'quality'];
const pdf = (tag: string) => Buffer.from(`%PDF-1.4\n% ${tag}\n%%EOF\n`);

async function sealedLot() {
  const c = await makeCatalog(ctx.ds);
  const { agent } = await signedIn(ctx, 'inspector');
  return { c, lot: (await postLot(agent, lotBody(c, { dryBag: 'sealed' })).expect(201)).body as { id: number } };
}

describe('Dock write routes × every role', () => {
  it.each(ROLES)('POST /api/lots as %s', async (role) => {
    const c = await makeCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, role);
    const res = await postLot(agent, lotBody(c));
    if (RECEIVERS.includes(role)) expect(res.status).toBe(201);
    else {
      expect(res.status).toBe(403);
      expect(res.body.code).toBe('forbidden');
      expect(await ctx.ds.getRepository(Lot).countBy({ supplierId: c.supplier.id })).toBe(0);
    }
  });

  it.each(ROLES)('PATCH /api/lots/:id/dry-bag as %s', async (role) => {
    const { lot } = await sealedLot();
    const { agent } = await signedIn(ctx, role);
    const res = await agent.patch(`/api/lots/${lot.id}/dry-bag`).set('x-csrf-token', agent.csrf).send({ state: 'opened' });
    expect(res.status).toBe(RECEIVERS.includes(role) ? 200 : 403);
    const row = await ctx.ds.getRepository(Lot).findOneByOrFail({ id: lot.id });
    expect(row.dryBag).toBe(RECEIVERS.includes(role) ? 'opened' : 'sealed');
  });

  it.each(ROLES)('POST /api/lots/:id/documents as %s', async (role) => {
    const { lot } = await sealedLot();
    const { agent } = await signedIn(ctx, role);
    const res = await agent
      .post(`/api/lots/${lot.id}/documents`)
      .set('x-csrf-token', agent.csrf)
      .field('kind', 'coc')
      .attach('file', pdf(`${role}-${lot.id}-${Date.now()}`), 'coc.pdf');
    expect(res.status).toBe(RECEIVERS.includes(role) ? 201 : 403);
    expect(await ctx.ds.getRepository(LotDocument).countBy({ lotId: lot.id })).toBe(RECEIVERS.includes(role) ? 1 : 0);
  });

  it.each(ROLES)('PUT /api/settings/scanner as %s (quality engineers only)', async (role) => {
    const { agent } = await signedIn(ctx, role);
    const res = await agent.put('/api/settings/scanner').set('x-csrf-token', agent.csrf).send({ gs: [], rs: [], eot: [], purchaseOrderPattern: null });
    expect(res.status).toBe(role === 'quality' ? 200 : 403);
    await ctx.ds.getRepository(SiteSetting).delete({ key: 'scanner' });
  });

  it.each(ROLES)('reads stay open to %s: GET /api/lots, POST /api/labels/parse, GET /api/settings/scanner', async (role) => {
    const { agent } = await signedIn(ctx, role);
    await agent.get('/api/lots').expect(200);
    await agent.post('/api/labels/parse').set('x-csrf-token', agent.csrf).send({ text: 'L-20260105-0001' }).expect(200);
    await agent.get('/api/settings/scanner').expect(200);
    await agent.get('/api/lots/receiving-options').expect(200);
  });
});
