import { describe, expect, it } from 'vitest';
import type { OrderPlanJob } from '../../shared/api/supplier-quality.ts';
import { GainBinRow, GainBinSchemeVersion } from '../../server/modules/catalog/gain-bin-scheme.entity.ts';
import { normalSample } from '../shared/statistics/seeded-random.ts';
import { signedIn, useTestApp, type Agent } from './helpers.ts';
import { DAY, makeSupplierWorld } from './suppliers-fixtures.ts';

const ctx = useTestApp();

async function poll(a: Agent, id: string): Promise<OrderPlanJob> {
  const seen: number[] = [];
  for (let i = 0; i < 600; i++) {
    const res = await a.get(`/api/order-plans/${id}`).expect(200);
    seen.push(res.body.progress.done);
    if (res.body.status !== 'running') return res.body;
    await new Promise((r) => setTimeout(r, 25));
  }
  throw new Error('plan did not finish');
}

describe('order-quantity planning', () => {
  it('POST starts a job, GET polls progress and the seeded, reproducible result with leftovers per gain bin', async () => {
    const w = await makeSupplierWorld(ctx.ds);
    for (const seed of [1, 2, 3, 4]) await w.lot({ status: 'accepted', hfe: normalSample(seed, 50, 180, 22).map((x) => Math.round(x)), receivedAt: new Date(Date.now() - (30 - seed) * DAY) });
    const scheme = await ctx.ds.getRepository(GainBinSchemeVersion).save({ partTypeId: w.partType.id, version: 1, note: null, lockedAt: null, createdBy: null });
    await ctx.ds.getRepository(GainBinRow).save(
      [
        ['A', 100, 160],
        ['B', 160, 220],
        ['C', 220, 300],
      ].map(([code, lo, hi], i) => ({ schemeId: scheme.id, position: i + 1, code: String(code), label: `Gain ${code}`, hfeMin: Number(lo), hfeMax: Number(hi), vbeMinMv: null, vbeMaxMv: null, gapBeforeIntended: false })),
    );
    const { agent } = await signedIn(ctx, 'buyer');
    const body = { supplierId: w.supplier.id, partTypeId: w.partType.id, setsWanted: 100, setSize: 2, hfeTolerancePct: 2, vbeToleranceMv: 5, confidencePct: 95, seed: 7 };
    const started = Date.now();
    const res = await agent.post('/api/order-plans').set('x-csrf-token', agent.csrf).send(body).expect(202);
    expect(res.headers.location).toBe(`/api/order-plans/${res.body.id}`);
    expect(res.body).toMatchObject({ status: 'running', history: { parts: 200, lots: 4 } });
    const done = await poll(agent, res.body.id);
    const elapsed = Date.now() - started;
    expect(done.status).toBe('done');
    const r = done.result!;
    expect(r.quantity).toBeGreaterThanOrEqual(200);
    expect(r.probability).toBeGreaterThanOrEqual(0.95);
    expect(r.simulations).toBe(200);
    expect(r.leftovers.map((l) => l.label)).toEqual(expect.arrayContaining(['Gain A', 'Gain B', 'Gain C']));
    // Fast enough to answer within a few seconds for 100 pairs (measured: see the report).
    console.log(`[planning] 100 pairs, 200 simulations: Q = ${r.quantity}, ${r.matcherCalls} matching calls, ${elapsed} ms`);
    expect(elapsed).toBeLessThan(15_000);

    const again = await agent.post('/api/order-plans').set('x-csrf-token', agent.csrf).send(body).expect(202);
    const second = await poll(agent, again.body.id);
    expect(second.result).toEqual(r);
  });

  it('answers 422 when the supplier has too little measured history, and 400 naming bad fields', async () => {
    const w = await makeSupplierWorld(ctx.ds);
    await w.lot({ status: 'accepted', hfe: [150, 160, 170] });
    const { agent } = await signedIn(ctx, 'quality');
    const few = await agent
      .post('/api/order-plans')
      .set('x-csrf-token', agent.csrf)
      .send({ supplierId: w.supplier.id, partTypeId: w.partType.id, setsWanted: 10, setSize: 2, hfeTolerancePct: 2, vbeToleranceMv: 2, confidencePct: 95 })
      .expect(422);
    expect(few.body.detail).toMatch(/3 measured parts/);
    const bad = await agent
      .post('/api/order-plans')
      .set('x-csrf-token', agent.csrf)
      .send({ supplierId: w.supplier.id, partTypeId: w.partType.id, setsWanted: 0, setSize: 3, hfeTolerancePct: 2, vbeToleranceMv: 2, confidencePct: 120 })
      .expect(400);
    expect([...new Set(bad.body.errors.map((e: { field: string }) => e.field))].sort()).toEqual(['confidencePct', 'setSize', 'setsWanted']);
    await agent.get('/api/order-plans/not-a-job').expect(404);
  });
});
