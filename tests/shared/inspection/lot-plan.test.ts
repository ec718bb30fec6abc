import { describe, expect, it } from 'vitest';
import { planForLot } from '../../../shared/domain/inspection/index.ts';
import { SamplingInputError } from '../../../shared/domain/sampling/index.ts';

const base = { lotSize: 1000, level: 'II', aql: 1.0, hfeMin: 100, hfeMax: 300 };

describe('planForLot', () => {
  it('attribute, normal: lot 1 000, II, AQL 1.0 → J, n 80, Ac 2 / Re 3 (ISO 2859-1 Table 1 + Table 2-A)', () => {
    expect(planForLot({ ...base, method: 'attribute', severity: 'normal' })).toMatchObject({ codeLetter: 'J', sampleSize: 80, accept: 2, reject: 3, k: null });
  });

  it('zero acceptance keeps the sample size of the severity and sets Ac 0 / Re 1', () => {
    expect(planForLot({ ...base, method: 'zero-acceptance', severity: 'normal' })).toMatchObject({ sampleSize: 80, accept: 0, reject: 1 });
    // Tightened J at 1.0 → n 80 (ISO 2859-1 Table 2-B), still c = 0.
    const t = planForLot({ ...base, method: 'zero-acceptance', severity: 'tightened' });
    expect(t).toMatchObject({ sampleSize: 80, accept: 0, reject: 1 });
    expect(t.notes.join(' ')).toMatch(/simplification/);
  });

  it('variables: the largest Z1.9 letter with a stored k that fits the lot (F, n 10, k 1.72 at AQL 1.0, Z1.9 Table B-1 [from memory])', () => {
    expect(planForLot({ ...base, method: 'variables', severity: 'normal' })).toMatchObject({ codeLetter: 'F', sampleSize: 10, k: 1.72, accept: null });
    // A lot of 8 takes E (n 7): k 1.62 at AQL 1.0.
    expect(planForLot({ ...base, lotSize: 8, method: 'variables', severity: 'normal' })).toMatchObject({ codeLetter: 'E', sampleSize: 7, k: 1.62 });
  });

  it('variables on tightened says plainly that k is the normal one', () => {
    const p = planForLot({ ...base, method: 'variables', severity: 'tightened' });
    expect(p.notes.join(' ')).toMatch(/NOT reflected in k/);
  });

  it('variables without any hFE limit throws naming hfeMin; an unknown AQL throws naming aql', () => {
    expect(() => planForLot({ ...base, hfeMin: null, hfeMax: null, method: 'variables', severity: 'normal' })).toThrow(SamplingInputError);
    try {
      planForLot({ ...base, aql: 0.1, method: 'variables', severity: 'normal' });
    } catch (e) {
      expect((e as SamplingInputError).field).toBe('aql');
    }
  });
});
