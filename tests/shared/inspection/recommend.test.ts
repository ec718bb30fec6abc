import { describe, expect, it } from 'vitest';
import { planForLot, recommend } from '../../../shared/domain/inspection/index.ts';

const attr = planForLot({ method: 'attribute', lotSize: 1000, level: 'II', aql: 1.0, severity: 'normal', hfeMin: 100, hfeMax: 300 });
const reduced = planForLot({ method: 'attribute', lotSize: 1000, level: 'II', aql: 1.0, severity: 'reduced', hfeMin: 100, hfeMax: 300 });
const common = { discontinued: false, hfeMin: 100, hfeMax: 300 };

describe('recommend', () => {
  it('with fewer parts measured than the sample, is incomplete and counts what is missing', () => {
    const r = recommend({ ...common, plan: attr, measured: 50, defects: 0 });
    expect(r.decision).toBe('incomplete');
    expect(r.reason).toMatch(/30 still to measure/);
  });

  it('J, n 80, Ac 2 / Re 3: d = 2 accepts, d = 3 rejects (ISO 2859-1 clause 11)', () => {
    expect(recommend({ ...common, plan: attr, measured: 80, defects: 2 }).decision).toBe('accept');
    expect(recommend({ ...common, plan: attr, measured: 80, defects: 3 }).decision).toBe('reject');
  });

  it('reduced J, n 32, Ac 1 / Re 3: d = 2 accepts and reinstates normal (Z1.4 Table II-C convention)', () => {
    const r = recommend({ ...common, plan: reduced, measured: 32, defects: 2 });
    expect(r.decision).toBe('accept');
    expect(r.reason).toMatch(/reinstate normal/);
  });

  it('while acceptance is discontinued, an accept becomes blocked; a reject stays a reject', () => {
    expect(recommend({ ...common, discontinued: true, plan: attr, measured: 80, defects: 0 }).decision).toBe('blocked');
    expect(recommend({ ...common, discontinued: true, plan: attr, measured: 80, defects: 5 }).decision).toBe('reject');
  });

  it('variables: accepts when Q_L and Q_U are both ≥ k', () => {
    const plan = planForLot({ method: 'variables', lotSize: 500, level: 'II', aql: 1.0, severity: 'normal', hfeMin: 100, hfeMax: 300 });
    // mean 200, s ≈ 3.16 → Q_L = Q_U ≈ 31.6 ≥ 1.72.
    const values = [196, 198, 200, 202, 204, 196, 198, 200, 202, 204];
    const r = recommend({ ...common, plan, measured: 10, defects: 0, hfeValues: values });
    expect(r.decision).toBe('accept');
    expect(r.sMethod?.k).toBe(1.72);
    const wide = recommend({ ...common, plan, measured: 10, defects: 0, hfeValues: [100, 300, 110, 290, 120, 280, 130, 270, 140, 260] });
    expect(wide.decision).toBe('reject');
  });

  it('without a plan, says why', () => {
    expect(recommend({ ...common, plan: null, planError: 'AQL 3 % is not in the tables', measured: 0, defects: 0 }).reason).toMatch(/AQL 3/);
  });
});
