import { describe, expect, it } from 'vitest';
import { describeFlag, limitFlags } from '../../../shared/domain/inspection/index.ts';

const limits = { hfeMin: 100, hfeMax: 300, vbeMinMv: 580, vbeMaxMv: 700 };

describe('limitFlags', () => {
  it('a reading on a limit conforms (limits are inclusive, as datasheets print min and max)', () => {
    expect(limitFlags(limits, 100, 580)).toEqual([]);
    expect(limitFlags(limits, 300, 700)).toEqual([]);
  });

  it('flags each broken limit', () => {
    expect(limitFlags(limits, 99.9, 701)).toEqual(['hfe-low', 'vbe-high']);
    expect(limitFlags(limits, 301, 579)).toEqual(['hfe-high', 'vbe-low']);
  });

  it('an open side never flags', () => {
    expect(limitFlags({ hfeMin: 40, hfeMax: null, vbeMinMv: null, vbeMaxMv: null }, 5000, 9999)).toEqual([]);
  });

  it('says the flag in words naming the limit', () => {
    expect(describeFlag('hfe-low', limits)).toBe('hFE below 100');
    expect(describeFlag('vbe-high', limits)).toBe('Vbe above 700 mV');
  });
});
