import { describe, it, expect } from 'vitest';
import { histogram, MAX_RULE_BINS, StatisticsInputError } from '../../../shared/domain/statistics/index.ts';
import { sarleExample } from './seeded-random.ts';

// Data set: the reference.md §7 bimodality example, n = 100 on the values 1…11 (min 1, max 11).
// Expected bins derived by hand from the reference.md §7 rules; the counts were cross-checked with
// NumPy 2.4 numpy.histogram on the same edges.
const data = sarleExample();

describe('histogram with a bin-width rule', () => {
  const cases = [
    {
      rule: 'sturges' as const,
      // k = ⌈log₂ 100⌉ + 1 = 7 + 1 = 8; width 10/8 = 1.25.
      edges: [1, 2.25, 3.5, 4.75, 6, 7.25, 8.5, 9.75, 11],
      counts: [8, 5, 10, 17, 37, 10, 5, 8],
    },
    {
      rule: 'scott' as const,
      // s = 2.27858 (n − 1 divisor); h = 3.49·2.27858·100^(−1/3) = 1.71326; k = ⌈10/1.71326⌉ = 6.
      edges: [1, 1 + 10 / 6, 1 + 20 / 6, 6, 1 + 40 / 6, 1 + 50 / 6, 11],
      counts: [8, 15, 17, 37, 15, 8],
    },
    {
      rule: 'freedman-diaconis' as const,
      // R-7 quartiles 5 and 7, IQR 2; h = 2·2·100^(−1/3) = 0.86177; k = ⌈11.60⌉ = 12; width 10/12.
      edges: Array.from({ length: 13 }, (_, i) => 1 + (10 * i) / 12),
      counts: [3, 5, 5, 10, 17, 0, 20, 17, 10, 5, 5, 3],
    },
  ];
  it.each(cases)('by $rule on the §7 example gives the expected edges and counts', ({ rule, edges, counts }) => {
    const h = histogram(data, { rule });
    expect(h.rule).toBe(rule);
    expect(h.edges).toHaveLength(edges.length);
    h.edges.forEach((e, i) => expect(e).toBeCloseTo(edges[i] as number, 12));
    expect(h.counts).toEqual(counts);
    expect(h.below + h.above).toBe(0);
  });

  it('puts the maximum in the last, closed bin', () => {
    const h = histogram([0, 1, 2, 3, 4, 5, 6, 7], { rule: 'sturges' });
    // k = ⌈log₂ 8⌉ + 1 = 4; bins of width 7/4; 7 lands in the last bin [5.25, 7].
    expect(h.counts).toEqual([2, 2, 2, 2]);
  });

  it('when every value is equal, gives one bin of width 1 centred on the value', () => {
    const h = histogram([150, 150, 150], { rule: 'scott' });
    expect(h.edges).toEqual([149.5, 150.5]);
    expect(h.counts).toEqual([3]);
  });

  it('when the IQR is 0, Freedman–Diaconis falls back to Sturges and says so', () => {
    // 10 equal values and two outliers: quartiles both 100.
    const values = [...Array.from({ length: 10 }, () => 100), 90, 130];
    const h = histogram(values, { rule: 'freedman-diaconis' });
    expect(h.rule).toBe('sturges');
    expect(h.counts).toHaveLength(Math.ceil(Math.log2(12)) + 1);
  });

  it('caps a rule-derived bin count for a far outlier', () => {
    const values = [...Array.from({ length: 200 }, (_, i) => 100 + (i % 20)), 1e9];
    const h = histogram(values, { rule: 'freedman-diaconis' });
    expect(h.counts).toHaveLength(MAX_RULE_BINS);
    expect(h.counts.reduce((a, b) => a + b, 0)).toBe(201);
  });
});

describe('histogram with explicit edges', () => {
  it('counts [eᵢ, eᵢ₊₁) with the last bin closed, and values outside as below and above', () => {
    const h = histogram([99, 100, 149.9, 150, 200, 250, 250.1, 300], { edges: [100, 150, 200, 250] });
    expect(h).toEqual({ edges: [100, 150, 200, 250], counts: [2, 1, 2], below: 1, above: 2, rule: 'edges' });
  });

  const bad = [
    { situation: 'one edge', edges: [1] },
    { situation: 'decreasing edges', edges: [1, 3, 2] },
    { situation: 'a repeated edge', edges: [1, 2, 2] },
    { situation: 'a NaN edge', edges: [1, Number.NaN] },
  ];
  it.each(bad)('with $situation, throws naming edges', ({ edges }) => {
    expect(() => histogram([1, 2], { edges })).toThrowError(expect.objectContaining({ field: 'edges' }));
  });

  it('when the sample is empty, throws', () => {
    expect(() => histogram([], { rule: 'sturges' })).toThrow(StatisticsInputError);
  });
});
