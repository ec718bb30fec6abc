import { describe, it, expect } from 'vitest';
import {
  SamplingInputError,
  judgeAttributeLot,
  singleSamplingPlan,
  wouldAcceptOneStepTighter,
  type InspectionLevel,
  type Severity,
} from '../../../shared/domain/sampling/index.ts';
import { thrown } from './thrown.ts';

describe('singleSamplingPlan, normal inspection spot checks (reference.md §1.3, derived from Table 2-A)', () => {
  it.each([
    { lotSize: 1_000, aql: 1.0, codeLetter: 'J', planLetter: 'J', sampleSize: 80, accept: 2, reject: 3 },
    { lotSize: 100, aql: 1.0, codeLetter: 'F', planLetter: 'E', sampleSize: 13, accept: 0, reject: 1 },
    { lotSize: 50, aql: 4.0, codeLetter: 'D', planLetter: 'E', sampleSize: 13, accept: 1, reject: 2 },
    { lotSize: 2_000, aql: 2.5, codeLetter: 'K', planLetter: 'K', sampleSize: 125, accept: 7, reject: 8 },
    { lotSize: 20_000, aql: 0.25, codeLetter: 'M', planLetter: 'M', sampleSize: 315, accept: 2, reject: 3 },
  ])(
    'lot $lotSize, level II, AQL $aql → $codeLetter, plan $planLetter, n $sampleSize, $accept/$reject',
    ({ lotSize, aql, ...expected }) => {
      const plan = singleSamplingPlan({ lotSize, level: 'II', aql, severity: 'normal' });
      expect(plan).toMatchObject({ ...expected, hundredPercent: false });
      expect(plan.source).toContain('Table 2-A');
    },
  );
});

describe('singleSamplingPlan, tightened and reduced', () => {
  it('lot 1 000, level II, AQL 1.0 tightened → J, n 80, Ac 1, Re 2', () => {
    // reference.md §1.4, row J, column 1.0: 80:1/2.
    expect(singleSamplingPlan({ lotSize: 1_000, level: 'II', aql: 1.0, severity: 'tightened' })).toMatchObject({
      codeLetter: 'J',
      planLetter: 'J',
      sampleSize: 80,
      accept: 1,
      reject: 2,
      hundredPercent: false,
    });
  });

  it('lot 100, level II, AQL 4.0 tightened → F, n 20, Ac 1, Re 2', () => {
    // reference.md §1.4, row F, column 4.0: 20:1/2.
    expect(singleSamplingPlan({ lotSize: 100, level: 'II', aql: 4.0, severity: 'tightened' })).toMatchObject({
      codeLetter: 'F',
      sampleSize: 20,
      accept: 1,
      reject: 2,
    });
  });

  it('lot 1 000, level II, AQL 1.0 reduced → J, n 32, Ac 1, Re 3 (Z1.4 convention)', () => {
    // [derived] reference.md §1.3 (J, 1.0 → 2/3), §1.5 (2/3 ↔ 1/3), §1.2 (J reduced n 32).
    const plan = singleSamplingPlan({ lotSize: 1_000, level: 'II', aql: 1.0, severity: 'reduced' });
    expect(plan).toMatchObject({ codeLetter: 'J', planLetter: 'J', sampleSize: 32, accept: 1, reject: 3 });
    expect(plan.source).toContain('Z1.4');
  });

  it('lot 50, level II, AQL 4.0 reduced follows ↓ from D to E: n 5, Ac 0, Re 2', () => {
    // [derived] §1.3 (D, 4.0 ↓ → E 1/2), §1.5 (1/2 ↔ 0/2), §1.2 (E reduced n 5).
    expect(singleSamplingPlan({ lotSize: 50, level: 'II', aql: 4.0, severity: 'reduced' })).toMatchObject({
      codeLetter: 'D',
      planLetter: 'E',
      sampleSize: 5,
      accept: 0,
      reject: 2,
    });
  });

  it('special level S-2 on a lot of 5 000 at AQL 2.5 → D, ↑ to C: n 5, Ac 0, Re 1', () => {
    // §1.1 (3 201–10 000, S-2 → D); §1.3 (row D at 2.5 is ↑; row C at 2.5 is 0/1, n 5).
    const plan = singleSamplingPlan({ lotSize: 5_000, level: 'S-2', aql: 2.5, severity: 'normal' });
    expect(plan).toMatchObject({ codeLetter: 'D', planLetter: 'C', sampleSize: 5, accept: 0, reject: 1 });
  });
});

describe('singleSamplingPlan, 100 % inspection', () => {
  it('lot 10, level II, AQL 0.65: ↓ leads to n 20 ≥ 10, so all 10 parts are inspected with Ac 0, Re 1', () => {
    // §1.1 (9–15, II → B); §1.3 column 0.65: first plan below B is F 0/1, n 20; §1.2 note: 100 %.
    expect(singleSamplingPlan({ lotSize: 10, level: 'II', aql: 0.65, severity: 'normal' })).toMatchObject({
      codeLetter: 'B',
      planLetter: 'F',
      sampleSize: 10,
      accept: 0,
      reject: 1,
      hundredPercent: true,
    });
  });

  it('a sample size equal to the lot size also counts as 100 % (lot 2, level I, AQL 6.5: n 2)', () => {
    // §1.1 (2–8, I → A); §1.3 (A, 6.5 → 0/1, n 2).
    expect(singleSamplingPlan({ lotSize: 2, level: 'I', aql: 6.5, severity: 'normal' })).toMatchObject({
      sampleSize: 2,
      hundredPercent: true,
    });
  });

  it('a sample one part smaller than the lot is not 100 % (lot 3, level II, AQL 6.5: n 2)', () => {
    // §1.1 (2–8, II → A); §1.3 (A, 6.5 → 0/1, n 2).
    expect(singleSamplingPlan({ lotSize: 3, level: 'II', aql: 6.5, severity: 'normal' })).toMatchObject({
      sampleSize: 2,
      hundredPercent: false,
    });
  });
});

describe('singleSamplingPlan, invalid input', () => {
  const valid = { lotSize: 1_000, level: 'II' as InspectionLevel, aql: 1.0, severity: 'normal' as Severity };
  it.each([
    { change: { lotSize: 1 }, field: 'lotSize' },
    { change: { lotSize: 12.5 }, field: 'lotSize' },
    { change: { level: 'IV' as InspectionLevel }, field: 'level' },
    { change: { aql: 0.3 }, field: 'aql' },
    { change: { aql: 10 }, field: 'aql' },
    { change: { severity: 'skip-lot' as Severity }, field: 'severity' },
  ])('$change is refused naming $field', ({ change, field }) => {
    const error = thrown(() => singleSamplingPlan({ ...valid, ...change }));
    expect(error).toBeInstanceOf(SamplingInputError);
    expect(error).toMatchObject({ field });
  });
});

describe('judgeAttributeLot (ISO 2859-1 clause 11; reduced gap per Z1.4, reference.md §1.5)', () => {
  it.each([
    { plan: { accept: 2, reject: 3 }, defects: 2, accepted: true, gapAccept: false },
    { plan: { accept: 2, reject: 3 }, defects: 3, accepted: false, gapAccept: false },
    { plan: { accept: 1, reject: 4 }, defects: 1, accepted: true, gapAccept: false },
    { plan: { accept: 1, reject: 4 }, defects: 3, accepted: true, gapAccept: true },
    { plan: { accept: 1, reject: 4 }, defects: 4, accepted: false, gapAccept: false },
  ])('Ac $plan.accept / Re $plan.reject with d = $defects → accepted $accepted, gap $gapAccept', ({ plan, defects, ...expected }) => {
    expect(judgeAttributeLot(plan, defects)).toEqual(expected);
  });

  it('a negative count is refused naming defects', () => {
    expect(thrown(() => judgeAttributeLot({ accept: 0, reject: 1 }, -1))).toMatchObject({ field: 'defects' });
  });
});

describe('wouldAcceptOneStepTighter', () => {
  // §1.3: J at 1.0 is 2/3, at 0.65 1/2.
  it('lot 1 000, II, AQL 1.0 with d = 1 would pass at 0.65 (Ac 1)', () => {
    const plan = singleSamplingPlan({ lotSize: 1_000, level: 'II', aql: 1.0, severity: 'normal' });
    expect(wouldAcceptOneStepTighter(plan, 1.0, 1)).toBe(true);
  });
  it('lot 1 000, II, AQL 1.0 with d = 2 would not pass at 0.65', () => {
    const plan = singleSamplingPlan({ lotSize: 1_000, level: 'II', aql: 1.0, severity: 'normal' });
    expect(wouldAcceptOneStepTighter(plan, 1.0, 2)).toBe(false);
  });
});
