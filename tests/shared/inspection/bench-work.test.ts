import { describe, expect, it } from 'vitest';
import { benchWorkFor, modeAllowed, type BenchWork } from '../../../shared/domain/inspection/index.ts';

// Product rule (docs/bins.md, "Screening after a signed disposition").
const CASES: [status: string, mrbAction: string | null, work: BenchWork][] = [
  ['received', null, 'open'],
  ['inspecting', null, 'open'],
  ['awaiting-signature', null, 'open'],
  ['accepted', null, 'closed'],
  ['rejected', null, 'closed'],
  ['mrb', 'use-as-is', 'closed'],
  ['mrb', 'return-to-supplier', 'closed'],
  ['mrb', 'scrap', 'closed'],
  ['mrb', null, 'closed'],
  ['mrb', 'screen-100', 'screen-only'],
  // A stray action on a lot that is not MRB changes nothing.
  ['accepted', 'screen-100', 'closed'],
];

describe('benchWorkFor', () => {
  it.each(CASES)('a lot %s with signed MRB action %s: %s', (status, action, work) => {
    expect(benchWorkFor(status, action)).toBe(work);
  });
});

describe('modeAllowed', () => {
  it.each([
    ['open', 'sample', true],
    ['open', 'screen', true],
    ['screen-only', 'screen', true],
    ['screen-only', 'sample', false],
    ['closed', 'screen', false],
    ['closed', 'sample', false],
  ] as const)('%s lot, %s session: %s', (work, mode, allowed) => {
    expect(modeAllowed(work, mode)).toBe(allowed);
  });
});
