import { describe, it, expect } from 'vitest';
import { sampleStandardDeviation } from 'simple-statistics';
import {
  S_METHOD_K_SOURCE,
  SamplingInputError,
  Z19_SAMPLE_SIZES,
  sMethodDecision,
  sMethodK,
} from '../../../shared/domain/sampling/index.ts';
import { thrown } from './thrown.ts';

// Hand-computed data set: mean 120, squared deviations 400+100+0+100+400 = 1000, s² = 1000/4 = 250,
// s = √250 = 15.8114; with L = 95, Q_L = 25/√250 = 1.5811; with U = 150, Q_U = 30/√250 = 1.8974.
const VALUES = [100, 110, 120, 130, 140];

describe('sMethodDecision (ISO 3951-1 / ANSI/ASQ Z1.9 s-method, reference.md §2)', () => {
  it('computes n, mean, s (n − 1) and Q_L for the hand-computed set', () => {
    const result = sMethodDecision({ values: VALUES, lower: 95, k: 1.53 });
    expect(result.n).toBe(5);
    expect(result.mean).toBe(120);
    expect(result.sd).toBeCloseTo(15.8113883, 6);
    expect(result.sd).toBeCloseTo(sampleStandardDeviation(VALUES), 12); // independent reference
    expect(result.qL).toBeCloseTo(1.5811388, 6);
    expect(result.qU).toBeUndefined();
  });

  it('Q_L 1.581 ≥ k 1.53 (letter D, AQL 1.0) → accepted', () => {
    // k from Z1.9 Table B-1 [from memory], reference.md §2.
    const { k } = sMethodK('D', 1.0);
    const result = sMethodDecision({ values: VALUES, lower: 95, k });
    expect(result.accept).toBe(true);
    expect(result.reasons).toEqual(['Q_L = 1.581 ≥ k = 1.53: lower limit met']);
  });

  it('Q_L 1.581 < k 1.65 (letter D, AQL 0.65) → not accepted', () => {
    // k from Z1.9 Table B-1 [from memory], reference.md §2.
    const { k } = sMethodK('D', 0.65);
    expect(sMethodDecision({ values: VALUES, lower: 95, k }).accept).toBe(false);
  });

  it('with both limits each Q must reach k: Q_U 1.897 passes, Q_L 1.581 fails at k 1.65 → not accepted', () => {
    const result = sMethodDecision({ values: VALUES, lower: 95, upper: 150, k: 1.65 });
    expect(result.qU).toBeCloseTo(1.8973666, 6);
    expect(result.accept).toBe(false);
    expect(result.reasons).toHaveLength(2);
    expect(result.reasons[1]).toMatch(/upper limit met/);
  });

  it('an upper limit alone: Q_U 1.897 ≥ k 1.84 → accepted', () => {
    expect(sMethodDecision({ values: VALUES, upper: 150, k: 1.84 }).accept).toBe(true);
  });

  it('identical values (s = 0) inside the limit give Q = ∞ and accept', () => {
    const result = sMethodDecision({ values: [5, 5, 5], lower: 4, k: 1.5 });
    expect(result.qL).toBe(Number.POSITIVE_INFINITY);
    expect(result.accept).toBe(true);
  });

  it.each([
    { input: { values: [1], lower: 0, k: 1 }, field: 'values' },
    { input: { values: [1, Number.NaN], lower: 0, k: 1 }, field: 'values' },
    { input: { values: [1, 2], k: 1 }, field: 'lower' },
    { input: { values: [1, 2], lower: 3, upper: 2, k: 1 }, field: 'upper' },
    { input: { values: [1, 2], lower: 0, k: 0 }, field: 'k' },
  ])('invalid input is refused naming $field', ({ input, field }) => {
    const error = thrown(() => sMethodDecision(input));
    expect(error).toBeInstanceOf(SamplingInputError);
    expect(error).toMatchObject({ field });
  });
});

describe('sMethodK (Z1.9 Table B-1, normal, from memory — reference.md §2)', () => {
  it.each([
    { letter: 'D', aql: 0.65, k: 1.65, n: 5 },
    { letter: 'D', aql: 6.5, k: 0.874, n: 5 },
    { letter: 'E', aql: 2.5, k: 1.33, n: 7 },
    { letter: 'E', aql: 1.5, k: 1.5, n: 7 },
    { letter: 'F', aql: 4.0, k: 1.23, n: 10 },
    { letter: 'F', aql: 6.5, k: 1.03, n: 10 },
  ])('letter $letter, AQL $aql → k $k, n $n', ({ letter, aql, k, n }) => {
    expect(sMethodK(letter, aql)).toEqual({ k, n, source: S_METHOD_K_SOURCE });
  });

  it('the source says the values are from memory', () => {
    expect(S_METHOD_K_SOURCE).toMatch(/from memory/);
  });

  it.each([
    { letter: 'G', aql: 1.0, field: 'letter' },
    { letter: 'toString', aql: 1.0, field: 'letter' },
    { letter: 'D', aql: 0.4, field: 'aql' },
  ])('letter $letter, AQL $aql is not in the table → refused naming $field', ({ letter, aql, field }) => {
    expect(thrown(() => sMethodK(letter, aql))).toMatchObject({ field });
  });
});

describe('Z19_SAMPLE_SIZES (ANSI/ASQ Z1.9 s-method, reference.md §2 [published])', () => {
  it('match the published letter → n list', () => {
    expect(Z19_SAMPLE_SIZES).toEqual({
      B: 3, C: 4, D: 5, E: 7, F: 10, G: 15, H: 20, I: 25, J: 35, K: 50, L: 75, M: 100, N: 150, P: 200,
    });
  });
});
