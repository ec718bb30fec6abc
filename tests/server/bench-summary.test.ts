import { describe, expect, it } from 'vitest';
import { makeBenchLot } from './bench-fixtures.ts';
import { signedIn, useTestApp, type Agent } from './helpers.ts';

const ctx = useTestApp();

async function record(agent: Agent, lotId: number, readings: [number, number][], ambientC = 25) {
  const s = await agent.post(`/api/lots/${lotId}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: 'Meter', ambientC, mode: 'sample' }).expect(201);
  let position = 1;
  for (const [hfe, vbe] of readings) {
    await agent.post(`/api/lots/${lotId}/measurements`).set('x-csrf-token', agent.csrf).send({ sessionId: s.body.id, position: position++, hfe, vbe, vbeUnit: 'mV' }).expect(201);
  }
}

describe('GET /api/lots/:id/summary', () => {
  it('on the NIST/SEMATECH e-Handbook §6.1.6 example (USL 20, LSL 8, μ 16, σ 2) gives Cp 1.00 and Cpk 0.667', async () => {
    // reference.md §7 [from memory; arithmetic checked]: Cp = (20 − 8)/(6·2) = 1.00, Cpk = min(4, 8)/(3·2) = 0.667.
    // Three readings 14, 16, 18 have mean 16 and sample s = √((4 + 0 + 4)/2) = 2 exactly.
    const f = await makeBenchLot(ctx.ds, { part: { hfeMin: 8, hfeMax: 20, vbeMinMv: 580, vbeMaxMv: 700 } });
    const { agent } = await signedIn(ctx, 'inspector');
    await record(agent, f.lot.id, [
      [14, 640],
      [16, 650],
      [18, 660],
    ]);
    const res = await agent.get(`/api/lots/${f.lot.id}/summary`).expect(200);
    expect(res.body.n).toBe(3);
    expect(res.body.hfe.mean).toBeCloseTo(16, 12);
    expect(res.body.hfe.sd).toBeCloseTo(2, 12);
    expect(res.body.hfe.cp).toBeCloseTo(1.0, 12);
    expect(res.body.hfe.cpk).toBeCloseTo(0.6667, 4);
    // Vbe: mean 650, s 10 → Cp = 120/60 = 2.00, Cpk = min(50, 70)/30 = 1.667.
    expect(res.body.vbeMv).toMatchObject({ mean: 650, min: 640, max: 660 });
    expect(res.body.vbeMv.sd).toBeCloseTo(10, 12);
    expect(res.body.vbeMv.cpk).toBeCloseTo(1.6667, 4);
    expect(res.body.outsideLimits).toBe(0);
    expect(res.body.histogram.counts.reduce((a: number, c: number) => a + c, 0)).toBe(3);
  });

  it('on a small known lot gives n, mean, s, extremes, R-7 percentiles, the count outside limits and the yield per gain bin', async () => {
    const f = await makeBenchLot(ctx.ds, {
      bins: [
        { code: 'A', hfeMin: 100, hfeMax: 200 },
        { code: 'B', hfeMin: 200, hfeMax: 300 },
      ],
    });
    const { agent } = await signedIn(ctx, 'inspector');
    const hfes = [120, 150, 180, 210, 240, 260, 310];
    await record(agent, f.lot.id, hfes.map((h) => [h, 650] as [number, number]));
    const res = await agent.get(`/api/lots/${f.lot.id}/summary?histogram=bins`).expect(200);
    const b = res.body;
    // mean = 1470/7 = 210; s² = Σ(x − 210)²/6 = (8100+3600+900+0+900+2500+10000)/6 = 26000/6.
    expect(b.n).toBe(7);
    expect(b.hfe.mean).toBeCloseTo(210, 12);
    expect(b.hfe.sd).toBeCloseTo(Math.sqrt(26000 / 6), 9);
    expect(b.hfe).toMatchObject({ min: 120, max: 310, median: 210 });
    // p25 at h = 1.5 → 150 + 0.5·30 = 165; p75 at h = 4.5 → 240 + 0.5·20 = 250.
    expect(b.hfe.p25).toBeCloseTo(165, 12);
    expect(b.hfe.p75).toBeCloseTo(250, 12);
    expect(b.outsideLimits).toBe(1);
    expect(b.outsideBy).toMatchObject({ hfeHigh: 1, hfeLow: 0 });
    expect(b.bins.map((x: { code: string; count: number }) => [x.code, x.count])).toEqual([
      ['A', 3],
      ['B', 3],
    ]);
    expect(b.outsideBins).toBe(1);
    expect(b.bins[0].yieldPct).toBeCloseTo((100 * 3) / 7, 9);
    expect(b.histogram).toMatchObject({ edges: [100, 200, 300], counts: [3, 3], rule: 'gain bins' });
    expect(b.normality).toMatchObject({ normalAt5: expect.any(Boolean) });
  });

  it('refers readings taken at 35 °C to 25 °C before the statistics', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    // hFE₂₅ = 205/1.05 ≈ 195.24; Vbe₂₅ = 630 + 2·10 = 650 mV (reference.md §5, −2 mV/°C).
    await record(agent, f.lot.id, [[205, 630]], 35);
    const res = await agent.get(`/api/lots/${f.lot.id}/summary`).expect(200);
    expect(res.body.hfe.mean).toBeCloseTo(205 / 1.05, 9);
    expect(res.body.vbeMv.mean).toBeCloseTo(650, 9);
    expect(res.body.hfe.sd).toBeNull();
    expect(res.body.hfe.cpk).toBeNull();
    expect(res.body.normality).toBeNull();
  });

  it('for a lot without readings answers n 0 and empty statistics', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'buyer');
    const res = await agent.get(`/api/lots/${f.lot.id}/summary`).expect(200);
    expect(res.body).toMatchObject({ n: 0, outsideLimits: 0, bins: [], histogram: { edges: [], counts: [] } });
    expect(res.body.hfe.mean).toBeNull();
  });

  it('with an unknown histogram rule answers 400 naming histogram', async () => {
    const f = await makeBenchLot(ctx.ds);
    const { agent } = await signedIn(ctx, 'inspector');
    const res = await agent.get(`/api/lots/${f.lot.id}/summary?histogram=bogus`).expect(400);
    expect(res.body.errors[0].field).toBe('histogram');
  });
});
