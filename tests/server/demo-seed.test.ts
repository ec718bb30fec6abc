import { describe, expect, it } from 'vitest';
import { seedDemo } from '../../seed/demo.ts';
import { useTestApp } from './helpers.ts';

const ctx = useTestApp();

describe('demo scenario', () => {
  it('loads screened stock in gain-bin containers through the real services, and a second run creates nothing', async () => {
    await seedDemo(ctx.ds);
    const [{ n }] = await ctx.ds.query(
      `SELECT count(*)::int AS n FROM container_position cp JOIN container c ON c.id = cp.container_id JOIN lot l ON l.id = c.lot_id WHERE l.supplier_lot LIKE '%SCREEN-DEMO%'`,
    );
    expect(n).toBeGreaterThan(200);
    const [{ locations }] = await ctx.ds.query(
      `SELECT count(DISTINCT c.location)::int AS locations FROM container c JOIN lot l ON l.id = c.lot_id WHERE l.supplier_lot LIKE '%SCREEN-DEMO%'`,
    );
    expect(locations).toBeGreaterThan(1);
    const again = await seedDemo(ctx.ds);
    expect(again.created).toBe(0);
  });
});
