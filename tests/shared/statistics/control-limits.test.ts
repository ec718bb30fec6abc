import { describe, it, expect } from 'vitest';
import {
  INDIVIDUALS_FACTOR,
  MOVING_RANGE_D4,
  StatisticsInputError,
  xbarIndividualsLimits,
} from '../../../shared/domain/statistics/index.ts';

describe('xbarIndividualsLimits', () => {
  it('uses 2.66 = 3/d₂ with d₂ = 1.128 for moving ranges of two', () => {
    // d₂ = 1.128 and D₄ = 3.267 for n = 2: control-chart constant tables, e.g. NIST/SEMATECH
    // e-Handbook §6.3.2 (from memory).
    expect(INDIVIDUALS_FACTOR).toBeCloseTo(3 / 1.128, 2);
    expect(MOVING_RANGE_D4).toBe(3.267);
  });

  it('on lot means 10, 12, 11, 13, 12 gives centre 11.6, MR̄ 1.5, limits 11.6 ± 3.99', () => {
    // Derived: moving ranges 2, 1, 2, 1 → MR̄ 1.5; 2.66·1.5 = 3.99; 3.267·1.5 = 4.9005.
    const r = xbarIndividualsLimits([10, 12, 11, 13, 12]);
    expect(r.centre).toBeCloseTo(11.6, 12);
    expect(r.mrBar).toBeCloseTo(1.5, 12);
    expect(r.ucl).toBeCloseTo(15.59, 12);
    expect(r.lcl).toBeCloseTo(7.61, 12);
    expect(r.mrUcl).toBeCloseTo(4.9005, 12);
    expect(r.outside).toEqual([]);
  });

  it('when the last lot jumps, lists it as outside the limits', () => {
    // Derived: centre 12, MR̄ = 10/4 = 2.5, UCL = 12 + 6.65 = 18.65 < 20.
    const r = xbarIndividualsLimits([10, 10, 10, 10, 20]);
    expect(r.ucl).toBeCloseTo(18.65, 12);
    expect(r.outside).toEqual([4]);
  });

  it('with fewer than two lots, throws naming means', () => {
    expect(() => xbarIndividualsLimits([5])).toThrowError(expect.objectContaining({ field: 'means' }));
    expect(() => xbarIndividualsLimits([5, Number.NaN])).toThrow(StatisticsInputError);
  });
});
