/**
 * Concurrency of kit reservations: many assemblers reserving from the same stock at the same
 * moment must never get the same part, and each reservation is either whole or refused.
 */
import { describe, expect, it } from 'vitest';
import type { KitDetail } from '../../shared/api/pairing.ts';
import { signedIn, useTestApp, type Agent } from './helpers.ts';
import { makePairingPartType, makeStockLot } from './pairing-fixtures.ts';

const ctx = useTestApp();

/** mulberry32, seeded: the same stock every run. */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

async function agents(n: number): Promise<Agent[]> {
  const out: Agent[] = [];
  for (let i = 0; i < n; i++) out.push((await signedIn(ctx, i % 2 ? 'assembler' : 'quality')).agent);
  return out;
}

let signed: Agent[] | null = null;

/**
 * Twenty request senders: four signed-in users (two assemblers, two quality engineers), each
 * sending five requests at once — the database sees twenty concurrent transactions, and signing
 * in (scrypt) twenty users would only slow the test.
 */
async function twenty(): Promise<Agent[]> {
  signed ??= await agents(4);
  return Array.from({ length: 20 }, (_, i) => signed![i % 4]!);
}

/** Checks the database: no position in two kits, every held kit part reserved or pulled, counts agree. */
async function assertNoDoubleReservation(lotIds: number[]) {
  const dup = (await ctx.ds.query(
    `SELECT container_position_id, count(*)::int AS n FROM kit_part WHERE lot_id = ANY($1) AND released_at IS NULL GROUP BY container_position_id HAVING count(*) > 1`,
    [lotIds],
  )) as unknown[];
  expect(dup).toEqual([]);
  const [{ held, reserved }] = (await ctx.ds.query(
    `SELECT (SELECT count(*)::int FROM kit_part kp WHERE kp.lot_id = ANY($1) AND kp.released_at IS NULL AND kp.pulled_at IS NULL) AS held,
            (SELECT count(*)::int FROM container_position cp JOIN container c ON c.id = cp.container_id WHERE c.lot_id = ANY($1) AND cp.state = 'reserved') AS reserved`,
    [lotIds],
  )) as { held: number; reserved: number }[];
  expect(reserved).toBe(held);
  const mismatched = (await ctx.ds.query(
    `SELECT kp.id FROM kit_part kp JOIN container_position cp ON cp.id = kp.container_position_id
      WHERE kp.lot_id = ANY($1) AND kp.released_at IS NULL AND kp.pulled_at IS NULL AND cp.state <> 'reserved'`,
    [lotIds],
  )) as unknown[];
  expect(mismatched).toEqual([]);
}

describe('20 parallel reservations over the same stock', () => {
  it('fifteen clean pairs, twenty requests for two pairs each: exactly seven kits are reserved whole, thirteen refused with 409, no part twice', async () => {
    const pt = await makePairingPartType(ctx.ds, { matchHfePct: 5, matchVbeMv: 2 });
    const parts = Array.from({ length: 15 }, (_, i) => [
      { hfe: 100 + i * 20, vbeMv: 640 + i * 3 },
      { hfe: 100.5 + i * 20, vbeMv: 640.1 + i * 3 },
    ]).flat();
    const lot = await makeStockLot(ctx.ds, pt, parts, { capacity: 12 });
    const as = await twenty();
    const results = await Promise.all(
      as.map((a) => a.post('/api/kits').set('x-csrf-token', a.csrf).send({ partTypeId: pt.partTypeId, mode: 'same', setSize: 2, setsWanted: 2 })),
    );
    const statuses = results.map((r) => r.status).sort();
    expect(statuses.filter((s) => s === 201)).toHaveLength(7);
    expect(statuses.filter((s) => s === 409)).toHaveLength(13);
    const kits = results.filter((r) => r.status === 201).map((r) => r.body as KitDetail);
    for (const k of kits) {
      expect(k.sets).toHaveLength(2);
      expect(k.pickList).toHaveLength(4);
      expect(k.status).toBe('reserved');
    }
    const all = kits.flatMap((k) => k.pickList.map((p) => `${p.containerCode}/${p.position}`));
    expect(new Set(all).size).toBe(all.length);
    expect(new Set(kits.map((k) => k.code)).size).toBe(7);
    for (const r of results.filter((x) => x.status === 409)) {
      expect(r.body.errors[0].field).toBe('setsWanted');
      expect(r.body.detail).toMatch(/Nothing was reserved/);
    }
    await assertNoDoubleReservation([lot.lotId]);
  }, 60_000);

  it('dense random stock, twenty requests of one to three sets (pairs and quads): each kit is whole or refused, no part in two kits', async () => {
    const pt = await makePairingPartType(ctx.ds, { matchHfePct: 4, matchVbeMv: 1.5 });
    const next = rng(20261201);
    const parts = Array.from({ length: 90 }, () => ({ hfe: Math.round((150 + next() * 60) * 10) / 10, vbeMv: Math.round((650 + next() * 6) * 100) / 100 }));
    const lotA = await makeStockLot(ctx.ds, pt, parts.slice(0, 45), { capacity: 25, location: 'Cabinet 4' });
    const lotB = await makeStockLot(ctx.ds, pt, parts.slice(45), { capacity: 25, location: 'Cabinet 2' });
    const as = await twenty();
    const asks = as.map((_, i) => ({ setSize: i % 4 === 3 ? 4 : 2, setsWanted: 1 + (i % 3) }));
    const results = await Promise.all(
      as.map((a, i) => a.post('/api/kits').set('x-csrf-token', a.csrf).send({ partTypeId: pt.partTypeId, mode: 'same', ...asks[i] })),
    );
    expect(results.every((r) => r.status === 201 || r.status === 409)).toBe(true);
    const kits = results.map((r, i) => ({ r, ask: asks[i]! })).filter((x) => x.r.status === 201);
    expect(kits.length).toBeGreaterThan(0);
    for (const { r, ask } of kits) {
      const k = r.body as KitDetail;
      expect(k.sets).toHaveLength(ask.setsWanted);
      expect(k.pickList).toHaveLength(ask.setsWanted * ask.setSize);
      for (const s of k.sets) {
        expect(s.hfeSpreadPct).toBeLessThanOrEqual(4 + 1e-9);
        expect(s.vbeSpreadMv).toBeLessThanOrEqual(1.5 + 1e-9);
      }
    }
    const all = kits.flatMap(({ r }) => (r.body as KitDetail).pickList.map((p) => p.measurementId));
    expect(new Set(all).size).toBe(all.length);
    await assertNoDoubleReservation([lotA.lotId, lotB.lotId]);
    // A refused request left nothing behind: kit_part rows belong only to reserved kits.
    const [{ n }] = (await ctx.ds.query(
      `SELECT count(*)::int AS n FROM kit_part kp JOIN kit_request k ON k.id = kp.kit_id WHERE kp.lot_id = ANY($1) AND k.status <> 'reserved'`,
      [[lotA.lotId, lotB.lotId]],
    )) as { n: number }[];
    expect(n).toBe(0);
  }, 60_000);

  it('two assemblers scanning the same part at the same moment: one pull succeeds, the other is told it is already pulled', async () => {
    const pt = await makePairingPartType(ctx.ds, { matchHfePct: 5, matchVbeMv: 2 });
    const lot = await makeStockLot(ctx.ds, pt, [
      { hfe: 120, vbeMv: 650 },
      { hfe: 121, vbeMv: 650.1 },
    ]);
    const [a, b] = await agents(2);
    const kit = (await a!.post('/api/kits').set('x-csrf-token', a!.csrf).send({ partTypeId: pt.partTypeId, mode: 'same', setSize: 2, setsWanted: 1 }).expect(201)).body as KitDetail;
    const p = kit.pickList[0]!;
    const both = await Promise.all([a!, b!].map((x) => x.post(`/api/kits/${kit.id}/pull`).set('x-csrf-token', x.csrf).send({ containerCode: p.containerCode, position: p.position })));
    expect(both.map((r) => r.status).sort()).toEqual([200, 409]);
    const [{ quantity }] = (await ctx.ds.query(`SELECT quantity FROM container WHERE id = $1`, [p.containerId])) as { quantity: number }[];
    expect(quantity).toBe(1);
    const [{ n }] = (await ctx.ds.query(`SELECT count(*)::int AS n FROM stock_movement WHERE container_id = $1 AND kind = 'pull'`, [p.containerId])) as { n: number }[];
    expect(n).toBe(1);
    expect(lot.containers).toHaveLength(1);
  });
});
