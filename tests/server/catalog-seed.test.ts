import { describe, expect, it } from 'vitest';
import { validateBinScheme } from '../../shared/domain/binning/index.ts';
import { DEMO_PARTS, DEMO_SUPPLIERS, seedDemoCatalog } from '../../seed/demo-catalog.ts';
import { signedIn, useTestApp } from './helpers.ts';

const ctx = useTestApp();

describe('demo catalog seed', () => {
  it('loads part types, schemes and suppliers once; a second run creates nothing', async () => {
    await seedDemoCatalog(ctx.ds);
    expect(await seedDemoCatalog(ctx.ds)).toBe(0);
    const { agent } = await signedIn(ctx, 'buyer');
    const parts = await agent.get('/api/part-types?search=HPA-&pageSize=50').expect(200);
    expect(parts.body.total).toBe(DEMO_PARTS.length);
    // Other tests share the database, so look each demo supplier up by its code.
    for (const s of DEMO_SUPPLIERS) {
      const found = await agent.get(`/api/suppliers?search=${encodeURIComponent(s.code)}&pageSize=200`).expect(200);
      expect(found.body.items.map((r: { code: string }) => r.code)).toContain(s.code);
    }
  });

  it('every demo scheme passes the binning rules against its part limits', () => {
    for (const p of DEMO_PARTS) {
      for (const s of p.schemes) expect(validateBinScheme(s.bins, { hfeMin: p.hfeMin, hfeMax: p.hfeMax }).errors).toEqual([]);
    }
  });

  it('the power output NPN has two versions and the older one is locked', async () => {
    await seedDemoCatalog(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const list = await agent.get('/api/part-types?search=HPA-N580').expect(200);
    const schemes = await agent.get(`/api/part-types/${list.body.items[0].id}/bin-schemes`).expect(200);
    expect(schemes.body.map((v: { version: number; locked: boolean; current: boolean }) => [v.version, v.locked, v.current])).toEqual([
      [2, false, true],
      [1, true, false],
    ]);
    const lookup = await agent.get('/api/suppliers/part-lookup?supplierPartNumber=kl-2201-t92').expect(200);
    expect(lookup.body[0]).toMatchObject({ supplier: { code: 'KLC', approval: 'approved' }, partType: { partNumber: 'HPA-N201' } });
  });
});
