import { describe, expect, it } from 'vitest';
import type { LotScreening, PlaceScreenedResponse } from '../../shared/api/bins.ts';
import { parseOwnCode } from '../../shared/domain/labels/index.ts';
import { placeScreenedPart, placeScreenedParts } from '../../server/modules/bins/screening.service.ts';
import { agentFor, useTestApp, type Agent } from './helpers.ts';
import { addReadings, correctReading, makeScreenLot, type ScreenLot } from './bins-fixtures.ts';

const ctx = useTestApp();

const STRIP4 = { kind: 'strip' as const, capacity: 4, hasPositions: true, location: 'Bench 2' };

async function place(agent: Agent, lotId: number, body: object = {}): Promise<PlaceScreenedResponse> {
  const res = await agent.post(`/api/lots/${lotId}/screening/place`).set('x-csrf-token', agent.csrf).send(body);
  if (res.status !== 200) throw new Error(`place: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

async function screening(agent: Agent, lotId: number): Promise<LotScreening> {
  return (await agent.get(`/api/lots/${lotId}/screening`).expect(200)).body;
}

async function inspectorOf(f: ScreenLot): Promise<Agent> {
  return agentFor(ctx.app, f.inspector);
}

describe('POST /api/lots/:id/screening/place', () => {
  it('ten parts into two bins with strips of four: two strips per bin, positions 1–4 then a new strip', async () => {
    const f = await makeScreenLot(ctx.ds, { setup: STRIP4 });
    const agent = await inspectorOf(f);
    const hfes = [120, 210, 130, 220, 140, 230, 150, 240, 160, 250];
    await addReadings(ctx.ds, f, hfes);
    const out = await place(agent, f.lotId);
    expect(out).toMatchObject({ placed: 10, alreadyPlaced: 0, containersOpened: 4 });
    const where = out.placements.map((p) => `${p.bin.code}:${p.position}${p.openedContainer ? '*' : ''}${p.filledContainer ? '!' : ''}`);
    expect(where).toEqual(['A:1*', 'B:1*', 'A:2', 'B:2', 'A:3', 'B:3', 'A:4!', 'B:4!', 'A:1*', 'B:1*']);
    const codes = [...new Set(out.placements.map((p) => p.containerCode))];
    expect(codes).toHaveLength(4);
    for (const c of codes) expect(parseOwnCode(c)?.kind).toBe('container');

    const s = await screening(agent, f.lotId);
    expect(s.screened).toBe(10);
    expect(s.placed).toBe(10);
    expect(s.unplaced).toBe(0);
    expect(s.bins.map((b) => [b.code, b.count, b.pct])).toEqual([
      ['A', 5, 50],
      ['B', 5, 50],
    ]);
    expect(s.outside).toEqual({ count: 0, pct: 0 });
    expect(s.containers.map((c) => [c.bin.code, c.quantity, c.status, c.location, c.kind])).toEqual([
      ['A', 4, 'full', 'Bench 2', 'strip'],
      ['A', 1, 'open', 'Bench 2', 'strip'],
      ['B', 4, 'full', 'Bench 2', 'strip'],
      ['B', 1, 'open', 'Bench 2', 'strip'],
    ]);
  });

  it('is idempotent: a second call places nothing, and the service reports parts placed before', async () => {
    const f = await makeScreenLot(ctx.ds, { setup: STRIP4 });
    const agent = await inspectorOf(f);
    const ids = await addReadings(ctx.ds, f, [150, 250]);
    await place(agent, f.lotId);
    expect(await place(agent, f.lotId)).toMatchObject({ placed: 0, alreadyPlaced: 0, placements: [] });
    const again = await ctx.ds.transaction((m) =>
      placeScreenedParts(m, f.inspector, f.lotId, ids.map((id, i) => ({ id, position: i + 1, hfe25: [150, 250][i] as number, vbeMv25: 650, supersedesId: null }))),
    );
    expect(again.placed).toBe(0);
    expect(again.alreadyPlaced).toBe(2);
    expect(again.placements.map((p) => [p.bin.code, p.position, p.alreadyPlaced])).toEqual([
      ['A', 1, true],
      ['B', 1, true],
    ]);
    const [{ n }] = await ctx.ds.query(`SELECT count(*)::int AS n FROM stock_movement sm JOIN container c ON c.id = sm.container_id WHERE c.lot_id = $1`, [f.lotId]);
    expect(n).toBe(2);
  });

  it('a value on a shared edge goes to the upper bin only; the top of the last bin is inside it (half-open, last closed)', async () => {
    const f = await makeScreenLot(ctx.ds, { setup: STRIP4 });
    const agent = await inspectorOf(f);
    await addReadings(ctx.ds, f, [199.999, 200, 300, 300.01, 99.99]);
    const out = await place(agent, f.lotId);
    expect(out.placements.map((p) => p.bin.code)).toEqual(['A', 'B', 'B', null, null]);
    const s = await screening(agent, f.lotId);
    expect(s.bins.map((b) => b.count)).toEqual([1, 2]);
    expect(s.outside).toEqual({ count: 2, pct: 40 });
    const outside = s.containers.filter((c) => c.bin.code === null);
    expect(outside).toHaveLength(1);
    expect(outside[0]).toMatchObject({ quantity: 2, bin: { label: 'Outside all bins', index: null } });
  });

  it("locks the part type's current scheme version to the lot when screening starts, with audit entries", async () => {
    const f = await makeScreenLot(ctx.ds, { setup: STRIP4 });
    const agent = await inspectorOf(f);
    await addReadings(ctx.ds, f, [150]);
    await place(agent, f.lotId);
    const [lot] = await ctx.ds.query(`SELECT bin_scheme_id FROM lot WHERE id = $1`, [f.lotId]);
    expect(lot.bin_scheme_id).toBe(f.schemeId);
    const [scheme] = await ctx.ds.query(`SELECT locked_at FROM gain_bin_scheme WHERE id = $1`, [f.schemeId]);
    expect(scheme.locked_at).not.toBeNull();
    const actions = (await ctx.ds.query(`SELECT action FROM audit_entry WHERE (entity_type = 'lot' AND entity_id = $1) OR (entity_type = 'gain-bin-scheme' AND entity_id = $2) ORDER BY id`, [
      String(f.lotId),
      String(f.schemeId),
    ])) as { action: string }[];
    expect(actions.map((a) => a.action)).toEqual(['lot.bin-scheme', 'bin-scheme.lock', 'screening.place']);
  });

  it('when the part type has no gain-bin scheme, answers 409 and places nothing', async () => {
    const f = await makeScreenLot(ctx.ds, { bins: null });
    const agent = await inspectorOf(f);
    await addReadings(ctx.ds, f, [150]);
    const res = await agent.post(`/api/lots/${f.lotId}/screening/place`).set('x-csrf-token', agent.csrf).send({}).expect(409);
    expect(res.body.detail).toMatch(/no gain-bin scheme/);
    const [{ n }] = await ctx.ds.query(`SELECT count(*)::int AS n FROM container WHERE lot_id = $1`, [f.lotId]);
    expect(n).toBe(0);
  });

  it('sample readings are placed only when asked with includeSample', async () => {
    const f = await makeScreenLot(ctx.ds, { setup: STRIP4 });
    const agent = await inspectorOf(f);
    await addReadings(ctx.ds, f, [150, 160], { mode: 'sample' });
    expect((await place(agent, f.lotId)).placed).toBe(0);
    expect((await place(agent, f.lotId, { includeSample: true })).placed).toBe(2);
    expect((await screening(agent, f.lotId)).screened).toBe(2);
  });

  it('containers without positions count the parts up to their capacity', async () => {
    const f = await makeScreenLot(ctx.ds, { setup: { kind: 'bag', capacity: 3, hasPositions: false, location: 'Shelf 1' } });
    const agent = await inspectorOf(f);
    await addReadings(ctx.ds, f, [110, 120, 130, 140]);
    const out = await place(agent, f.lotId);
    expect(out.placements.map((p) => p.position)).toEqual([null, null, null, null]);
    const s = await screening(agent, f.lotId);
    expect(s.containers.map((c) => [c.kind, c.quantity, c.status, c.hasPositions])).toEqual([
      ['bag', 3, 'full', false],
      ['bag', 1, 'open', false],
    ]);
    const [{ n }] = await ctx.ds.query(`SELECT count(*)::int AS n FROM container_position cp JOIN container c ON c.id = cp.container_id WHERE c.lot_id = $1`, [f.lotId]);
    expect(n).toBe(0);
  });

  it('a closed container is not refilled: the next part of its bin opens a new one', async () => {
    const f = await makeScreenLot(ctx.ds, { setup: STRIP4 });
    const agent = await inspectorOf(f);
    await addReadings(ctx.ds, f, [150]);
    const first = await place(agent, f.lotId);
    await agent.post(`/api/containers/${first.placements[0]?.containerId}/close`).set('x-csrf-token', agent.csrf).send({ reason: 'end of shift' }).expect(200);
    await addReadings(ctx.ds, f, [151]);
    const second = await place(agent, f.lotId);
    expect(second.placements[0]).toMatchObject({ openedContainer: true, position: 1 });
    expect(second.placements[0]?.containerId).not.toBe(first.placements[0]?.containerId);
  });

  it('a corrected reading in the same bin keeps the place; in another bin the old place is freed and the part re-placed', async () => {
    const f = await makeScreenLot(ctx.ds, { setup: STRIP4 });
    const agent = await inspectorOf(f);
    const [m1, m2] = await addReadings(ctx.ds, f, [150, 160]);
    const first = await place(agent, f.lotId);
    const boxA = first.placements[0]?.containerId;

    const c1 = await correctReading(ctx.ds, f, m1 as string, 155);
    const c2 = await correctReading(ctx.ds, f, m2 as string, 260);
    const out = await place(agent, f.lotId);
    expect(out.placements.map((p) => [p.measurementId, p.bin.code, p.position])).toEqual([
      [c1, 'A', 1],
      [c2, 'B', 1],
    ]);
    const detail = (await agent.get(`/api/containers/${boxA}`).expect(200)).body;
    expect(detail.quantity).toBe(1);
    expect(detail.positions.map((p: { position: number; state: string; measurementId: string }) => [p.position, p.state, p.measurementId])).toEqual([
      [1, 'in-stock', c1],
      [2, 'rebinned', m2],
    ]);
    const s = await screening(agent, f.lotId);
    expect(s.bins.map((b) => b.count)).toEqual([1, 1]);
    expect(s.placed).toBe(2);
  });
});

describe('GET /api/lots/:id/screening/recent', () => {
  it('lists the latest placements newest first, saying when a part opened or filled a container', async () => {
    const f = await makeScreenLot(ctx.ds, { setup: { ...STRIP4, capacity: 2 } });
    const agent = await inspectorOf(f);
    await addReadings(ctx.ds, f, [150, 160, 170]);
    await place(agent, f.lotId);
    const res = await agent.get(`/api/lots/${f.lotId}/screening/recent?limit=3`).expect(200);
    expect(res.body.screeningOpen).toBe(true);
    expect(res.body.items.map((p: { lotPosition: number; position: number; openedContainer: boolean; filledContainer: boolean }) => [p.lotPosition, p.position, p.openedContainer, p.filledContainer])).toEqual([
      [3, 1, true, false],
      [2, 2, false, true],
      [1, 1, true, false],
    ]);
    expect(res.body.items[0].bin).toMatchObject({ code: 'A', label: 'Gain group A', index: 0 });
    await agent.get(`/api/lots/${f.lotId}/screening/recent?limit=0`).expect(400);
  });
});

describe('placeScreenedPart (the hook for the bench, in the transaction that records the reading)', () => {
  it('places one part and rolls back with the caller', async () => {
    const f = await makeScreenLot(ctx.ds, { setup: STRIP4 });
    const [id] = await addReadings(ctx.ds, f, [250]);
    await expect(
      ctx.ds.transaction(async (m) => {
        const p = await placeScreenedPart(m, f.inspector, f.lotId, { id: id as string, position: 1, hfe25: 250, vbeMv25: 650, supersedesId: null });
        expect(p).toMatchObject({ bin: { code: 'B' }, position: 1, openedContainer: true });
        throw new Error('the reading failed after all');
      }),
    ).rejects.toThrow('the reading failed after all');
    const [{ n }] = await ctx.ds.query(`SELECT count(*)::int AS n FROM container WHERE lot_id = $1`, [f.lotId]);
    expect(n).toBe(0);
    const p = await ctx.ds.transaction((m) => placeScreenedPart(m, f.inspector, f.lotId, { id: id as string, position: 1, hfe25: 250, vbeMv25: 650, supersedesId: null }));
    expect(p).toMatchObject({ bin: { code: 'B' }, position: 1, alreadyPlaced: false });
  });
});

describe('PUT /api/lots/:id/screening/setup', () => {
  it('saves how new containers are made, audited; bad input names the field and keeps the old set-up', async () => {
    const f = await makeScreenLot(ctx.ds);
    const agent = await inspectorOf(f);
    const before = await screening(agent, f.lotId);
    expect(before.setup).toEqual({ kind: 'strip', capacity: 50, hasPositions: true, location: 'Bench' });
    const bad = await agent.put(`/api/lots/${f.lotId}/screening/setup`).set('x-csrf-token', agent.csrf).send({ kind: 'box', capacity: 0, hasPositions: true, location: 'X' }).expect(400);
    expect(bad.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['capacity', 'kind']);
    const ok = await agent.put(`/api/lots/${f.lotId}/screening/setup`).set('x-csrf-token', agent.csrf).send({ kind: 'tray', capacity: 100, hasPositions: true, location: ' Rack 3 ' }).expect(200);
    expect(ok.body).toEqual({ kind: 'tray', capacity: 100, hasPositions: true, location: 'Rack 3' });
    const [a] = await ctx.ds.query(`SELECT action, after FROM audit_entry WHERE entity_type = 'lot' AND entity_id = $1 ORDER BY id DESC LIMIT 1`, [String(f.lotId)]);
    expect(a.action).toBe('screening.setup');
  });
});
