/**
 * Roles on every Pairing write route: assemblers and quality engineers plan, reserve, cancel and
 * pull; inspectors and buyers get 403 and change nothing. The calculations (preview, bias) are
 * open to every signed-in role.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../../shared/api/roles.ts';
import type { KitDetail } from '../../shared/api/pairing.ts';
import { agentFor, makeUser, useTestApp, type Agent } from './helpers.ts';
import { makePairingPartType, makeStockLot, type StockLot } from './pairing-fixtures.ts';

const ctx = useTestApp();
const ALLOWED: Role[] = ['assembler', 'quality'];
const agents = {} as Record<Role, Agent>;

beforeAll(async () => {
  for (const role of ROLES) agents[role] = await agentFor(ctx.app, await makeUser(ctx.ds, role));
});

const post = (a: Agent, url: string, body: object) => a.post(url).set('x-csrf-token', a.csrf).send(body);

async function setup(): Promise<{ s: StockLot; kit: KitDetail }> {
  const pt = await makePairingPartType(ctx.ds, { matchHfePct: 5, matchVbeMv: 2 });
  const s = await makeStockLot(ctx.ds, pt, [
    { hfe: 100, vbeMv: 650 },
    { hfe: 101, vbeMv: 650.1 },
    { hfe: 200, vbeMv: 660 },
    { hfe: 202, vbeMv: 660.1 },
  ]);
  const kit = (await post(agents.quality, '/api/kits', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 1 }).expect(201)).body as KitDetail;
  return { s, kit };
}

async function snapshot(lotId: number) {
  return ctx.ds.query(
    `SELECT (SELECT count(*)::int FROM kit_request k WHERE EXISTS (SELECT 1 FROM kit_part kp WHERE kp.kit_id = k.id AND kp.lot_id = $1)) AS kits,
            (SELECT string_agg(cp.state, ',' ORDER BY cp.id) FROM container_position cp JOIN container c ON c.id = cp.container_id WHERE c.lot_id = $1) AS states,
            (SELECT string_agg(k.status, ',' ORDER BY k.id) FROM kit_request k WHERE EXISTS (SELECT 1 FROM kit_part kp WHERE kp.kit_id = k.id AND kp.lot_id = $1)) AS statuses`,
    [lotId],
  );
}

type WriteRoute = { name: string; ok: number; send: (a: Agent, f: { s: StockLot; kit: KitDetail }) => ReturnType<typeof post> };

const WRITES: WriteRoute[] = [
  { name: 'POST /api/kits/plan', ok: 200, send: (a, { s }) => post(a, '/api/kits/plan', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 1 }) },
  { name: 'POST /api/kits', ok: 201, send: (a, { s }) => post(a, '/api/kits', { partTypeId: s.partTypeId, mode: 'same', setSize: 2, setsWanted: 1 }) },
  { name: 'POST /api/kits/:id/cancel', ok: 200, send: (a, { kit }) => post(a, `/api/kits/${kit.id}/cancel`, { reason: 'role check' }) },
  {
    name: 'POST /api/kits/:id/pull',
    ok: 200,
    send: (a, { kit }) => post(a, `/api/kits/${kit.id}/pull`, { containerCode: kit.pickList[0]!.containerCode, position: kit.pickList[0]!.position }),
  },
];

const CASES = WRITES.flatMap((w) => ROLES.map((role) => [w.name, role, ALLOWED.includes(role) ? 'is carried out' : 'is refused with 403 and changes nothing'] as const));

describe('Pairing write routes × roles', () => {
  it.each(CASES)('%s as %s %s', async (name, role) => {
    const route = WRITES.find((w) => w.name === name)!;
    const allowed = ALLOWED.includes(role);
    const f = await setup();
    const before = await snapshot(f.s.lotId);
    const res = await route.send(agents[role], f);
    if (allowed) {
      expect(res.status, JSON.stringify(res.body)).toBe(route.ok);
    } else {
      expect(res.status).toBe(403);
      expect(res.body.code).toBe('forbidden');
      expect(res.body.detail).toMatch(/assembler or quality/);
      expect(await snapshot(f.s.lotId)).toEqual(before);
    }
  });
});

describe('Pairing reads and calculations × roles', () => {
  it.each(ROLES)('the role %s may read kits, trace a lot, and run the preview and the bias check', async (role) => {
    const f = await setup();
    const a = agents[role];
    expect((await a.get('/api/kits').expect(200)).body.total).toBeGreaterThan(0);
    expect((await a.get(`/api/kits/${f.kit.id}`).expect(200)).body.code).toBe(f.kit.code);
    expect((await a.get(`/api/lots/${f.s.lotId}/kits`).expect(200)).body).toHaveLength(1);
    expect((await a.get(`/api/kits/${f.kit.id}/pick-list.pdf`)).status).toBe(200);
    expect((await a.get('/api/pairing/stock')).status).toBe(200);
    const stage = { vcc: 12, r1: 47_000, r2: 10_000, re: 1_000, rc: 4_700 };
    expect((await post(a, '/api/bias/evaluate', { ...stage, hfe: 150, vbeV: 0.65 })).status).toBe(200);
    expect((await post(a, '/api/bias/fit-for-use', { lotId: f.s.lotId, stage })).status).toBe(200);
    const preview = { parts: [{ id: 'a', polarity: 'NPN', hfe: 100, vbeMv: 650 }], hfeTolerancePct: 5, vbeToleranceMv: 1, setSize: 2, mode: 'same' };
    expect((await post(a, '/api/pairing/preview', preview)).status).toBe(200);
  });
});
