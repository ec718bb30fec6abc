import { describe, expect, it } from 'vitest';
import { seedDemo } from '../../seed/demo.ts';
import { seedDemoHistory } from '../../seed/demo-history.ts';
import { signedIn, useTestApp } from './helpers.ts';

const ctx = useTestApp();

describe('demo supplier history', () => {
  it('loads past lots with readings, dispositions, the mixed-stock alert and one NCR once; a second run creates nothing', async () => {
    const logs: string[] = [];
    await seedDemo(ctx.ds, (l) => logs.push(l));
    expect(await seedDemoHistory(ctx.ds, (l) => logs.push(l)), logs.join('\n')).toBe(0);
    // Reproducible: the readings of the mixed Northmoor lot come from the fixed seed.
    const [mixed] = (await ctx.ds.query(
      `SELECT l.id, count(m.*)::int AS n, round(avg(m.hfe_25)::numeric, 1)::float8 AS mean FROM lot l JOIN measurement m ON m.lot_id = l.id
        WHERE l.supplier_lot = 'NES-N201-H07' GROUP BY l.id`,
    )) as { id: number; n: number; mean: number }[];
    expect(mixed.n).toBe(80);
    const alerts = (await ctx.ds.query(`SELECT flags FROM drift_alert WHERE lot_id = $1`, [mixed.id])) as { flags: { check: string }[] }[];
    expect(alerts[0].flags.map((f) => f.check)).toEqual(expect.arrayContaining(['ks', 'bimodal']));
    // Clean Kestrel lots raise nothing.
    const [{ n: kestrelAlerts }] = (await ctx.ds.query(
      `SELECT count(*)::int AS n FROM drift_alert a JOIN supplier s ON s.id = a.supplier_id WHERE s.code = 'KLC'`,
    )) as { n: number }[];
    expect(kestrelAlerts, JSON.stringify(await ctx.ds.query(`SELECT a.flags, l.supplier_lot FROM drift_alert a JOIN lot l ON l.id = a.lot_id JOIN supplier s ON s.id = a.supplier_id WHERE s.code = 'KLC'`))).toBe(0);
    const [{ n: ncrs }] = (await ctx.ds.query(`SELECT count(*)::int AS n FROM ncr n JOIN lot l ON l.id = n.lot_id WHERE l.supplier_lot = 'BPX-N201-H02'`)) as { n: number }[];
    expect(ncrs).toBe(1);
    // Dispositions are signed by the demo quality engineer.
    const signers = (await ctx.ds.query(
      `SELECT DISTINCT u.email FROM disposition d JOIN lot l ON l.id = d.lot_id JOIN app_user u ON u.id = d.signed_by WHERE l.supplier_lot LIKE '%-H0%'`,
    )) as { email: string }[];
    expect(signers).toEqual([{ email: 'quality@harrowpoint.test' }]);

    // The buyer sees the history on the scorecards.
    const { agent } = await signedIn(ctx, 'buyer');
    const res = await agent.get('/api/scorecards?search=KLC').expect(200);
    // Other areas' demo data may add lots of their own (e.g. screening lots still in inspection).
    expect(res.body.items[0]).toMatchObject({ supplierCode: 'KLC', accepted: 12, rejected: 0, severity: 'normal' });
    expect(res.body.items[0].lotsReceived).toBeGreaterThanOrEqual(12);
  });
});
