import { describe, expect, it } from 'vitest';
import { DAY, makeSupplierWorld } from './suppliers-fixtures.ts';
import { signedIn, useTestApp } from './helpers.ts';

const ctx = useTestApp();
const day = (d: Date) => d.toISOString().slice(0, 10);

describe('GET /api/scorecards', () => {
  it('on a small known data set gives the counts, acceptance rate, DPPM, CoC on time and severity', async () => {
    const w = await makeSupplierWorld(ctx.ds);
    const t0 = Date.now() - 40 * DAY;
    // Accepted, CoC 2 h after receipt (on time), hFE mean 165.
    await w.lot({ status: 'accepted', hfe: [150, 160, 170, 180], receivedAt: new Date(t0), coc: new Date(t0 + 2 * 3600_000) });
    // Accepted, CoC 30 h after receipt (late), hFE mean 185.
    await w.lot({ status: 'accepted', hfe: [170, 180, 190, 200], receivedAt: new Date(t0 + 10 * DAY), coc: new Date(t0 + 10 * DAY + 30 * 3600_000) });
    // Rejected: one reading below 100; no CoC.
    await w.lot({ status: 'rejected', hfe: [90, 150, 160, 170], receivedAt: new Date(t0 + 20 * DAY) });
    // MRB: two readings above 300.
    await w.lot({ status: 'mrb', hfe: [310, 320, 200, 210], receivedAt: new Date(t0 + 30 * DAY) });
    // Outside the period: not counted.
    await w.lot({ status: 'rejected', hfe: [50, 60, 70, 80], receivedAt: new Date(Date.now() - 400 * DAY) });
    await ctx.ds.query(`INSERT INTO switching_state (supplier_id, part_type_id, state, reason) VALUES ($1, $2, $3, 'test')`, [
      w.supplier.id,
      w.partType.id,
      JSON.stringify({ severity: 'tightened', recent: [], consecutiveAcceptedTightened: 0, rejectedInTightened: 0, switchingScore: 0 }),
    ]);

    const { agent } = await signedIn(ctx, 'buyer');
    const from = day(new Date(t0 - DAY));
    const to = day(new Date());
    const res = await agent.get(`/api/scorecards?from=${from}&to=${to}&search=${w.supplier.code}`).expect(200);
    expect(res.body.period).toEqual({ from, to });
    expect(res.body.items).toHaveLength(1);
    const row = res.body.items[0];
    expect(row).toMatchObject({
      supplierId: w.supplier.id,
      lotsReceived: 4,
      accepted: 2,
      rejected: 1,
      mrb: 1,
      pending: 0,
      sampledParts: 16,
      sampledDefects: 3,
      cocOnTime: 1,
      severity: 'tightened',
    });
    expect(row.acceptanceRate).toBeCloseTo(2 / 4, 12);
    // DPPM = defects / sampled parts × 10⁶ = 3 / 16 × 10⁶.
    expect(row.dppm).toBeCloseTo((3 / 16) * 1e6, 6);
    expect(row.cocOnTimeRate).toBeCloseTo(0.25, 12);
    // Mean of the lot means (165, 185, 142.5, 260).
    expect(row.meanHfe).toBeCloseTo((165 + 185 + 142.5 + 260) / 4, 9);

    const detail = await agent.get(`/api/scorecards/${w.supplier.id}?from=${from}&to=${to}`).expect(200);
    const part = detail.body.parts[0];
    expect(part.partType.id).toBe(w.partType.id);
    expect(part.lots.map((l: { mean: number }) => l.mean)).toEqual([165, 185, 142.5, 260]);
    expect(part.chart.referenceLots).toBe(2);
    expect(part.chart.points).toHaveLength(4);
    expect(part.chart.grandMean).toBeCloseTo(175, 9);
    expect(part.acceptance.reduce((a: number, m: { disposed: number }) => a + m.disposed, 0)).toBe(4);
    // Lots with fewer than five readings are not overlaid.
    expect(part.distributions).toBeNull();
  });

  it('sorts on the server and answers 400 naming a bad period or sort', async () => {
    const { agent } = await signedIn(ctx, 'quality');
    const res = await agent.get('/api/scorecards?sort=lotsReceived&dir=desc&pageSize=200').expect(200);
    const counts = res.body.items.map((r: { lotsReceived: number }) => r.lotsReceived);
    expect(counts).toEqual([...counts].sort((a, b) => b - a));
    const bad = await agent.get('/api/scorecards?from=2026-02-30').expect(400);
    expect(bad.body.errors[0].field).toBe('from');
    expect((await agent.get('/api/scorecards?from=2026-05-01&to=2026-04-01').expect(400)).body.errors[0].field).toBe('from');
    expect((await agent.get('/api/scorecards?sort=colour').expect(400)).body.errors[0].field).toBe('sort');
  });

  it('exports the scorecards as CSV with one row per supplier and part type', async () => {
    const w = await makeSupplierWorld(ctx.ds);
    await w.lot({ status: 'accepted', hfe: [150, 160, 170, 180, 190, 200] });
    const { agent } = await signedIn(ctx, 'buyer');
    const res = await agent.get('/api/scorecards.csv').expect(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="supplier-scorecards-/);
    const lines = res.text.trim().split('\r\n');
    expect(lines[0]).toMatch(/^supplier_code,supplier_name,part_number,/);
    const mine = lines.find((l) => l.startsWith(`${w.supplier.code},`))!;
    expect(mine.split(',')[2]).toBe(w.partType.partNumber);
    expect(mine.split(',')[5]).toBe('1');
  });

  it('the detail of an unknown supplier answers 404', async () => {
    const { agent } = await signedIn(ctx, 'buyer');
    await agent.get('/api/scorecards/99999999').expect(404);
  });
});
