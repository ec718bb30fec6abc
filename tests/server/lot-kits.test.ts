/**
 * Traceability from a lot forward: GET /api/lots/:id/kits answers "which kits hold parts of lot X"
 * — kit, status, how many of the lot's parts, how many pulled and when. Read-only; every role that
 * reads lots (every signed-in role) may ask.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import type { KitDetail, LotKitRow } from '../../shared/api/pairing.ts';
import { ROLES, type Role } from '../../shared/api/roles.ts';
import { agentFor, makeUser, useTestApp, type Agent } from './helpers.ts';
import { makePairingPartType, makeStockLot, type StockLot } from './pairing-fixtures.ts';

const ctx = useTestApp();
const agents = {} as Record<Role, Agent>;

beforeAll(async () => {
  for (const role of ROLES) agents[role] = await agentFor(ctx.app, await makeUser(ctx.ds, role));
});

const post = (a: Agent, url: string, body: object) => a.post(url).set('x-csrf-token', a.csrf).send(body);

/** Four clean pairs far apart (1 % hFE, 0.2 mV within a pair). */
const FOUR_PAIRS = [100, 150, 200, 250].flatMap((h, i) => [
  { hfe: h, vbeMv: 650 + i * 5 },
  { hfe: h * 1.01, vbeMv: 650.2 + i * 5 },
]);

async function stockLot(): Promise<StockLot> {
  const pt = await makePairingPartType(ctx.ds, { matchHfePct: 5, matchVbeMv: 2 });
  return makeStockLot(ctx.ds, pt, FOUR_PAIRS);
}

const reserve = async (s: StockLot) =>
  (await post(agents.assembler, '/api/kits', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 1 }).expect(201)).body as KitDetail;
const pull = (kit: KitDetail, i: number) => post(agents.assembler, `/api/kits/${kit.id}/pull`, { containerCode: kit.pickList[i]!.containerCode, position: kit.pickList[i]!.position }).expect(200);
const lotKits = async (a: Agent, lotId: number) => (await a.get(`/api/lots/${lotId}/kits`).expect(200)).body as LotKitRow[];

describe('GET /api/lots/:id/kits', () => {
  it('lists the kits holding parts of the lot, newest first, with parts, pulled count and pull times; a kit that gave every part back is not listed', async () => {
    const s = await stockLot();
    const other = await stockLot(); // another lot of another part type: never counted here

    const picking = await reserve(s);
    await pull(picking, 0);
    const cancelled = await reserve(s);
    await post(agents.assembler, `/api/kits/${cancelled.id}/cancel`, {}).expect(200);
    const done = await reserve(s);
    await pull(done, 0);
    await pull(done, 1);
    const waiting = await reserve(s);
    await reserve(other);

    const rows = await lotKits(agents.quality, s.lotId);
    expect(rows.map((r) => [r.code, r.status, r.parts, r.pulled])).toEqual([
      [waiting.code, 'reserved', 2, 0],
      [done.code, 'pulled', 2, 2],
      [picking.code, 'picking', 2, 1],
    ]);
    const byCode = new Map(rows.map((r) => [r.code, r]));
    expect(byCode.get(waiting.code)).toMatchObject({ kitId: waiting.id, firstPulledAt: null, lastPulledAt: null });
    const p = byCode.get(picking.code)!;
    expect(p.firstPulledAt).not.toBeNull();
    expect(p.lastPulledAt).toBe(p.firstPulledAt);
    const d = byCode.get(done.code)!;
    expect(Date.parse(d.lastPulledAt!)).toBeGreaterThanOrEqual(Date.parse(d.firstPulledAt!));
    // The pull times are those recorded on the kit's parts.
    const [times] = (await ctx.ds.query(`SELECT min(pulled_at) AS first, max(pulled_at) AS last FROM kit_part WHERE kit_id = $1 AND lot_id = $2`, [done.id, s.lotId])) as {
      first: Date;
      last: Date;
    }[];
    expect([d.firstPulledAt, d.lastPulledAt]).toEqual([times!.first.toISOString(), times!.last.toISOString()]);
    expect(d.createdByName).toBeTruthy();
    expect(Number.isNaN(Date.parse(d.createdAt))).toBe(false);
  });

  it('a kit cancelled after a pull keeps the pulled part and stays listed as cancelled', async () => {
    const s = await stockLot();
    const kit = await reserve(s);
    await pull(kit, 0);
    await post(agents.assembler, `/api/kits/${kit.id}/cancel`, {}).expect(200);
    const rows = await lotKits(agents.inspector, s.lotId);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ kitId: kit.id, status: 'cancelled', parts: 1, pulled: 1 });
  });

  it('a lot none of whose parts went into a kit answers an empty list', async () => {
    const s = await stockLot();
    expect(await lotKits(agents.buyer, s.lotId)).toEqual([]);
  });

  it('every signed-in role reads the same answer; signed out answers 401; the read changes nothing', async () => {
    const s = await stockLot();
    const kit = await reserve(s);
    await pull(kit, 1);
    const before = await ctx.ds.query(`SELECT id, pulled_at, released_at FROM kit_part WHERE lot_id = $1 ORDER BY id`, [s.lotId]);
    const answers = await Promise.all(ROLES.map((role) => lotKits(agents[role], s.lotId)));
    for (const a of answers) expect(a).toEqual(answers[0]);
    expect(answers[0]).toHaveLength(1);
    expect(await ctx.ds.query(`SELECT id, pulled_at, released_at FROM kit_part WHERE lot_id = $1 ORDER BY id`, [s.lotId])).toEqual(before);
    const anonymous = await agentFor(ctx.app);
    expect((await anonymous.get(`/api/lots/${s.lotId}/kits`)).status).toBe(401);
  });

  it('an unknown lot answers 404; an id that is not a positive whole number answers 400 naming id', async () => {
    const missing = await agents.quality.get('/api/lots/99999999/kits');
    expect(missing.status).toBe(404);
    expect(missing.headers['content-type']).toMatch(/application\/problem\+json/);
    const bad = await agents.quality.get('/api/lots/abc/kits');
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].field).toBe('id');
  });
});
