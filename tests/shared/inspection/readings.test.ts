import { describe, expect, it } from 'vitest';
import { checkReading } from '../../../shared/domain/inspection/index.ts';

describe('checkReading', () => {
  it('converts Vbe in V to mV and leakage in µA to nA', () => {
    const r = checkReading({ hfe: 210, vbe: 0.652, vbeUnit: 'V', vceSat: 0.09, vceSatUnit: 'V', leakage: 0.015, leakageUnit: 'uA' });
    expect(r.errors).toEqual([]);
    expect(r.reading?.vbeMv).toBeCloseTo(652, 9);
    expect(r.reading?.vceSatMv).toBeCloseTo(90, 9);
    expect(r.reading?.leakageNa).toBeCloseTo(15, 9);
  });

  it('a Vbe of 0.65 stated in mV is implausible and suggests volts', () => {
    const r = checkReading({ hfe: 210, vbe: 0.65, vbeUnit: 'mV' });
    expect(r.reading).toBeNull();
    expect(r.errors[0]).toMatchObject({ field: 'vbe' });
    expect(r.errors[0].message).toMatch(/choose V/);
  });

  it('a Vbe of 650 stated in V suggests millivolts', () => {
    expect(checkReading({ hfe: 210, vbe: 650, vbeUnit: 'V' }).errors[0].message).toMatch(/choose mV/);
  });

  it('a negative Vbe (PNP sign) is refused with a hint to enter the magnitude', () => {
    expect(checkReading({ hfe: 210, vbe: -650, vbeUnit: 'mV' }).errors[0].message).toMatch(/without the minus sign/);
  });

  it('names every bad field at once', () => {
    const r = checkReading({ hfe: Number.NaN, vbe: Number.NaN, vbeUnit: 'mV', leakage: -1 });
    expect(r.errors.map((e) => e.field)).toEqual(['hfe', 'vbe', 'leakage']);
  });
});
