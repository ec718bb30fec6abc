import { describe, it, expect } from 'vitest';
import {
  hfeSpreadPct,
  hfeWithinTolerance,
  setMismatch,
  vbeWithinTolerance,
} from '../../../shared/domain/matching/index.ts';

describe('hfeWithinTolerance', () => {
  // Definition stated to the user (issue 6): |h1 − h2| / min(h1, h2) ≤ t/100.
  const cases = [
    { situation: '100 and 105 at 5 % (exactly at the limit)', h1: 100, h2: 105, t: 5, inside: true },
    { situation: '100 and 105.01 at 5 %', h1: 100, h2: 105.01, t: 5, inside: false },
    { situation: '200.2 and 210.21 at 5 % (decimal readings exactly at the limit)', h1: 200.2, h2: 210.21, t: 5, inside: true },
    { situation: '95.3 and 100 at 5 % (4.93 % of the smaller)', h1: 95.3, h2: 100, t: 5, inside: true },
    { situation: '95 and 100 at 5 % (5.26 % of the smaller, although 5 % of the larger)', h1: 95, h2: 100, t: 5, inside: false },
    { situation: 'equal readings at 0 %', h1: 250, h2: 250, t: 0, inside: true },
    { situation: '250 and 250.001 at 0 %', h1: 250, h2: 250.001, t: 0, inside: false },
  ];
  it.each(cases)('$situation: inside = $inside', ({ h1, h2, t, inside }) => {
    expect(hfeWithinTolerance(h1, h2, t)).toBe(inside);
    expect(hfeWithinTolerance(h2, h1, t)).toBe(inside);
  });

  it('matches the datasheet form hFE1/hFE2 ≥ 1/(1 + t): a 0.9 ratio is an 11.1 % spread', () => {
    // reference.md §4 [published]: matched pairs specify hFE1/hFE2 ≥ 0.9 (smaller over larger).
    // 1/0.9 − 1 = 11.11 % [derived].
    expect(hfeWithinTolerance(90, 100, 11.2)).toBe(true);
    expect(hfeWithinTolerance(90, 100, 11.1)).toBe(false);
    expect(hfeSpreadPct(90, 100)).toBeCloseTo(11.111, 3);
  });
});

describe('vbeWithinTolerance', () => {
  const cases = [
    { situation: '650.1 and 652.1 mV at 2 mV (decimal readings at the limit)', v1: 650.1, v2: 652.1, v: 2, inside: true },
    { situation: '650 and 652.01 mV at 2 mV', v1: 650, v2: 652.01, v: 2, inside: false },
    { situation: '−650 and −651 mV (PNP sign) at 1 mV', v1: -650, v2: -651, v: 1, inside: true },
    { situation: '650 and 650.01 mV at 0 mV', v1: 650, v2: 650.01, v: 0, inside: false },
  ];
  it.each(cases)('$situation: inside = $inside', ({ v1, v2, v, inside }) => {
    expect(vbeWithinTolerance(v1, v2, v)).toBe(inside);
  });
});

describe('setMismatch', () => {
  // Definition: hfeSpread/t + vbeSpread/v, each term at most 1 (derived, this module's contract).
  const cases = [
    { situation: 'half of each tolerance', hs: 2.5, vs: 1, t: 5, v: 2, expected: 1 },
    { situation: 'identical parts', hs: 0, vs: 0, t: 5, v: 2, expected: 0 },
    { situation: 'at both limits', hs: 5, vs: 2, t: 5, v: 2, expected: 2 },
    { situation: 'zero hFE tolerance: that term is 0', hs: 0, vs: 0.5, t: 0, v: 2, expected: 0.25 },
  ];
  it.each(cases)('$situation gives $expected', ({ hs, vs, t, v, expected }) => {
    expect(setMismatch(hs, vs, t, v)).toBeCloseTo(expected, 12);
  });
});
