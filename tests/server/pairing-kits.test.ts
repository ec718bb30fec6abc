import { describe, expect, it } from 'vitest';
import type { KitDetail, KitPlan } from '../../shared/api/pairing.ts';
import { releaseExpiredKits } from '../../server/modules/pairing/kit-expiry.ts';
import { signedIn, useTestApp, type Agent } from './helpers.ts';
import { makePairingPartType, makeStockLot, setLocation, type StockLot } from './pairing-fixtures.ts';

const ctx = useTestApp();

/** Eight NPN parts that make four clean pairs at 5 % / 2 mV (each pair 1 % and 0.2 mV apart; pairs far apart). */
const FOUR_PAIRS = [
  { hfe: 100, vbeMv: 650 },
  { hfe: 101, vbeMv: 650.2 },
  { hfe: 150, vbeMv: 655 },
  { hfe: 151.5, vbeMv: 655.2 },
  { hfe: 200, vbeMv: 660 },
  { hfe: 202, vbeMv: 660.2 },
  { hfe: 250, vbeMv: 665 },
  { hfe: 252.5, vbeMv: 665.2 },
];

async function stock(parts = FOUR_PAIRS, o: { capacity?: number; location?: string } = {}): Promise<StockLot> {
  const pt = await makePairingPartType(ctx.ds, { matchHfePct: 5, matchVbeMv: 2 });
  return makeStockLot(ctx.ds, pt, parts, o);
}

const post = (a: Agent, url: string, body: object) => a.post(url).set('x-csrf-token', a.csrf).send(body);

async function states(lotId: number): Promise<Record<string, number>> {
  const rows = (await ctx.ds.query(
    `SELECT cp.state, count(*)::int AS n FROM container_position cp JOIN container c ON c.id = cp.container_id WHERE c.lot_id = $1 GROUP BY cp.state`,
    [lotId],
  )) as { state: string; n: number }[];
  return Object.fromEntries(rows.map((r) => [r.state, r.n]));
}

describe('POST /api/kits/plan', () => {
  it('plans the most sets from stock with per-set mismatch and meaning, the pick list by location, and changes nothing', async () => {
    const s = await stock(FOUR_PAIRS, { capacity: 4, location: 'Rack 10' });
    expect(s.containers).toHaveLength(2);
    await setLocation(ctx.ds, s.containers[1]!.id, 'Rack 2');
    const { agent } = await signedIn(ctx, 'assembler');
    const res = await post(agent, '/api/kits/plan', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 3 });
    expect(res.status).toBe(200);
    const plan = res.body as KitPlan;
    expect(plan.setsPossible).toBe(4);
    expect(plan.setsPlanned).toBe(3);
    expect(plan.stockParts).toBe(8);
    expect(plan.optimal).toBe(true);
    // Defaults from the part type.
    expect(plan.hfeTolerancePct).toBe(5);
    expect(plan.vbeToleranceMv).toBe(2);
    expect(plan.sets).toHaveLength(3);
    for (const set of plan.sets) {
      expect(set.parts).toHaveLength(2);
      expect(set.hfeSpreadPct).toBeCloseTo(1, 6);
      expect(set.vbeSpreadMv).toBeCloseTo(0.2, 6);
      // exp(0.2 mV / 25.693 mV) = 1.00781 (reference.md §5, derived).
      expect(set.meaning.mirrorRatio).toBeCloseTo(Math.exp(0.2 / 25.6926), 4);
      expect(set.meaning.offsetMv).toBeCloseTo(0.2, 6);
      expect(set.meaning.hfeRatio).toBeCloseTo(1 / 1.01, 6);
    }
    // Storage order: "Rack 2" before "Rack 10" (numbers compare as numbers).
    const locations = plan.pickList.map((p) => p.location);
    expect(locations).toEqual([...locations].sort((a, b) => Number(a.split(' ')[1]) - Number(b.split(' ')[1])));
    expect(locations[0]).toBe('Rack 2');
    expect(plan.pickList.every((p) => p.lotCode === s.lotCode && p.supplierLot === s.supplierLot)).toBe(true);
    expect(await states(s.lotId)).toEqual({ 'in-stock': 8 });
  });

  it('uses the tolerances given: at 0.5 % hFE no pair of the stock is within tolerance', async () => {
    const s = await stock();
    const { agent } = await signedIn(ctx, 'quality');
    const res = await post(agent, '/api/kits/plan', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 2, hfeTolerancePct: 0.5, vbeToleranceMv: 2 });
    expect(res.status).toBe(200);
    expect(res.body.setsPossible).toBe(0);
    expect(res.body.sets).toEqual([]);
  });

  it('complementary: pairs an NPN with a PNP type, NPN first, tolerances the tighter of the two', async () => {
    const npn = await makePairingPartType(ctx.ds, { polarity: 'NPN', matchHfePct: 10, matchVbeMv: 5 });
    const pnp = await makePairingPartType(ctx.ds, { polarity: 'PNP', matchHfePct: 8, matchVbeMv: 6 });
    await makeStockLot(ctx.ds, npn, [
      { hfe: 100, vbeMv: 640 },
      { hfe: 200, vbeMv: 650 },
    ]);
    await makeStockLot(ctx.ds, pnp, [
      { hfe: 104, vbeMv: 642 },
      { hfe: 205, vbeMv: 652 },
      { hfe: 400, vbeMv: 700 },
    ]);
    const { agent } = await signedIn(ctx, 'assembler');
    const res = await post(agent, '/api/kits/plan', { partTypeId: pnp.partTypeId, complementPartTypeId: npn.partTypeId, mode: 'complementary', setSize: 2, setsWanted: 2 });
    expect(res.status).toBe(200);
    expect(res.body.hfeTolerancePct).toBe(8);
    expect(res.body.vbeToleranceMv).toBe(5);
    expect(res.body.partTypes.map((p: { polarity: string }) => p.polarity)).toEqual(['NPN', 'PNP']);
    expect(res.body.setsPossible).toBe(2);
    for (const set of res.body.sets) expect(set.parts.map((p: { polarity: string }) => p.polarity)).toEqual(['NPN', 'PNP']);
  });

  it('bad requests name the field: unknown part type 422, complement missing or same polarity 422, bad set size 400', async () => {
    const s = await stock();
    const { agent } = await signedIn(ctx, 'assembler');
    const unknown = await post(agent, '/api/kits/plan', { partTypeId: 99999999, mode: 'same', setSize: 2, setsWanted: 1 });
    expect(unknown.status).toBe(422);
    expect(unknown.body.errors[0].field).toBe('partTypeId');
    const noComplement = await post(agent, '/api/kits/plan', { partTypeId: s.partTypeId, mode: 'complementary', setSize: 2, setsWanted: 1 });
    expect(noComplement.status).toBe(422);
    expect(noComplement.body.errors[0].field).toBe('complementPartTypeId');
    const other = await makePairingPartType(ctx.ds, { polarity: 'NPN' });
    const samePol = await post(agent, '/api/kits/plan', { partTypeId: s.partTypeId, complementPartTypeId: other.partTypeId, mode: 'complementary', setSize: 2, setsWanted: 1 });
    expect(samePol.status).toBe(422);
    expect(samePol.body.errors[0].field).toBe('complementPartTypeId');
    const size = await post(agent, '/api/kits/plan', { partTypeId: s.partTypeId, mode: 'same', setSize: 3, setsWanted: 1 });
    expect(size.status).toBe(400);
    expect(size.body.errors[0].field).toBe('setSize');
    const extra = await post(agent, '/api/kits/plan', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 1, colour: 'red' });
    expect(extra.status).toBe(400);
    expect(extra.body.errors[0].field).toBe('colour');
  });
});

describe('kit lifecycle: reserve, pull by scan, cancel, expire', () => {
  async function reserve(agent: Agent, s: StockLot, setsWanted: number, extra: object = {}): Promise<KitDetail> {
    const res = await post(agent, '/api/kits', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted, ...extra });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body as KitDetail;
  }

  it('reserving marks the planned parts reserved in one go, gives a KIT code and a reservation end, and is audited', async () => {
    const s = await stock();
    const { agent, user } = await signedIn(ctx, 'assembler');
    const before = Date.now();
    const kit = await reserve(agent, s, 2, { holdMinutes: 60, note: 'Input pairs for amp 12' });
    expect(kit.code).toMatch(/^KIT-\d{8}-\d{4}$/);
    expect(kit.status).toBe('reserved');
    expect(kit.parts).toBe(4);
    expect(kit.pulled).toBe(0);
    expect(kit.sets).toHaveLength(2);
    expect(kit.note).toBe('Input pairs for amp 12');
    const until = Date.parse(kit.reservedUntil as string);
    expect(until - before).toBeGreaterThan(59 * 60_000);
    expect(until - before).toBeLessThan(61 * 60_000);
    expect(await states(s.lotId)).toEqual({ 'in-stock': 4, reserved: 4 });
    const [audit] = (await ctx.ds.query(`SELECT action, actor_id, after FROM audit_entry WHERE entity_type = 'kit' AND entity_id = $1`, [String(kit.id)])) as { action: string; actor_id: number; after: { code: string } }[];
    expect(audit).toMatchObject({ action: 'kit.reserve', actor_id: user.id });
    expect(audit?.after.code).toBe(kit.code);
    // The next plan sees only what is left.
    const plan = await post(agent, '/api/kits/plan', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 4 });
    expect(plan.body.setsPossible).toBe(2);
  });

  it('a reservation that cannot be whole is refused with 409 naming setsWanted, and nothing is reserved', async () => {
    const s = await stock();
    const { agent } = await signedIn(ctx, 'assembler');
    const res = await post(agent, '/api/kits', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 5 });
    expect(res.status).toBe(409);
    expect(res.body.errors[0].field).toBe('setsWanted');
    expect(res.body.detail).toMatch(/only 4 of the 5 sets/);
    expect(await states(s.lotId)).toEqual({ 'in-stock': 8 });
    const [{ n }] = (await ctx.ds.query(`SELECT count(*)::int AS n FROM kit_part WHERE lot_id = $1`, [s.lotId])) as { n: number }[];
    expect(n).toBe(0);
  });

  it('pulling by scan: each scan takes one part out of stock with a pull movement; progress; the last scan completes the kit', async () => {
    const s = await stock(FOUR_PAIRS, { capacity: 4, location: 'Shelf B' });
    const { agent, user } = await signedIn(ctx, 'assembler');
    const kit = await reserve(agent, s, 2);
    const lines = kit.pickList;
    expect(lines).toHaveLength(4);
    let last: { kit: KitDetail; progress: string } | null = null;
    for (const [i, p] of lines.entries()) {
      const qBefore = ((await ctx.ds.query(`SELECT quantity FROM container WHERE id = $1`, [p.containerId])) as { quantity: number }[])[0]!.quantity;
      // Lower case, as a keyboard wedge may send it.
      const res = await post(agent, `/api/kits/${kit.id}/pull`, { containerCode: p.containerCode.toLowerCase(), position: p.position });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.progress).toBe(`${i + 1} of 4 pulled`);
      expect(res.body.pulled).toMatchObject({ containerCode: p.containerCode, position: p.position, pulledByName: user.name });
      const qAfter = ((await ctx.ds.query(`SELECT quantity FROM container WHERE id = $1`, [p.containerId])) as { quantity: number }[])[0]!.quantity;
      expect(qAfter).toBe(qBefore - 1);
      const [mv] = (await ctx.ds.query(`SELECT kind, quantity_delta, positions, measurement_id, reason, user_id FROM stock_movement WHERE container_id = $1 ORDER BY id DESC LIMIT 1`, [p.containerId])) as {
        kind: string;
        quantity_delta: number;
        positions: number[];
        measurement_id: string;
        reason: string;
        user_id: number;
      }[];
      expect(mv).toMatchObject({ kind: 'pull', quantity_delta: -1, positions: [p.position], measurement_id: p.measurementId, reason: `Kit ${kit.code}`, user_id: user.id });
      expect(res.body.kit.status).toBe(i === 3 ? 'pulled' : 'picking');
      last = res.body;
    }
    expect(last?.kit.completedAt).not.toBeNull();
    expect(last?.kit.reservedUntil).toBeNull();
    expect(await states(s.lotId)).toEqual({ 'in-stock': 4, pulled: 4 });
    const actions = (await ctx.ds.query(`SELECT action FROM audit_entry WHERE entity_type = 'kit' AND entity_id = $1 ORDER BY id`, [String(kit.id)])) as { action: string }[];
    expect(actions.map((a) => a.action)).toEqual(['kit.reserve', 'kit.pull', 'kit.pull', 'kit.pull', 'kit.pull-complete']);
    // A finished kit takes no more scans.
    const again = await post(agent, `/api/kits/${kit.id}/pull`, { containerCode: lines[0]!.containerCode, position: lines[0]!.position });
    expect(again.status).toBe(409);
    expect(again.body.detail).toMatch(/complete/);
  });

  it('wrong scans are refused with a clear message and change nothing: other container 422, position not in kit 422, already pulled 409, not a container code 422', async () => {
    const s = await stock(FOUR_PAIRS, { capacity: 4 });
    const other = await stock();
    const { agent } = await signedIn(ctx, 'assembler');
    const kit = await reserve(agent, s, 1);
    const [first, second] = kit.pickList;
    const wrongContainer = await post(agent, `/api/kits/${kit.id}/pull`, { containerCode: other.containers[0]!.code, position: 1 });
    expect(wrongContainer.status).toBe(422);
    expect(wrongContainer.body.errors[0].field).toBe('containerCode');
    expect(wrongContainer.body.detail).toContain(`Wrong container: ${other.containers[0]!.code} holds no part of this kit`);
    expect(wrongContainer.body.detail).toContain(`Next to pull: ${first!.containerCode} position ${first!.position}`);

    const inKitContainer = kit.pickList.map((p) => p.position);
    const notInKit = [1, 2, 3, 4].find((p) => !kit.pickList.some((l) => l.containerCode === first!.containerCode && l.position === p)) as number;
    const wrongPos = await post(agent, `/api/kits/${kit.id}/pull`, { containerCode: first!.containerCode, position: notInKit });
    expect(wrongPos.status).toBe(422);
    expect(wrongPos.body.errors[0].field).toBe('position');
    expect(wrongPos.body.detail).toMatch(/Wrong position: position \d+ of C-\d{8}-\d{4} is not part of this kit\. From C-\d{8}-\d{4} this kit needs position/);
    expect(inKitContainer).toHaveLength(2);

    const notACode = await post(agent, `/api/kits/${kit.id}/pull`, { containerCode: 'L-20260101-0001', position: 1 });
    expect(notACode.status).toBe(422);
    expect(notACode.body.errors[0].field).toBe('containerCode');

    const badPos = await post(agent, `/api/kits/${kit.id}/pull`, { containerCode: first!.containerCode, position: 0 });
    expect(badPos.status).toBe(400);
    expect(badPos.body.errors[0].field).toBe('position');

    expect((await post(agent, `/api/kits/${kit.id}/pull`, { containerCode: first!.containerCode, position: first!.position })).status).toBe(200);
    const twice = await post(agent, `/api/kits/${kit.id}/pull`, { containerCode: first!.containerCode, position: first!.position });
    expect(twice.status).toBe(409);
    expect(twice.body.detail).toMatch(/Already pulled: position \d+ of C-\d{8}-\d{4} was pulled for this kit at .* by Test assembler/);
    const detail = (await agent.get(`/api/kits/${kit.id}`).expect(200)).body as KitDetail;
    expect(detail.pulled).toBe(1);
    expect(detail.status).toBe('picking');
    expect(second).toBeDefined();
    expect(await states(s.lotId)).toEqual({ 'in-stock': 6, reserved: 1, pulled: 1 });
  });

  it('cancelling gives the unpulled parts back to stock, keeps the pulled ones with the kit, and then refuses pulls and a second cancel', async () => {
    const s = await stock();
    const { agent } = await signedIn(ctx, 'assembler');
    const kit = await reserve(agent, s, 2);
    const first = kit.pickList[0]!;
    await post(agent, `/api/kits/${kit.id}/pull`, { containerCode: first.containerCode, position: first.position }).expect(200);
    const res = await post(agent, `/api/kits/${kit.id}/cancel`, { reason: 'Amplifier build postponed' });
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('cancelled');
    expect(res.body.released).toBe(3);
    expect(res.body.pickList).toHaveLength(1);
    expect(res.body.cancelledByName).toBe('Test assembler');
    expect(await states(s.lotId)).toEqual({ 'in-stock': 7, pulled: 1 });
    const [audit] = (await ctx.ds.query(`SELECT note, after FROM audit_entry WHERE entity_type = 'kit' AND entity_id = $1 AND action = 'kit.cancel'`, [String(kit.id)])) as { note: string; after: { released: number } }[];
    expect(audit).toMatchObject({ note: 'Amplifier build postponed', after: { status: 'cancelled', released: 3 } });
    const second = kit.pickList[1]!;
    const pull = await post(agent, `/api/kits/${kit.id}/pull`, { containerCode: second.containerCode, position: second.position });
    expect(pull.status).toBe(409);
    expect(pull.body.detail).toMatch(/was cancelled/);
    expect((await post(agent, `/api/kits/${kit.id}/cancel`, {})).status).toBe(409);
    // The released parts can be planned again.
    const plan = await post(agent, '/api/kits/plan', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 4 });
    expect(plan.body.stockParts).toBe(7);
    expect(plan.body.setsPossible).toBe(3);
  });

  it('an expired reservation is released when the kit is next read, and by the sweep; a pull after it is refused', async () => {
    const s = await stock();
    const { agent } = await signedIn(ctx, 'assembler');
    const kit = await reserve(agent, s, 2, { holdMinutes: 15 });
    await ctx.ds.query(`UPDATE kit_request SET reserved_until = now() - interval '1 minute' WHERE id = $1`, [kit.id]);
    const read = (await agent.get(`/api/kits/${kit.id}`).expect(200)).body as KitDetail;
    expect(read.status).toBe('expired');
    expect(read.expiredAt).not.toBeNull();
    expect(read.released).toBe(4);
    expect(await states(s.lotId)).toEqual({ 'in-stock': 8 });
    const p = kit.pickList[0]!;
    const pull = await post(agent, `/api/kits/${kit.id}/pull`, { containerCode: p.containerCode, position: p.position });
    expect(pull.status).toBe(409);
    expect(pull.body.detail).toMatch(/expired/);
    const [audit] = (await ctx.ds.query(`SELECT actor_name FROM audit_entry WHERE entity_type = 'kit' AND entity_id = $1 AND action = 'kit.expire'`, [String(kit.id)])) as { actor_name: string }[];
    expect(audit?.actor_name).toBe('system');

    // The sweep: a second kit whose time ran out is expired without anyone reading it.
    const kit2 = await reserve(agent, s, 1);
    await ctx.ds.query(`UPDATE kit_request SET reserved_until = now() - interval '1 second' WHERE id = $1`, [kit2.id]);
    expect(await releaseExpiredKits(ctx.ds)).toBeGreaterThanOrEqual(1);
    const [{ status }] = (await ctx.ds.query(`SELECT status FROM kit_request WHERE id = $1`, [kit2.id])) as { status: string }[];
    expect(status).toBe('expired');
    expect(await states(s.lotId)).toEqual({ 'in-stock': 8 });
  });

  it('bad reserve input: holdMinutes outside 15 min – 7 days 400 naming it', async () => {
    const s = await stock();
    const { agent } = await signedIn(ctx, 'assembler');
    const res = await post(agent, '/api/kits', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 1, holdMinutes: 5 });
    expect(res.status).toBe(400);
    expect(res.body.errors[0].field).toBe('holdMinutes');
  });
});

describe('traceability both ways', () => {
  it('GET /api/lots/:id/kits lists the kits holding parts of the lot; the kit names its source lots and supplier lots', async () => {
    const pt = await makePairingPartType(ctx.ds, { matchHfePct: 5, matchVbeMv: 2 });
    const lotA = await makeStockLot(ctx.ds, pt, [
      { hfe: 100, vbeMv: 650 },
      { hfe: 300, vbeMv: 690 },
    ]);
    const lotB = await makeStockLot(ctx.ds, pt, [
      { hfe: 101, vbeMv: 650.3 },
      { hfe: 500, vbeMv: 700 },
    ]);
    const { agent } = await signedIn(ctx, 'assembler');
    const kit = (await post(agent, '/api/kits', { partTypeId: pt.partTypeId, mode: 'same', setSize: 2, setsWanted: 1 }).expect(201)).body as KitDetail;
    expect(kit.sourceLots.map((l) => [l.lotCode, l.supplierLot, l.supplierName, l.parts]).sort()).toEqual(
      [
        [lotA.lotCode, lotA.supplierLot, lotA.supplierName, 1],
        [lotB.lotCode, lotB.supplierLot, lotB.supplierName, 1],
      ].sort(),
    );
    const p = kit.pickList[0]!;
    await post(agent, `/api/kits/${kit.id}/pull`, { containerCode: p.containerCode, position: p.position }).expect(200);
    // Any signed-in role can trace (a buyer here).
    const { agent: buyer } = await signedIn(ctx, 'buyer');
    for (const lot of [lotA, lotB]) {
      const rows = (await buyer.get(`/api/lots/${lot.lotId}/kits`).expect(200)).body;
      expect(rows).toHaveLength(1);
      expect(rows[0]).toMatchObject({ kitId: kit.id, code: kit.code, status: 'picking', parts: 1 });
    }
    const pulledLot = p.lotId === lotA.lotId ? lotA : lotB;
    const rows = (await buyer.get(`/api/lots/${pulledLot.lotId}/kits`).expect(200)).body;
    expect(rows[0].pulled).toBe(1);
    expect((await buyer.get('/api/lots/99999999/kits')).status).toBe(404);
  });
});

describe('GET /api/kits', () => {
  it('lists kits newest first with filters by status and search, paged on the server', async () => {
    const s = await stock();
    const { agent } = await signedIn(ctx, 'assembler');
    const k1 = (await post(agent, '/api/kits', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 1 }).expect(201)).body as KitDetail;
    const k2 = (await post(agent, '/api/kits', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 1 }).expect(201)).body as KitDetail;
    await post(agent, `/api/kits/${k1.id}/cancel`, {}).expect(200);
    const list = (await agent.get(`/api/kits?search=${encodeURIComponent(s.partNumber)}`).expect(200)).body;
    expect(list.items.map((k: { code: string }) => k.code)).toEqual([k2.code, k1.code]);
    expect(list.total).toBe(2);
    const cancelled = (await agent.get(`/api/kits?search=${encodeURIComponent(s.partNumber)}&status=cancelled`).expect(200)).body;
    expect(cancelled.items.map((k: { code: string }) => k.code)).toEqual([k1.code]);
    const paged = (await agent.get(`/api/kits?search=${encodeURIComponent(s.partNumber)}&pageSize=1&page=2&sort=code&dir=asc`).expect(200)).body;
    expect(paged.items.map((k: { code: string }) => k.code)).toEqual([[k1.code, k2.code].sort()[1]]);
    expect((await agent.get('/api/kits?status=lost')).status).toBe(400);
    expect((await agent.get('/api/kits/99999999')).status).toBe(404);
  });

  it('GET /api/pairing/stock lists part types with parts in stock and reserved, with their default tolerances', async () => {
    const s = await stock();
    const { agent } = await signedIn(ctx, 'assembler');
    await post(agent, '/api/kits', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 1 }).expect(201);
    const rows = (await agent.get('/api/pairing/stock').expect(200)).body as { id: number; inStock: number; reserved: number; matchHfePct: number }[];
    expect(rows.find((r) => r.id === s.partTypeId)).toMatchObject({ inStock: 6, reserved: 2, matchHfePct: 5 });
  });
});
