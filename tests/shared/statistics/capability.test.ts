import { describe, it, expect } from 'vitest';
import { capability, StatisticsInputError } from '../../../shared/domain/statistics/index.ts';

describe('capability', () => {
  it('on the NIST/SEMATECH e-Handbook §6.1.6 example (USL 20, LSL 8, μ 16, σ 2) gives Cp 1.00 and Cpk 0.667', () => {
    // NIST/SEMATECH e-Handbook §6.1.6 example, reference.md §7 [from memory; arithmetic checked]:
    // Cp = 12/12 = 1.00; CPU = 4/6 = 0.667; CPL = 8/6 = 1.333; Cpk = 0.667.
    const c = capability({ mean: 16, sd: 2, lsl: 8, usl: 20 });
    expect(c.cp).toBeCloseTo(1.0, 10);
    expect(c.cpk).toBeCloseTo(0.667, 3);
    expect(c.cpu).toBeCloseTo(4 / 6, 10);
    expect(c.cpl).toBeCloseTo(8 / 6, 10);
  });

  // One-sided specifications; arithmetic of the reference.md §7 formulas [derived].
  const oneSided = [
    {
      situation: 'only a lower hFE limit (100), μ 160, σ 15',
      input: { mean: 160, sd: 15, lsl: 100, usl: null },
      expected: { cp: null, cpl: 60 / 45, cpu: null, cpk: 60 / 45 },
    },
    {
      situation: 'only an upper limit (700 mV), μ 655, σ 10, the lower limit absent',
      input: { mean: 655, sd: 10, usl: 700 },
      expected: { cp: null, cpl: null, cpu: 45 / 30, cpk: 1.5 },
    },
  ];
  it.each(oneSided)('with $situation, Cp is null and Cpk is the one index', ({ input, expected }) => {
    const c = capability(input);
    expect(c.cp).toBeNull();
    for (const key of ['cpl', 'cpu'] as const) {
      const want = expected[key];
      if (want === null) expect(c[key], key).toBeNull();
      else expect(c[key], key).toBeCloseTo(want, 10);
    }
    expect(c.cpk).toBeCloseTo(expected.cpk, 10);
  });

  it('with the mean outside the limits, gives a negative Cpk', () => {
    // (USL − μ)/3σ = (20 − 23)/6 = −0.5 [derived].
    expect(capability({ mean: 23, sd: 2, lsl: 8, usl: 20 }).cpk).toBeCloseTo(-0.5, 10);
  });

  const bad = [
    { situation: 'no limit at all', input: { mean: 1, sd: 1 }, field: 'usl' },
    { situation: 'LSL above USL', input: { mean: 1, sd: 1, lsl: 5, usl: 2 }, field: 'usl' },
    { situation: 'sd 0', input: { mean: 1, sd: 0, lsl: 0 }, field: 'sd' },
    { situation: 'a NaN mean', input: { mean: Number.NaN, sd: 1, lsl: 0 }, field: 'mean' },
  ];
  it.each(bad)('with $situation, throws naming $field', ({ input, field }) => {
    expect(() => capability(input)).toThrow(StatisticsInputError);
    expect(() => capability(input)).toThrowError(expect.objectContaining({ field }));
  });
});
