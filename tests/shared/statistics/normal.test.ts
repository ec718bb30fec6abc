import { describe, it, expect } from 'vitest';
import { errorFunction } from 'simple-statistics';
import { erf, erfc, normalCdf } from '../../../shared/domain/statistics/index.ts';

// Check values computed with CPython 3 math.erf / math.erfc (the C library's implementation,
// independent of Cody's rational approximation used here); erf(1) = 0.8427007929… also appears in
// Abramowitz & Stegun Table 7.1 (from memory).
const erfCases = [
  { x: 0.1, value: 0.1124629160182849 },
  { x: 0.5, value: 0.5204998778130465 },
  { x: 1, value: 0.8427007929497149 },
  { x: 2, value: 0.9953222650189527 },
  { x: -1, value: -0.8427007929497149 },
];
const erfcCases = [
  { x: 3, value: 2.2090496998585438e-5 },
  { x: 5, value: 1.5374597944280351e-12 },
  { x: 10, value: 2.088487583762545e-45 },
  { x: -1, value: 1.842700792949715 },
];

describe('erf and erfc (W. J. Cody, 1969)', () => {
  it.each(erfCases)('erf($x) matches $value to 1e-14 relative', ({ x, value }) => {
    expect(Math.abs(erf(x) - value) / Math.abs(value)).toBeLessThan(1e-14);
  });

  it.each(erfcCases)('erfc($x) matches $value to 1e-13 relative, deep in the tail', ({ x, value }) => {
    expect(Math.abs(erfc(x) - value) / value).toBeLessThan(1e-13);
  });

  it('agrees with simple-statistics errorFunction (Numerical Recipes erfcc, |error| < 1.2e-7) from −4 to 4', () => {
    for (let x = -4; x <= 4; x += 0.0625) {
      expect(Math.abs(erf(x) - errorFunction(x))).toBeLessThan(2e-7);
    }
  });

  it('keeps erf + erfc = 1 across the interval boundaries at 0.46875 and 4', () => {
    for (const x of [0.46875, 0.46876, 3.99999, 4, 4.00001, -0.46875, -4]) {
      expect(erf(x) + erfc(x)).toBeCloseTo(1, 15);
    }
  });

  it('underflows erfc to 0 far in the tail and saturates erf at ±1', () => {
    expect(erfc(30)).toBe(0);
    expect(erf(30)).toBe(1);
    expect(erf(-30)).toBe(-1);
  });
});

describe('normalCdf', () => {
  // Computed with SciPy 1.17 scipy.stats.norm.cdf.
  const cases = [
    { z: 0, value: 0.5 },
    { z: 1.96, value: 0.9750021048517795 },
    { z: -3, value: 0.0013498980316300933 },
  ];
  it.each(cases)('Φ($z) = $value', ({ z, value }) => {
    expect(Math.abs(normalCdf(z) - value) / value).toBeLessThan(1e-13);
  });
});
