import { describe, expect, it } from 'vitest';
import type { ContainerDetail, PlaceScreenedResponse, StockResponse } from '../../shared/api/bins.ts';
import { ROLES, type Role } from '../../shared/api/roles.ts';
import { agentFor, makeUser, signedIn, useTestApp, type Agent } from './helpers.ts';
import { addReadings, makeScreenLot, type ScreenLot } from './bins-fixtures.ts';

const ctx = useTestApp();

const BAG = { kind: 'bag' as const, capacity: 50, hasPositions: false, location: 'Shelf A' };
const STRIP = { kind: 'strip' as const, capacity: 10, hasPositions: true, location: 'Rack 1' };

async function screened(setup: typeof BAG | typeof STRIP, hfes: number[]): Promise<{ f: ScreenLot; agent: Agent; placed: PlaceScreenedResponse }> {
  const f = await makeScreenLot(ctx.ds, { setup });
  const agent = await agentFor(ctx.app, f.inspector);
  await addReadings(ctx.ds, f, hfes);
  const res = await agent.post(`/api/lots/${f.lotId}/screening/place`).set('x-csrf-token', agent.csrf).send({}).expect(200);
  return { f, agent, placed: res.body };
}

const post = (agent: Agent, url: string, body: object) => agent.post(url).set('x-csrf-token', agent.csrf).send(body);

describe('GET /api/containers', () => {
  it('filters by lot, bin, status and location, pages and sorts on the server', async () => {
    const { f, agent } = await screened({ ...STRIP, capacity: 2 }, [110, 120, 130, 210, 220]);
    const all = (await agent.get(`/api/containers?lotId=${f.lotId}&sort=code&dir=asc`).expect(200)).body;
    expect(all.total).toBe(3);
    expect(all.items.map((c: ContainerDetail) => [c.bin.code, c.quantity, c.status])).toEqual([
      ['A', 2, 'full'],
      ['A', 1, 'open'],
      ['B', 2, 'full'],
    ]);
    const binA = (await agent.get(`/api/containers?lotId=${f.lotId}&bin=A`).expect(200)).body;
    expect(binA.total).toBe(2);
    const open = (await agent.get(`/api/containers?lotId=${f.lotId}&status=open`).expect(200)).body;
    expect(open.items.map((c: ContainerDetail) => c.bin.code)).toEqual(['A']);
    const paged = (await agent.get(`/api/containers?lotId=${f.lotId}&pageSize=2&page=2&sort=code`).expect(200)).body;
    expect(paged).toMatchObject({ total: 3, page: 2, pageSize: 2 });
    expect(paged.items).toHaveLength(1);
    const byPart = (await agent.get(`/api/containers?partTypeId=${f.partTypeId}&location=rack`).expect(200)).body;
    expect(byPart.total).toBe(3);
    expect((await agent.get(`/api/containers?partTypeId=${f.partTypeId}&location=nowhere`).expect(200)).body.total).toBe(0);
  });

  it('with an unknown status or sort, answers 400 naming the parameter', async () => {
    const { agent } = await signedIn(ctx, 'assembler');
    expect((await agent.get('/api/containers?status=lost').expect(400)).body.errors[0].field).toBe('status');
    expect((await agent.get('/api/containers?sort=colour').expect(400)).body.errors[0].field).toBe('sort');
    expect((await agent.get('/api/containers?lotId=x').expect(400)).body.errors[0].field).toBe('lotId');
  });
});

describe('GET /api/containers/:id and /by-code/:code', () => {
  it("shows each position's part with its hFE and Vbe at 25 °C, and the screen-in movements", async () => {
    const { agent, placed } = await screened(STRIP, [150, 160]);
    const id = placed.placements[0]?.containerId;
    const d: ContainerDetail = (await agent.get(`/api/containers/${id}`).expect(200)).body;
    expect(d.positions.map((p) => [p.position, p.hfe25, p.state])).toEqual([
      [1, 150, 'in-stock'],
      [2, 160, 'in-stock'],
    ]);
    expect(d.testCondition).toBe('IC = 2 mA, VCE = 5 V');
    expect(d.movements.map((m) => [m.kind, m.quantityDelta, m.quantityAfter])).toEqual([
      ['screen-in', 1, 2],
      ['screen-in', 1, 1],
    ]);
  });

  it('a scanned code opens the container whatever its case; a code that is not ours answers 422, an unknown one 404', async () => {
    const { agent, placed } = await screened(STRIP, [150]);
    const code = placed.placements[0]?.containerCode as string;
    const d = (await agent.get(`/api/containers/by-code/${code.toLowerCase()}`).expect(200)).body;
    expect(d.code).toBe(code);
    expect((await agent.get('/api/containers/by-code/PO-12345').expect(422)).body.errors[0].field).toBe('code');
    await agent.get('/api/containers/by-code/C-20000101-9999').expect(404);
    await agent.get('/api/containers/99999999').expect(404);
  });
});

describe('POST /api/containers/:id/move', () => {
  it('moves the container, records from → to in the ledger and the audit trail', async () => {
    const { agent, placed } = await screened(STRIP, [150]);
    const id = placed.placements[0]?.containerId;
    const res = await post(agent, `/api/containers/${id}/move`, { toLocation: 'Cabinet 4, drawer 2' }).expect(200);
    expect(res.body.location).toBe('Cabinet 4, drawer 2');
    expect(res.body.movements[0]).toMatchObject({ kind: 'move', fromLocation: 'Rack 1', toLocation: 'Cabinet 4, drawer 2', quantityDelta: 0, quantityAfter: 1 });
    const [a] = await ctx.ds.query(`SELECT action, before, after FROM audit_entry WHERE entity_type = 'container' AND entity_id = $1 ORDER BY id DESC LIMIT 1`, [String(id)]);
    expect(a).toMatchObject({ action: 'container.move', before: { location: 'Rack 1' }, after: { location: 'Cabinet 4, drawer 2' } });
  });

  it('to where it already is answers 422 naming toLocation; a stale expectedVersion answers 409', async () => {
    const { agent, placed } = await screened(STRIP, [150]);
    const id = placed.placements[0]?.containerId;
    expect((await post(agent, `/api/containers/${id}/move`, { toLocation: 'Rack 1' }).expect(422)).body.errors[0].field).toBe('toLocation');
    expect((await post(agent, `/api/containers/${id}/move`, { toLocation: '' }).expect(400)).body.errors[0].field).toBe('toLocation');
    expect((await post(agent, `/api/containers/${id}/move`, { toLocation: 'Rack 2', expectedVersion: 1 }).expect(409)).body.errors[0].field).toBe('expectedVersion');
  });

  it('ten people moving the same container at once: all ten land, one after another, and the ledger is one unbroken chain', async () => {
    const { agent, placed } = await screened(STRIP, [150, 151, 152]);
    const id = placed.placements[0]?.containerId;
    const before: ContainerDetail = (await agent.get(`/api/containers/${id}`).expect(200)).body;
    const agents = await Promise.all(Array.from({ length: 10 }, async () => agentFor(ctx.app, await makeUser(ctx.ds, 'inspector'))));
    const results = await Promise.all(agents.map((a, i) => post(a, `/api/containers/${id}/move`, { toLocation: `Shelf ${i + 1}` })));
    expect(results.map((r) => r.status)).toEqual(Array(10).fill(200));
    const after: ContainerDetail = (await agent.get(`/api/containers/${id}`).expect(200)).body;
    const moves = after.movements.filter((m) => m.kind === 'move').reverse();
    expect(moves).toHaveLength(10);
    expect(moves[0]?.fromLocation).toBe('Rack 1');
    for (let i = 1; i < moves.length; i++) expect(moves[i]?.fromLocation).toBe(moves[i - 1]?.toLocation);
    expect(after.location).toBe(moves[9]?.toLocation);
    expect(new Set(moves.map((m) => m.toLocation)).size).toBe(10);
    expect(after.version).toBe(before.version + 10);
    expect(after.quantity).toBe(3);
    expect(after.positions.filter((p) => p.state === 'in-stock')).toHaveLength(3);
  });
});

describe('POST /api/containers/:id/adjust', () => {
  it('corrects the count of a bag with a reason; below zero or above capacity answers 409; zero answers 400', async () => {
    const { agent, placed } = await screened(BAG, [150, 151]);
    const id = placed.placements[0]?.containerId;
    const res = await post(agent, `/api/containers/${id}/adjust`, { delta: 3, reason: 'found in the tray' }).expect(200);
    expect(res.body.quantity).toBe(5);
    expect(res.body.movements[0]).toMatchObject({ kind: 'adjust', quantityDelta: 3, quantityAfter: 5, reason: 'found in the tray' });
    expect((await post(agent, `/api/containers/${id}/adjust`, { delta: -6, reason: 'count' }).expect(409)).body.errors[0].field).toBe('delta');
    expect((await post(agent, `/api/containers/${id}/adjust`, { delta: 46, reason: 'count' }).expect(409)).body.errors[0].field).toBe('delta');
    expect((await post(agent, `/api/containers/${id}/adjust`, { delta: 0, reason: 'count' }).expect(400)).body.errors[0].field).toBe('delta');
    expect((await post(agent, `/api/containers/${id}/adjust`, { delta: -1 }).expect(400)).body.errors[0].field).toBe('reason');
    const [a] = await ctx.ds.query(`SELECT action, note FROM audit_entry WHERE entity_type = 'container' AND entity_id = $1 ORDER BY id DESC LIMIT 1`, [String(id)]);
    expect(a).toEqual({ action: 'container.adjust', note: 'found in the tray' });
  });

  it('on a container with positions answers 422: each part is tracked, scrap its position instead', async () => {
    const { agent, placed } = await screened(STRIP, [150]);
    await post(agent, `/api/containers/${placed.placements[0]?.containerId}/adjust`, { delta: -1, reason: 'lost' }).expect(422);
  });

  it('20 parallel adjustments of −1 on a bag of 10: exactly 10 succeed, 10 are refused, the count ends at 0 and never goes negative', async () => {
    const { agent, placed } = await screened(BAG, Array.from({ length: 10 }, (_, i) => 110 + i));
    const id = placed.placements[0]?.containerId;
    const results = await Promise.all(Array.from({ length: 20 }, () => post(agent, `/api/containers/${id}/adjust`, { delta: -1, reason: 'parallel count' })));
    const statuses = results.map((r) => r.status).sort();
    expect(statuses.filter((s) => s === 200)).toHaveLength(10);
    expect(statuses.filter((s) => s === 409)).toHaveLength(10);
    const d: ContainerDetail = (await agent.get(`/api/containers/${id}`).expect(200)).body;
    expect(d.quantity).toBe(0);
    expect(d.status).toBe('open');
    const adjusts = d.movements.filter((m) => m.kind === 'adjust').reverse();
    expect(adjusts.map((m) => m.quantityAfter)).toEqual([9, 8, 7, 6, 5, 4, 3, 2, 1, 0]);
    const [{ neg }] = await ctx.ds.query(`SELECT count(*)::int AS neg FROM stock_movement WHERE container_id = $1 AND quantity_after < 0`, [id]);
    expect(neg).toBe(0);
  });

  it('the database itself refuses a negative count (CHECK constraint)', async () => {
    const { placed } = await screened(BAG, [150]);
    await expect(ctx.ds.query(`UPDATE container SET quantity = -1 WHERE id = $1`, [placed.placements[0]?.containerId])).rejects.toThrow(/container_quantity_not_negative/);
  });
});

describe('POST /api/containers/:id/scrap', () => {
  it('scraps named positions of a strip: their parts leave stock, the count drops, the reason is kept', async () => {
    const { agent, placed } = await screened(STRIP, [150, 151, 152]);
    const id = placed.placements[0]?.containerId;
    const res = await post(agent, `/api/containers/${id}/scrap`, { positions: [1, 3], reason: 'bent leads' }).expect(200);
    expect(res.body.quantity).toBe(1);
    expect(res.body.positions.map((p: { position: number; state: string }) => [p.position, p.state])).toEqual([
      [1, 'scrapped'],
      [2, 'in-stock'],
      [3, 'scrapped'],
    ]);
    expect(res.body.movements[0]).toMatchObject({ kind: 'scrap', quantityDelta: -2, positions: [1, 3], reason: 'bent leads' });
    expect((await post(agent, `/api/containers/${id}/scrap`, { positions: [1], reason: 'again' }).expect(409)).body.errors[0].field).toBe('positions');
    expect((await post(agent, `/api/containers/${id}/scrap`, { quantity: 1, reason: 'x y z' }).expect(400)).body.errors[0].field).toBe('positions');
  });

  it('scraps a quantity from a bag; more than it holds answers 409; both or neither of quantity/positions answer 400', async () => {
    const { agent, placed } = await screened(BAG, [150, 151, 152]);
    const id = placed.placements[0]?.containerId;
    expect((await post(agent, `/api/containers/${id}/scrap`, { quantity: 2, reason: 'cracked' }).expect(200)).body.quantity).toBe(1);
    expect((await post(agent, `/api/containers/${id}/scrap`, { quantity: 2, reason: 'cracked' }).expect(409)).body.errors[0].field).toBe('quantity');
    await post(agent, `/api/containers/${id}/scrap`, { reason: 'nothing' }).expect(400);
    await post(agent, `/api/containers/${id}/scrap`, { quantity: 1, positions: [1], reason: 'both' }).expect(400);
    const d = (await post(agent, `/api/containers/${id}/scrap`, { quantity: 1, reason: 'last one' }).expect(200)).body;
    expect(d).toMatchObject({ quantity: 0, status: 'open' });
  });
});

describe('GET /api/stock', () => {
  it('gives the quantity per part type × bin × container, bins in hFE order and outside last', async () => {
    const { f, agent } = await screened(BAG, [110, 120, 250, 50]);
    const s: StockResponse = (await agent.get(`/api/stock?partTypeId=${f.partTypeId}`).expect(200)).body;
    expect(s.partTypes).toHaveLength(1);
    const p = s.partTypes[0];
    expect(p?.quantity).toBe(4);
    expect(p?.bins.map((b) => [b.code, b.quantity, b.index, b.containers.length])).toEqual([
      ['A', 2, 0, 1],
      ['B', 1, 1, 1],
      [null, 1, null, 1],
    ]);
    expect(p?.bins[1]).toMatchObject({ label: 'Gain group B', hfeMin: 200, hfeMax: 300, isLast: true });
  });
});

const WRITE_ROUTES: { name: string; call: (a: Agent, id: number, lotId: number) => ReturnType<typeof post> | ReturnType<Agent['put']> }[] = [
  { name: 'POST /api/containers/:id/move', call: (a, id) => post(a, `/api/containers/${id}/move`, { toLocation: `Role shelf ${Math.random()}` }) },
  { name: 'POST /api/containers/:id/adjust', call: (a, id) => post(a, `/api/containers/${id}/adjust`, { delta: 1, reason: 'role check' }) },
  { name: 'POST /api/containers/:id/scrap', call: (a, id) => post(a, `/api/containers/${id}/scrap`, { quantity: 1, reason: 'role check' }) },
  { name: 'POST /api/containers/:id/close', call: (a, id) => post(a, `/api/containers/${id}/close`, {}) },
  { name: 'PUT /api/lots/:id/screening/setup', call: (a, _id, lotId) => a.put(`/api/lots/${lotId}/screening/setup`).set('x-csrf-token', a.csrf).send(BAG) },
  { name: 'POST /api/lots/:id/screening/place', call: (a, _id, lotId) => post(a, `/api/lots/${lotId}/screening/place`, {}) },
  { name: 'POST /api/labels/bins.pdf', call: (a, id) => post(a, '/api/labels/bins.pdf', { containerIds: [id], stock: '100x50' }) },
];

const ALLOWED: Record<Role, boolean> = { inspector: true, quality: true, buyer: false, assembler: false };

describe('role checks on every Bins write route', () => {
  const cases = WRITE_ROUTES.flatMap((r) => ROLES.map((role) => ({ route: r.name, role, call: r.call, allowed: ALLOWED[role] })));
  it.each(cases)('$route as $role → allowed: $allowed', async ({ role, call, allowed }) => {
    const { f, placed } = await screened(BAG, [150, 151]);
    const { agent } = await signedIn(ctx, role);
    const res = await call(agent, placed.placements[0]?.containerId as number, f.lotId);
    if (allowed) {
      expect(res.status).toBe(200);
    } else {
      expect(res.status).toBe(403);
      expect(res.body.code).toBe('forbidden');
      const [{ n }] = await ctx.ds.query(`SELECT count(*)::int AS n FROM stock_movement WHERE container_id = $1 AND kind <> 'screen-in'`, [placed.placements[0]?.containerId]);
      expect(n).toBe(0);
    }
  });

  it.each(ROLES)('%s may read containers, stock and lot screening', async (role) => {
    const { f, placed } = await screened(BAG, [150]);
    const { agent } = await signedIn(ctx, role);
    await agent.get('/api/containers').expect(200);
    await agent.get(`/api/containers/${placed.placements[0]?.containerId}`).expect(200);
    await agent.get('/api/stock').expect(200);
    await agent.get(`/api/lots/${f.lotId}/screening`).expect(200);
  });
});
