import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { makeBenchLot, type BenchFixture } from './bench-fixtures.ts';
import { signedIn, useTestApp } from './helpers.ts';

const ctx = useTestApp();

/**
 * Switching scenarios of ISO 2859-1 clause 9 (reference.md §1.6), driven through the API: each lot
 * is proposed by an inspector and signed by a quality engineer; the signature advances the state.
 */
async function scenario() {
  const first = await makeBenchLot(ctx.ds, { quantity: 1000 });
  const { agent: inspector } = await signedIn(ctx, 'inspector');
  const { agent: qe } = await signedIn(ctx, 'quality');
  const dispose = async (decision: 'accept' | 'reject', lot?: BenchFixture) => {
    const f = lot ?? (await makeBenchLot(ctx.ds, { quantity: 1000, supplier: first.supplier, partType: first.partType }));
    await inspector.post(`/api/lots/${f.lot.id}/disposition`).set('x-csrf-token', inspector.csrf).send({ decision, reason: `scenario: ${decision}` }).expect(200);
    await qe.post(`/api/lots/${f.lot.id}/disposition/sign`).set('x-csrf-token', qe.csrf).send({ decision, reason: `scenario: ${decision}` }).expect(200);
    return f;
  };
  const state = async () => (await qe.get(`/api/switching/${first.supplier.id}/${first.partType.id}`).expect(200)).body;
  const nextPlan = async () => {
    const f = await makeBenchLot(ctx.ds, { quantity: 1000, supplier: first.supplier, partType: first.partType });
    return (await inspector.get(`/api/lots/${f.lot.id}/plan`).expect(200)).body;
  };
  return { first, inspector, qe, dispose, state, nextPlan };
}

async function toTightened(s: Awaited<ReturnType<typeof scenario>>) {
  await s.dispose('reject', s.first);
  await s.dispose('accept');
  await s.dispose('reject');
}

describe('switching rules through the API (ISO 2859-1 clause 9)', () => {
  it('starts on normal; 2 of 5 or fewer consecutive lots not accepted → tightened, and the next plan is tightened', async () => {
    const s = await scenario();
    expect((await s.state()).severity).toBe('normal');
    await toTightened(s);
    const st = await s.state();
    expect(st.severity).toBe('tightened');
    expect(st.reason).toMatch(/2 of the last 3 lots were not accepted/);
    const plan = await s.nextPlan();
    // Lot 1 000, II, AQL 1.0 on tightened: J → 80, Ac 1 / Re 2 (ISO 2859-1 Table 2-B, reference.md §1.4).
    expect(plan.plan).toMatchObject({ severity: 'tightened', sampleSize: 80, accept: 1, reject: 2 });
    expect(plan.switching.reason).toMatch(/→ tightened/);
  });

  it('tightened → normal after 5 consecutive accepted lots', async () => {
    const s = await scenario();
    await toTightened(s);
    for (let i = 0; i < 4; i++) await s.dispose('accept');
    expect((await s.state())).toMatchObject({ severity: 'tightened', consecutiveAcceptedTightened: 4 });
    await s.dispose('accept');
    const st = await s.state();
    expect(st.severity).toBe('normal');
    expect(st.reason).toMatch(/5 consecutive lots accepted on tightened inspection → normal/);
  });

  it('5 lots not accepted on tightened → acceptance discontinued: accept is refused, a reject does not advance, and a quality engineer lifts it with the corrective action', async () => {
    const s = await scenario();
    await toTightened(s);
    for (let i = 0; i < 5; i++) await s.dispose('reject');
    const st = await s.state();
    expect(st).toMatchObject({ severity: 'discontinued', acceptanceBlocked: true });
    const blocked = await makeBenchLot(ctx.ds, { quantity: 1000, supplier: s.first.supplier, partType: s.first.partType });
    const plan = (await s.inspector.get(`/api/lots/${blocked.lot.id}/plan`).expect(200)).body;
    expect(plan.plan.notes[0]).toMatch(/cannot be accepted/);
    const refused = await s.inspector.post(`/api/lots/${blocked.lot.id}/disposition`).set('x-csrf-token', s.inspector.csrf).send({ decision: 'accept', reason: 'looks fine' }).expect(409);
    expect(refused.body.errors[0].field).toBe('decision');
    await s.dispose('reject', blocked);
    expect((await s.state()).severity).toBe('discontinued');

    await s.inspector.post(`/api/switching/${s.first.supplier.id}/${s.first.partType.id}`).set('x-csrf-token', s.inspector.csrf).send({ note: '8D report received' }).expect(403);
    const lifted = await s.qe.post(`/api/switching/${s.first.supplier.id}/${s.first.partType.id}`).set('x-csrf-token', s.qe.csrf).send({ note: '8D report 2025-114 received and verified' }).expect(200);
    expect(lifted.body).toMatchObject({ severity: 'tightened', acceptanceBlocked: false });
    expect(lifted.body.reason).toMatch(/corrective action recorded → tightened: 8D report/);
    const audit = await ctx.ds.getRepository(AuditEntry).findOneByOrFail({ entityType: 'switching', entityId: `${s.first.supplier.id}:${s.first.partType.id}`, action: 'switching.corrective-action' });
    expect(audit.note).toMatch(/8D report/);
    await s.dispose('accept');
    expect((await s.state())).toMatchObject({ severity: 'tightened', consecutiveAcceptedTightened: 1 });
  });

  it('recording a corrective action when acceptance is not discontinued answers 409', async () => {
    const s = await scenario();
    await s.qe.post(`/api/switching/${s.first.supplier.id}/${s.first.partType.id}`).set('x-csrf-token', s.qe.csrf).send({ note: 'nothing to fix' }).expect(409);
  });

  it('normal → reduced only with a switching score ≥ 30, steady production and approval', async () => {
    const s = await scenario();
    // Lot 1 000, II, AQL 1.0 normal: J, Ac 2; one step tighter (0.65) J has Ac 1 → with 0 defects
    // each accepted lot scores +3 (ISO 2859-1:1999 switching score, reference.md §1.6 [from memory]).
    for (let i = 0; i < 10; i++) await s.dispose('accept');
    let st = await s.state();
    expect(st).toMatchObject({ severity: 'normal', switchingScore: 30 });
    expect(st.reason).toMatch(/reduced inspection is not approved/);
    await s.qe.patch(`/api/switching/${s.first.supplier.id}/${s.first.partType.id}`).set('x-csrf-token', s.qe.csrf).send({ reducedApproved: true }).expect(200);
    await s.dispose('accept');
    st = await s.state();
    expect(st.severity).toBe('reduced');
    const plan = await s.nextPlan();
    // Reduced J at AQL 1.0: n 32, Ac 1 / Re 3 (Z1.4 Table II-C convention).
    expect(plan.plan).toMatchObject({ severity: 'reduced', sampleSize: 32, accept: 1, reject: 3 });
    await s.dispose('reject');
    expect((await s.state()).severity).toBe('normal');
  });
});
