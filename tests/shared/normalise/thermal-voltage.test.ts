import { describe, it, expect } from 'vitest';
import {
  BOLTZMANN_J_PER_K,
  ELEMENTARY_CHARGE_C,
  NormaliseInputError,
  mirrorCurrentRatio,
  thermalVoltage,
  thermalVoltageMv,
} from '../../../shared/domain/normalise/index.ts';

describe('thermalVoltage', () => {
  it('uses the exact SI values of k and q', () => {
    // 2019 SI redefinition, reference.md §5 [published].
    expect(BOLTZMANN_J_PER_K).toBe(1.380649e-23);
    expect(ELEMENTARY_CHARGE_C).toBe(1.602176634e-19);
  });

  // reference.md §5 [derived]: 25.693 mV at 25 °C, 25.852 mV at 300 K.
  const cases = [
    { situation: '25 °C', tempC: 25, mv: 25.693 },
    { situation: '300 K (26.85 °C)', tempC: 26.85, mv: 25.852 },
  ];
  it.each(cases)('at $situation is $mv mV', ({ tempC, mv }) => {
    expect(thermalVoltageMv(tempC)).toBeCloseTo(mv, 3);
    expect(thermalVoltage(tempC)).toBeCloseTo(mv / 1000, 6);
  });

  it('at or below absolute zero, throws naming tempC', () => {
    expect(() => thermalVoltage(-273.15)).toThrowError(expect.objectContaining({ field: 'tempC' }));
    expect(() => thermalVoltageMv(Number.NaN)).toThrow(NormaliseInputError);
  });
});

describe('mirrorCurrentRatio', () => {
  it('for a 1 mV Vbe mismatch at 25 °C gives a 3.97 % current error', () => {
    // reference.md §5 [derived]: exp(1/25.693) = 1.0397.
    expect((mirrorCurrentRatio(1) - 1) * 100).toBeCloseTo(3.97, 2);
  });

  it('for VT·ln 10 ≈ 59.16 mV at 25 °C gives a ratio of 10 (one decade of IC)', () => {
    // reference.md §5 [derived]: Vbe rises VT·ln10 ≈ 59 mV per decade of IC at 25 °C.
    expect(mirrorCurrentRatio(thermalVoltageMv(25) * Math.LN10)).toBeCloseTo(10, 10);
  });

  it('for equal Vbe is exactly 1, and a negative mismatch gives the reciprocal', () => {
    expect(mirrorCurrentRatio(0)).toBe(1);
    expect(mirrorCurrentRatio(-2, 40) * mirrorCurrentRatio(2, 40)).toBeCloseTo(1, 14);
  });

  it('is smaller for the same mismatch at a higher temperature', () => {
    expect(mirrorCurrentRatio(1, 85)).toBeLessThan(mirrorCurrentRatio(1, 25));
  });

  it('with a non-finite mismatch, throws naming deltaVbeMv', () => {
    expect(() => mirrorCurrentRatio(Number.NaN)).toThrowError(expect.objectContaining({ field: 'deltaVbeMv' }));
  });
});
