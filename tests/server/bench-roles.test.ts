import { describe, expect, it } from 'vitest';
import type { Response } from 'supertest';
import { ROLES, type Role } from '../../shared/api/roles.ts';
import { SwitchingStateRow } from '../../server/modules/sampling/switching-state.entity.ts';
import { DEFAULT_MAPPING, DEFAULT_UNITS, makeBenchLot, testerCsv, type BenchFixture } from './bench-fixtures.ts';
import { signedIn, useTestApp, type Agent } from './helpers.ts';

const ctx = useTestApp();

interface Setup extends BenchFixture {
  sessionId: number;
  measurementId: string;
}

/** A lot with an open session, one reading, a proposed disposition, and its supplier/part discontinued. */
async function setup(): Promise<Setup> {
  const f = await makeBenchLot(ctx.ds, { quantity: 10 });
  const { agent } = await signedIn(ctx, 'inspector');
  const s = await agent.post(`/api/lots/${f.lot.id}/sessions`).set('x-csrf-token', agent.csrf).send({ instrument: 'Tester', ambientC: 25, mode: 'sample' }).expect(201);
  const m = await agent.post(`/api/lots/${f.lot.id}/measurements`).set('x-csrf-token', agent.csrf).send({ sessionId: s.body.id, position: 1, hfe: 150, vbe: 650, vbeUnit: 'mV' }).expect(201);
  await agent.post(`/api/lots/${f.lot.id}/disposition`).set('x-csrf-token', agent.csrf).send({ decision: 'reject', reason: 'set-up proposal' }).expect(200);
  await ctx.ds.getRepository(SwitchingStateRow).save({
    supplierId: f.supplier.id,
    partTypeId: f.partType.id,
    state: { severity: 'discontinued', recent: [], consecutiveAcceptedTightened: 0, rejectedInTightened: 0, switchingScore: 0 },
    reason: 'set-up: discontinued',
    reducedApproved: false,
    productionSteady: true,
    updatedAt: new Date(),
  });
  return { ...f, sessionId: s.body.id, measurementId: m.body.id };
}

async function snapshot(f: Setup) {
  const [row] = (await ctx.ds.query(
    `SELECT (SELECT count(*)::int FROM measurement WHERE lot_id = $1) AS measurements,
            (SELECT count(*)::int FROM measurement_session WHERE lot_id = $1) AS sessions,
            (SELECT count(*)::int FROM measurement_session WHERE lot_id = $1 AND closed_at IS NOT NULL) AS closed,
            (SELECT coalesce(proposal_reason, '') || coalesce(decision, '') FROM disposition WHERE lot_id = $1) AS disposition,
            (SELECT state->>'severity' || reduced_approved::text FROM switching_state WHERE supplier_id = $2 AND part_type_id = $3) AS switching,
            (SELECT count(*)::int FROM audit_entry WHERE entity_id = $1::text) AS audits`,
    [f.lot.id, f.supplier.id, f.partType.id],
  )) as unknown[];
  return row;
}

interface WriteRoute {
  name: string;
  allowed: Role[];
  ok: number;
  send: (agent: Agent, f: Setup) => Promise<Response>;
}

const INSPECTING: Role[] = ['inspector', 'quality'];
const QUALITY: Role[] = ['quality'];

const WRITE_ROUTES: WriteRoute[] = [
  {
    name: 'POST /api/lots/:id/sessions (start a session)',
    allowed: INSPECTING,
    ok: 201,
    send: (a, f) => a.post(`/api/lots/${f.lot.id}/sessions`).set('x-csrf-token', a.csrf).send({ instrument: 'Tester', ambientC: 25, mode: 'sample' }),
  },
  {
    name: 'POST /api/lots/:id/sessions/:sessionId/close',
    allowed: INSPECTING,
    ok: 200,
    send: (a, f) => a.post(`/api/lots/${f.lot.id}/sessions/${f.sessionId}/close`).set('x-csrf-token', a.csrf).send({}),
  },
  {
    name: 'POST /api/lots/:id/measurements (record a reading)',
    allowed: INSPECTING,
    ok: 201,
    send: (a, f) => a.post(`/api/lots/${f.lot.id}/measurements`).set('x-csrf-token', a.csrf).send({ sessionId: f.sessionId, position: 2, hfe: 150, vbe: 650, vbeUnit: 'mV' }),
  },
  {
    name: 'POST /api/lots/:id/measurements/:measurementId/corrections',
    allowed: INSPECTING,
    ok: 201,
    send: (a, f) =>
      a.post(`/api/lots/${f.lot.id}/measurements/${f.measurementId}/corrections`).set('x-csrf-token', a.csrf).send({ sessionId: f.sessionId, hfe: 151, vbe: 650, vbeUnit: 'mV', reason: 'misread' }),
  },
  {
    name: 'POST /api/lots/:id/measurements/import (tester CSV)',
    allowed: INSPECTING,
    ok: 201,
    send: (a, f) =>
      a
        .post(`/api/lots/${f.lot.id}/measurements/import`)
        .set('x-csrf-token', a.csrf)
        .field('sessionId', String(f.sessionId))
        .field('mapping', JSON.stringify(DEFAULT_MAPPING))
        .field('units', JSON.stringify(DEFAULT_UNITS))
        .attach('file', Buffer.from(testerCsv([[5, 150, 0.65]])), 't.csv'),
  },
  {
    name: 'POST /api/lots/:id/disposition (propose)',
    allowed: INSPECTING,
    ok: 200,
    send: (a, f) => a.post(`/api/lots/${f.lot.id}/disposition`).set('x-csrf-token', a.csrf).send({ decision: 'mrb', mrbAction: 'screen-100', reason: 'screen the lot' }),
  },
  {
    name: 'POST /api/lots/:id/disposition/sign',
    allowed: QUALITY,
    ok: 200,
    send: (a, f) => a.post(`/api/lots/${f.lot.id}/disposition/sign`).set('x-csrf-token', a.csrf).send({ decision: 'reject', reason: 'out of limits' }),
  },
  {
    name: 'POST /api/switching/:supplierId/:partTypeId (corrective action)',
    allowed: QUALITY,
    ok: 200,
    send: (a, f) => a.post(`/api/switching/${f.supplier.id}/${f.partType.id}`).set('x-csrf-token', a.csrf).send({ note: '8D report verified' }),
  },
  {
    name: 'PATCH /api/switching/:supplierId/:partTypeId (settings)',
    allowed: QUALITY,
    ok: 200,
    send: (a, f) => a.patch(`/api/switching/${f.supplier.id}/${f.partType.id}`).set('x-csrf-token', a.csrf).send({ reducedApproved: true }),
  },
];

describe.each(WRITE_ROUTES)('$name', (route) => {
  it.each(ROLES.map((r) => [r]))('as %s: allowed only for the roles that own it; a refused call changes nothing', async (role) => {
    const f = await setup();
    const { agent } = await signedIn(ctx, role as Role);
    const before = await snapshot(f);
    const res = await route.send(agent, f);
    if (route.allowed.includes(role as Role)) {
      expect(res.status, JSON.stringify(res.body)).toBe(route.ok);
      expect(await snapshot(f)).not.toEqual(before);
    } else {
      expect(res.status).toBe(403);
      expect(res.body.detail).toMatch(/needs the role/);
      expect(await snapshot(f)).toEqual(before);
    }
  });
});

describe('reads', () => {
  it.each(ROLES.map((r) => [r]))('as %s: the plan, summary, readings, disposition, CSV and report can be read', async (role) => {
    const f = await setup();
    const { agent } = await signedIn(ctx, role as Role);
    for (const url of ['plan', 'summary', 'measurements', 'sessions', 'disposition', 'measurements.csv', 'report.pdf']) {
      const res = await agent.get(`/api/lots/${f.lot.id}/${url}`);
      expect(res.status, url).toBe(200);
    }
  });

  it('signed out, every bench route answers 401', async () => {
    const f = await setup();
    const { agentFor } = await import('./helpers.ts');
    const anon = await agentFor(ctx.app);
    await anon.get(`/api/lots/${f.lot.id}/summary`).expect(401);
    await anon.post(`/api/lots/${f.lot.id}/measurements`).set('x-csrf-token', anon.csrf).send({}).expect(401);
  });
});
