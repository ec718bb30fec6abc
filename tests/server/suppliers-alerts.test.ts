import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/modules/audit/audit-entry.entity.ts';
import { DriftAlert, DriftCheck } from '../../server/modules/supplier-quality/drift-alert.entity.ts';
import { onLotDisposed } from '../../server/modules/supplier-quality/drift.service.ts';
import { normalSample } from '../shared/statistics/seeded-random.ts';
import { DAY, makeSupplierWorld, type SupplierWorld } from './suppliers-fixtures.ts';
import { signedIn, useTestApp } from './helpers.ts';

const ctx = useTestApp();
const round = (xs: number[]) => xs.map((x) => Math.round(x * 10) / 10);

/** Three accepted lots of 40 parts around hFE 180 (sd 18): the history (invented). */
async function withHistory(): Promise<SupplierWorld> {
  const w = await makeSupplierWorld(ctx.ds);
  for (const seed of [1, 2, 3]) await w.lot({ status: 'accepted', hfe: round(normalSample(seed, 40, 180, 18)), receivedAt: new Date(Date.now() - (50 - seed) * DAY) });
  return w;
}

describe('drift alerts', () => {
  it('a deliberately mixed lot (two populations) raises an alert with the figures when disposed', async () => {
    const w = await withHistory();
    const mixed = round([...normalSample(10, 30, 140, 8), ...normalSample(11, 30, 250, 9)]);
    const { lotId } = await w.lot({ status: 'accepted', hfe: mixed, receivedAt: new Date(Date.now() - 5 * DAY) });
    const out = await ctx.ds.transaction((m) => onLotDisposed(m, lotId));
    expect(out?.alertId).toBeGreaterThan(0);
    const alert = await ctx.ds.getRepository(DriftAlert).findOneByOrFail({ lotId });
    expect(alert.status).toBe('open');
    expect(alert.figures.n).toBe(60);
    expect(alert.figures.historyN).toBe(120);
    expect(alert.figures.historyLots).toBe(3);
    expect(alert.flags.map((f) => f.check)).toEqual(expect.arrayContaining(['ks', 'bimodal']));
    expect(alert.explanation).toMatch(/mixed date codes/i);
    expect(alert.explanation).not.toMatch(/\b(is|are) counterfeit\b/i);
    // Idempotent: a second call changes nothing.
    expect(await ctx.ds.transaction((m) => onLotDisposed(m, lotId))).toBeNull();
    expect(await ctx.ds.getRepository(DriftAlert).countBy({ lotId })).toBe(1);
  });

  it('a clean lot from the same population raises no alert, and the check is recorded', async () => {
    const w = await withHistory();
    const { lotId } = await w.lot({ status: 'accepted', hfe: round(normalSample(20, 60, 180, 18)), receivedAt: new Date(Date.now() - 5 * DAY) });
    expect(await ctx.ds.transaction((m) => onLotDisposed(m, lotId))).toEqual({ alertId: null });
    const check = await ctx.ds.getRepository(DriftCheck).findOneByOrFail({ lotId });
    expect(check.alert).toBe(false);
    expect(await ctx.ds.getRepository(DriftAlert).countBy({ lotId })).toBe(0);
  });

  it('GET /api/drift-alerts checks lots disposed without the hook (lazy, idempotent) and lists the alert', async () => {
    const w = await withHistory();
    const { lotId, code } = await w.lot({ status: 'rejected', hfe: round([...normalSample(30, 25, 135, 7), ...normalSample(31, 25, 255, 8)]), receivedAt: new Date(Date.now() - 2 * DAY) });
    const { agent } = await signedIn(ctx, 'buyer');
    const res = await agent.get(`/api/drift-alerts?status=open&supplierId=${w.supplier.id}`).expect(200);
    expect(res.body.items).toHaveLength(1);
    const a = res.body.items[0];
    expect(a.lot).toMatchObject({ id: lotId, code, status: 'rejected' });
    expect(a.supplier.id).toBe(w.supplier.id);
    expect(a.suggestedChecks.join(' ')).toMatch(/AS6081/);
    // Listing again finds nothing new to check.
    await agent.get(`/api/drift-alerts?supplierId=${w.supplier.id}`).expect(200);
    expect(await ctx.ds.getRepository(DriftAlert).countBy({ lotId })).toBe(1);
    // The history lots were checked too and raised nothing.
    expect(await ctx.ds.getRepository(DriftAlert).countBy({ supplierId: w.supplier.id })).toBe(1);
  });

  it('a buyer acknowledges an alert with a note (audited); a second acknowledgement answers 409', async () => {
    const w = await withHistory();
    const { lotId } = await w.lot({ status: 'accepted', hfe: round([...normalSample(40, 30, 140, 8), ...normalSample(41, 30, 250, 9)]) });
    const { alertId } = (await ctx.ds.transaction((m) => onLotDisposed(m, lotId)))!;
    const { agent, user } = await signedIn(ctx, 'buyer');
    const missing = await agent.post(`/api/drift-alerts/${alertId}/acknowledge`).set('x-csrf-token', agent.csrf).send({}).expect(400);
    expect(missing.body.errors[0].field).toBe('note');
    const res = await agent
      .post(`/api/drift-alerts/${alertId}/acknowledge`)
      .set('x-csrf-token', agent.csrf)
      .send({ note: 'Two date codes found on the reels (2611 and 2641); supplier asked to explain.' })
      .expect(200);
    expect(res.body.status).toBe('acknowledged');
    expect(res.body.acknowledged).toMatchObject({ by: user.name, note: expect.stringMatching(/Two date codes/) });
    const audit = await ctx.ds.getRepository(AuditEntry).findOneByOrFail({ action: 'drift-alert.acknowledge', entityId: String(alertId) });
    expect(audit.actorId).toBe(user.id);
    await agent.post(`/api/drift-alerts/${alertId}/acknowledge`).set('x-csrf-token', agent.csrf).send({ note: 'again please' }).expect(409);
    await agent.post('/api/drift-alerts/99999999/acknowledge').set('x-csrf-token', agent.csrf).send({ note: 'nothing here' }).expect(404);
  });
});
