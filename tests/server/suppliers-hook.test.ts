import { describe, expect, it } from 'vitest';
import { DriftAlert, DriftCheck } from '../../server/modules/supplier-quality/drift-alert.entity.ts';
import { normalSample } from '../shared/statistics/seeded-random.ts';
import { agentFor, useTestApp } from './helpers.ts';
import { DAY, makeSupplierWorld, uniq, type SupplierWorld } from './suppliers-fixtures.ts';

const ctx = useTestApp();
const round = (xs: number[]) => xs.map((x) => Math.round(x * 10) / 10);

/** A lot measured (sample session at 25 °C) and proposed for acceptance, waiting for the signature. */
async function awaitingSignature(w: SupplierWorld, hfe: number[]): Promise<number> {
  return ctx.ds.transaction(async (m) => {
    const [{ id: lotId }] = (await m.query(
      `INSERT INTO lot (code, supplier_id, part_type_id, quantity, supplier_lot, date_code, status, received_by) VALUES ($1, $2, $3, 1000, $4, '2641', 'awaiting-signature', $5) RETURNING id`,
      [`L-HOOK-${uniq()}`, w.supplier.id, w.partType.id, `SL-${uniq()}`, w.inspector.id],
    )) as { id: number }[];
    const [{ id: sessionId }] = (await m.query(`INSERT INTO measurement_session (lot_id, instrument, ambient_c, operator_id, mode) VALUES ($1, 'Tester', 25, $2, 'sample') RETURNING id`, [
      lotId,
      w.inspector.id,
    ])) as { id: number }[];
    await m.query(
      `INSERT INTO measurement (lot_id, session_id, position, hfe, vbe_mv, hfe_25, vbe_mv_25, created_by)
       SELECT $1, $2, t.p, t.h, 650, t.h, 650, $3 FROM unnest($4::int[], $5::float8[]) AS t(p, h)`,
      [lotId, sessionId, w.inspector.id, hfe.map((_, i) => i + 1), hfe],
    );
    await m.query(
      `INSERT INTO disposition (lot_id, recommended, recommendation, proposed_decision, proposed_by, proposal_reason) VALUES ($1, 'accept', '{}', 'accept', $2, 'All parts inside the limits.')`,
      [lotId, w.inspector.id],
    );
    return lotId;
  });
}

describe('the disposition hook', () => {
  it('signing a mixed lot raises the drift alert in the same transaction; signing a clean one records a clean check', async () => {
    const w = await makeSupplierWorld(ctx.ds);
    for (const seed of [1, 2, 3]) await w.lot({ status: 'accepted', hfe: round(normalSample(seed, 40, 180, 18)), receivedAt: new Date(Date.now() - (40 - seed) * DAY) });
    const qe = await agentFor(ctx.app, w.quality);
    const sign = (lotId: number) =>
      qe.post(`/api/lots/${lotId}/disposition/sign`).set('x-csrf-token', qe.csrf).send({ decision: 'accept', reason: 'All sampled parts inside the limits.' });

    const mixed = await awaitingSignature(w, round([...normalSample(50, 40, 140, 8), ...normalSample(51, 40, 250, 9)]));
    const res = await sign(mixed);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const alert = await ctx.ds.getRepository(DriftAlert).findOneByOrFail({ lotId: mixed });
    expect(alert.flags.map((f) => f.check)).toContain('bimodal');

    const clean = await awaitingSignature(w, round(normalSample(60, 80, 180, 18)));
    await sign(clean).expect(200);
    expect((await ctx.ds.getRepository(DriftCheck).findOneByOrFail({ lotId: clean })).alert).toBe(false);
    expect(await ctx.ds.getRepository(DriftAlert).countBy({ lotId: clean })).toBe(0);
  });
});
