import { describe, it, expect } from 'vitest';
import {
  DEFAULT_VBE_COEFF_MV_PER_C,
  NormaliseInputError,
  hfeAtTemperature,
  normaliseHfe,
  normaliseVbeMv,
  vbeAtTemperatureMv,
} from '../../../shared/domain/normalise/index.ts';

describe('normaliseVbeMv', () => {
  it('defaults to −2.0 mV/°C', () => {
    // reference.md §5: Vbe falls about 2 mV per °C [published in datasheet notes; common practice].
    expect(DEFAULT_VBE_COEFF_MV_PER_C).toBe(-2);
  });

  // Derived from Vbe₂₅ = Vbe_T − coeff·(T − 25).
  const cases = [
    { situation: 'read warm at 35 °C, default −2 mV/°C', vbe: 630, t: 35, coeff: undefined, expected: 650 },
    { situation: 'read cold at 15 °C, default −2 mV/°C', vbe: 670, t: 15, coeff: undefined, expected: 650 },
    { situation: 'read at 30 °C with −1.8 mV/°C', vbe: 640, t: 30, coeff: -1.8, expected: 649 },
    { situation: 'read at 25 °C', vbe: 655.5, t: 25, coeff: -2.2, expected: 655.5 },
  ];
  it.each(cases)('$situation: $vbe mV becomes $expected mV', ({ vbe, t, coeff, expected }) => {
    expect(normaliseVbeMv(vbe, t, coeff)).toBeCloseTo(expected, 10);
  });

  it('round-trips with vbeAtTemperatureMv', () => {
    for (const t of [-10, 18.5, 25, 41, 70]) {
      expect(vbeAtTemperatureMv(normaliseVbeMv(612.3, t, -2.1), t, -2.1)).toBeCloseTo(612.3, 10);
    }
  });

  it('with a non-finite ambient temperature, throws naming ambientC', () => {
    expect(() => normaliseVbeMv(650, Number.NaN)).toThrowError(expect.objectContaining({ field: 'ambientC' }));
  });
});

describe('normaliseHfe', () => {
  // Derived from hFE₂₅ = hFE_T / (1 + pct/100·(T − 25)).
  const cases = [
    { situation: 'read at 45 °C with 0.6 %/°C', hfe: 212, t: 45, pct: 0.6, expected: 212 / 1.12 },
    { situation: 'read at 15 °C with 0.5 %/°C', hfe: 190, t: 15, pct: 0.5, expected: 200 },
    { situation: 'read at 25 °C', hfe: 333, t: 25, pct: 0.7, expected: 333 },
  ];
  it.each(cases)('$situation: hFE $hfe becomes $expected', ({ hfe, t, pct, expected }) => {
    expect(normaliseHfe(hfe, t, pct)).toBeCloseTo(expected, 10);
  });

  it('round-trips with hfeAtTemperature', () => {
    for (const t of [0, 22, 25, 38.5, 60]) {
      expect(hfeAtTemperature(normaliseHfe(245, t, 0.55), t, 0.55)).toBeCloseTo(245, 10);
    }
  });

  it('when the coefficient and temperature make the gain factor non-positive, throws naming pctPerC', () => {
    // 1 + 5/100·(5 − 25) = 0.
    expect(() => normaliseHfe(100, 5, 5)).toThrowError(expect.objectContaining({ field: 'pctPerC' }));
    expect(() => normaliseHfe(Number.NaN, 30, 0.5)).toThrow(NormaliseInputError);
  });
});
