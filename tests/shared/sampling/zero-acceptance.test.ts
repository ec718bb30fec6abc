import { describe, it, expect } from 'vitest';
import { binomialDistribution } from 'simple-statistics';
import {
  SamplingInputError,
  probabilityOfAcceptance,
  zeroAcceptancePlan,
  zeroAcceptanceSampleSize,
} from '../../../shared/domain/sampling/index.ts';
import { thrown } from './thrown.ts';

describe('zeroAcceptanceSampleSize, n = ⌈ln(1 − C)/ln(1 − p₁)⌉ (reference.md §1.7, derived)', () => {
  it.each([
    // reference.md §1.7: 299 for C = 95 %, p₁ = 1 %.
    { confidence: 0.95, p1: 0.01, n: 299 },
    // [derived] ln 0.10 / ln 0.90 = 21.85 → 22.
    { confidence: 0.9, p1: 0.1, n: 22 },
    // [derived] 0.5² = 0.25 exactly, so n = 2 and not 3 despite floating-point error.
    { confidence: 0.75, p1: 0.5, n: 2 },
  ])('C = $confidence, p₁ = $p1 → n = $n', ({ confidence, p1, n }) => {
    expect(zeroAcceptanceSampleSize(confidence, p1)).toBe(n);
  });

  it('n = 299 is the smallest sample whose Pa at p₁ = 1 % is at most 5 %', () => {
    // [derived] 0.99^299 = 0.04954 ≤ 0.05 < 0.99^298 = 0.05004.
    expect(probabilityOfAcceptance(299, 0, 0.01)).toBeLessThanOrEqual(0.05);
    expect(probabilityOfAcceptance(298, 0, 0.01)).toBeGreaterThan(0.05);
  });

  it.each([
    { confidence: 95, p1: 0.01, field: 'confidence' },
    { confidence: 0.95, p1: 0, field: 'p1' },
    { confidence: 1, p1: 0.01, field: 'confidence' },
  ])('C = $confidence, p₁ = $p1 is refused naming $field', ({ confidence, p1, field }) => {
    const error = thrown(() => zeroAcceptanceSampleSize(confidence, p1));
    expect(error).toBeInstanceOf(SamplingInputError);
    expect(error).toMatchObject({ field });
  });
});

describe('probabilityOfAcceptance (binomial)', () => {
  it('c = 0: Pa = (1 − p)ⁿ, n 299 at p 1 % → 0.049536', () => {
    // reference.md §1.7 [published formula]; 0.99^299 = 0.0495362566 [derived].
    expect(probabilityOfAcceptance(299, 0, 0.01)).toBeCloseTo(0.0495362566, 9);
  });

  it('n 2, c 1, p 0.5 → 0.75 (hand-computed: 1 − 0.5²)', () => {
    expect(probabilityOfAcceptance(2, 1, 0.5)).toBeCloseTo(0.75, 12);
  });

  // Independent reference: simple-statistics binomialDistribution, summed to c.
  it.each([
    { n: 80, c: 2, p: 0.01 },
    { n: 125, c: 7, p: 0.05 },
    { n: 3150, c: 18, p: 0.01 },
    { n: 13, c: 1, p: 0.2 },
  ])('n $n, c $c, p $p agrees with the binomial CDF of simple-statistics', ({ n, c, p }) => {
    const pmf = binomialDistribution(n, p) ?? [];
    const expected = pmf.slice(0, c + 1).reduce((a, b) => a + b, 0);
    expect(pmf.length).toBeGreaterThan(c);
    expect(probabilityOfAcceptance(n, c, p)).toBeCloseTo(expected, 10);
  });

  it('p = 0 accepts surely, p = 1 never (c < n), c ≥ n always accepts', () => {
    expect(probabilityOfAcceptance(50, 0, 0)).toBe(1);
    expect(probabilityOfAcceptance(50, 3, 1)).toBe(0);
    expect(probabilityOfAcceptance(5, 5, 1)).toBe(1);
  });

  it.each([
    { n: 0, c: 0, p: 0.1, field: 'n' },
    { n: 10, c: -1, p: 0.1, field: 'c' },
    { n: 10, c: 0, p: 1.5, field: 'p' },
  ])('n $n, c $c, p $p is refused naming $field', ({ n, c, p, field }) => {
    expect(thrown(() => probabilityOfAcceptance(n, c, p))).toMatchObject({ field });
  });
});

describe('zeroAcceptancePlan (our simplification: normal-plan sample size, Ac 0 / Re 1)', () => {
  it('lot 1 000, level II, AQL 1.0 → n 80 (normal plan J, reference.md §1.3), Ac 0, Re 1', () => {
    const plan = zeroAcceptancePlan({ lotSize: 1_000, level: 'II', aql: 1.0 });
    expect(plan).toMatchObject({ codeLetter: 'J', sampleSize: 80, accept: 0, reject: 1, hundredPercent: false });
    expect(plan.source).toMatch(/simplification/);
    expect(plan.source).toMatch(/Squeglia/);
  });

  it('lot 10, level II, AQL 0.65 → all 10 parts, Ac 0 (normal plan n 20 ≥ lot, §1.3)', () => {
    expect(zeroAcceptancePlan({ lotSize: 10, level: 'II', aql: 0.65 })).toMatchObject({
      sampleSize: 10,
      accept: 0,
      reject: 1,
      hundredPercent: true,
    });
  });

  it('an unsupported AQL is refused naming aql', () => {
    expect(thrown(() => zeroAcceptancePlan({ lotSize: 1_000, level: 'II', aql: 3 }))).toMatchObject({ field: 'aql' });
  });
});
