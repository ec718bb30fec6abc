import { describe, expect, it } from 'vitest';
import { SwitchingStateRow } from '../../server/modules/sampling/switching-state.entity.ts';
import { makeBenchLot } from './bench-fixtures.ts';
import { signedIn, useTestApp } from './helpers.ts';

const ctx = useTestApp();

describe('GET /api/sampling/plan', () => {
  // Spot checks of reference.md §1.3, derived from ISO 2859-1 Table 1 and Table 2-A (normal inspection).
  it.each([
    ['lot 1 000, level II, AQL 1.0 → J, n 80, Ac 2 / Re 3 (ISO 2859-1 Table 1 + Table 2-A)', 1000, 'II', 1.0, 'J', 80, 2, 3],
    ['lot 100, level II, AQL 1.0 → F, arrow up to E, n 13, 0/1 (ISO 2859-1 Table 2-A)', 100, 'II', 1.0, 'F', 13, 0, 1],
    ['lot 50, level II, AQL 4.0 → D, arrow down to E, n 13, 1/2 (ISO 2859-1 Table 2-A)', 50, 'II', 4.0, 'D', 13, 1, 2],
    ['lot 2 000, level II, AQL 2.5 → K, n 125, 7/8 (ISO 2859-1 Table 2-A)', 2000, 'II', 2.5, 'K', 125, 7, 8],
    ['lot 20 000, level II, AQL 0.25 → M, n 315, 2/3 (ISO 2859-1 Table 2-A)', 20000, 'II', 0.25, 'M', 315, 2, 3],
    ['lot 1 000, level S-3, AQL 1.0 → E, n 13, 0/1 (ISO 2859-1 Table 1 special level S-3 + Table 2-A)', 1000, 'S-3', 1.0, 'E', 13, 0, 1],
  ])('normal inspection: %s', async (_name, lotSize, level, aql, letter, n, ac, re) => {
    const { agent } = await signedIn(ctx, 'buyer');
    const res = await agent.get(`/api/sampling/plan?lotSize=${lotSize}&level=${level}&aql=${aql}&severity=normal`).expect(200);
    expect(res.body).toMatchObject({ codeLetter: letter, sampleSize: n, accept: ac, reject: re });
    expect(res.body.source).toMatch(/ISO 2859-1/);
  });

  // Tightened: resolved cells of reference.md §1.4 (ISO 2859-1 Table 2-B).
  it.each([
    ['J at AQL 1.0 → 80: 1/2 (ISO 2859-1 Table 2-B)', 1000, 1.0, 80, 1, 2],
    ['K at AQL 2.5 → 125: 5/6 (ISO 2859-1 Table 2-B)', 2000, 2.5, 125, 5, 6],
    ['M at AQL 0.25 → 315: 1/2 (ISO 2859-1 Table 2-B)', 20000, 0.25, 315, 1, 2],
  ])('tightened inspection: %s', async (_name, lotSize, aql, n, ac, re) => {
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.get(`/api/sampling/plan?lotSize=${lotSize}&level=II&aql=${aql}&severity=tightened`).expect(200);
    expect(res.body).toMatchObject({ sampleSize: n, accept: ac, reject: re, severity: 'tightened' });
  });

  // Reduced: Z1.4 Table II-C convention with the Ac/Re gap (reference.md §1.2, §1.5).
  it('reduced inspection: lot 1 000, II, AQL 1.0 → J, n 32, Ac 1 / Re 3 (ANSI/ASQ Z1.4 Table II-C)', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.get('/api/sampling/plan?lotSize=1000&level=II&aql=1.0&severity=reduced').expect(200);
    expect(res.body).toMatchObject({ codeLetter: 'J', sampleSize: 32, accept: 1, reject: 3 });
  });

  it('when the sample reaches the lot size, answers a 100 % inspection of the lot', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    // lot 10, II → B, AQL 1.0 arrows down to E (n 13) > 10 parts.
    const res = await agent.get('/api/sampling/plan?lotSize=10&level=II&aql=1.0').expect(200);
    expect(res.body).toMatchObject({ sampleSize: 10, hundredPercent: true, accept: 0, reject: 1 });
  });

  it.each([
    ['lotSize', 'lotSize=abc&level=II&aql=1.0'],
    ['lotSize', 'level=II&aql=1.0'],
    ['lotSize', 'lotSize=1&level=II&aql=1.0'],
    ['level', 'lotSize=100&level=IV&aql=1.0'],
    ['aql', 'lotSize=100&level=II&aql=3.3'],
    ['severity', 'lotSize=100&level=II&aql=1.0&severity=relaxed'],
  ])('with a bad %s, answers 400 naming the parameter', async (field, query) => {
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.get(`/api/sampling/plan?${query}`).expect(400);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(res.body.errors.map((e: { field: string }) => e.field)).toContain(field);
  });
});

describe('GET /api/lots/:id/plan', () => {
  it('an attribute part type on a fresh supplier gets the normal ISO 2859-1 plan and says why', async () => {
    const f = await makeBenchLot(ctx.ds, { quantity: 1000 });
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.get(`/api/lots/${f.lot.id}/plan`).expect(200);
    expect(res.body.plan).toMatchObject({ method: 'attribute', severity: 'normal', codeLetter: 'J', sampleSize: 80, accept: 2, reject: 3 });
    expect(res.body.switching.reason).toMatch(/starts on normal/);
    expect(res.body).toMatchObject({ measured: 0, remaining: 80 });
    expect(res.body.partType).toMatchObject({ hfeMin: 100, hfeMax: 300, vbeTcMvPerC: -2 });
  });

  it('a zero-acceptance part type gets Ac 0 / Re 1 with the normal sample size', async () => {
    const f = await makeBenchLot(ctx.ds, { quantity: 1000, part: { samplingMethod: 'zero-acceptance' } });
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.get(`/api/lots/${f.lot.id}/plan`).expect(200);
    expect(res.body.plan).toMatchObject({ method: 'zero-acceptance', sampleSize: 80, accept: 0, reject: 1 });
  });

  it('a variables part type gets the s-method with k from Z1.9 Table B-1 (letter F, n 10, AQL 1.0 → k 1.72) and its source', async () => {
    // reference.md §2: F (10), AQL 1.0 → k 1.72 [from memory, within 0.006 of values recomputed from the M table].
    const f = await makeBenchLot(ctx.ds, { quantity: 500, part: { samplingMethod: 'variables' } });
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.get(`/api/lots/${f.lot.id}/plan`).expect(200);
    expect(res.body.plan).toMatchObject({ method: 'variables', sampleSize: 10, k: 1.72, accept: null });
    expect(res.body.plan.source).toMatch(/Z1\.9/);
    expect(res.body.plan.notes.join(' ')).toMatch(/Table A-2/);
  });

  it('takes the severity from the stored switching state: tightened J at AQL 1.0 → n 80, 1/2', async () => {
    const f = await makeBenchLot(ctx.ds, { quantity: 1000 });
    await ctx.ds.getRepository(SwitchingStateRow).save({
      supplierId: f.supplier.id,
      partTypeId: f.partType.id,
      state: { severity: 'tightened', recent: [], consecutiveAcceptedTightened: 0, rejectedInTightened: 0, switchingScore: 0 },
      reason: '2 of the last 2 lots were not accepted on normal inspection → tightened',
      reducedApproved: false,
      productionSteady: true,
      updatedAt: new Date(),
    });
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.get(`/api/lots/${f.lot.id}/plan`).expect(200);
    expect(res.body.plan).toMatchObject({ severity: 'tightened', sampleSize: 80, accept: 1, reject: 2 });
    expect(res.body.switching).toMatchObject({ severity: 'tightened', acceptanceBlocked: false });
    expect(res.body.switching.reason).toMatch(/→ tightened/);
  });

  it('an AQL the tables do not carry gives no plan and a reason instead of a 500', async () => {
    const f = await makeBenchLot(ctx.ds, { part: { aql: 3.0 } });
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.get(`/api/lots/${f.lot.id}/plan`).expect(200);
    expect(res.body.plan).toBeNull();
    expect(res.body.planError).toMatch(/AQL/);
  });

  it('an unknown lot answers 404', async () => {
    const { agent } = await signedIn(ctx, 'inspector');
    await agent.get('/api/lots/99999999/plan').expect(404);
  });
});
