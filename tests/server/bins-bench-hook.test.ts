import { describe, expect, it } from 'vitest';
import type { RecentPlacementsResponse } from '../../shared/api/bins.ts';
import { agentFor, useTestApp, type Agent } from './helpers.ts';
import { makeScreenLot, type ScreenLot } from './bins-fixtures.ts';

const ctx = useTestApp();

const STRIP3 = { kind: 'strip' as const, capacity: 3, hasPositions: true, location: 'Bench 1' };

async function screenSession(agent: Agent, lotId: number): Promise<number> {
  const res = await agent.post(`/api/lots/${lotId}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: 'Bench tester S', ambientC: 25, mode: 'screen' });
  if (res.status !== 201) throw new Error(`session: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.id;
}

async function record(agent: Agent, lotId: number, sessionId: number, position: number, hfe: number) {
  return agent.post(`/api/lots/${lotId}/measurements`).set('x-csrf-token', agent.csrf).send({ sessionId, position, hfe, vbe: 650, vbeUnit: 'mV' });
}

async function recent(agent: Agent, f: ScreenLot): Promise<RecentPlacementsResponse> {
  return (await agent.get(`/api/lots/${f.lotId}/screening/recent?limit=10`).expect(200)).body;
}

describe('the bench places screened parts as they are recorded', () => {
  it('a reading in a screening session gets its bin, container and position in the same request', async () => {
    const f = await makeScreenLot(ctx.ds, { setup: STRIP3, quantity: 20 });
    const agent = await agentFor(ctx.app, f.inspector);
    const sessionId = await screenSession(agent, f.lotId);
    for (const [i, hfe] of [150, 250, 160, 170, 180].entries()) expect((await record(agent, f.lotId, sessionId, i + 1, hfe)).status).toBe(201);
    const r = await recent(agent, f);
    expect(r.screeningOpen).toBe(true);
    expect(r.items.map((p) => [p.lotPosition, p.bin.code, p.position, p.openedContainer, p.filledContainer])).toEqual([
      [5, 'A', 1, true, false],
      [4, 'A', 3, false, true],
      [3, 'A', 2, false, false],
      [2, 'B', 1, true, false],
      [1, 'A', 1, true, false],
    ]);
  });

  it('a correction through the bench moves the part to its new bin', async () => {
    const f = await makeScreenLot(ctx.ds, { setup: STRIP3, quantity: 20 });
    const agent = await agentFor(ctx.app, f.inspector);
    const sessionId = await screenSession(agent, f.lotId);
    const first = await record(agent, f.lotId, sessionId, 1, 150);
    const res = await agent
      .post(`/api/lots/${f.lotId}/measurements/${first.body.id}/corrections`)
      .set('x-csrf-token', agent.csrf)
      .send({ sessionId, hfe: 240, vbe: 650, vbeUnit: 'mV', reason: 'probe slipped' });
    expect(res.status).toBe(201);
    const s = (await agent.get(`/api/lots/${f.lotId}/screening`).expect(200)).body;
    expect(s.bins.map((b: { count: number }) => b.count)).toEqual([0, 1]);
    expect(s.containers.map((c: { bin: { code: string }; quantity: number }) => [c.bin.code, c.quantity])).toEqual([
      ['A', 0],
      ['B', 1],
    ]);
  });

  it('a tester import in a screening session places every imported part in the same transaction', async () => {
    const f = await makeScreenLot(ctx.ds, { setup: STRIP3, quantity: 20 });
    const agent = await agentFor(ctx.app, f.inspector);
    const sessionId = await screenSession(agent, f.lotId);
    const csv = `Pos,HFE,VBE_V\n${[110, 210, 120, 220, 130, 230, 140].map((h, i) => `${i + 1},${h},0.65`).join('\n')}\n`;
    const res = await agent
      .post(`/api/lots/${f.lotId}/measurements/import`)
      .set('x-csrf-token', agent.csrf)
      .field('sessionId', String(sessionId))
      .field('mapping', JSON.stringify({ position: 'Pos', hfe: 'HFE', vbe: 'VBE_V' }))
      .field('units', JSON.stringify({ vbe: 'V', vceSat: 'mV', leakage: 'nA' }))
      .attach('file', Buffer.from(csv), 'tester.csv');
    expect(res.status).toBe(201);
    const s = (await agent.get(`/api/lots/${f.lotId}/screening`).expect(200)).body;
    expect(s).toMatchObject({ screened: 7, placed: 7, unplaced: 0 });
    expect(s.containers.map((c: { bin: { code: string }; quantity: number }) => [c.bin.code, c.quantity])).toEqual([
      ['A', 3],
      ['A', 1],
      ['B', 3],
    ]);
  });

  it('a screening session on a part type without a gain-bin scheme is refused with 409 naming mode', async () => {
    const f = await makeScreenLot(ctx.ds, { bins: null });
    const agent = await agentFor(ctx.app, f.inspector);
    const res = await agent.post(`/api/lots/${f.lotId}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: 'Bench tester S', ambientC: 25, mode: 'screen' });
    expect(res.status).toBe(409);
    expect(res.body.errors[0].field).toBe('mode');
    await agent.post(`/api/lots/${f.lotId}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: 'Bench tester S', ambientC: 25, mode: 'sample' }).expect(201);
  });
});
