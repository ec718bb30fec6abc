import { describe, it, expect } from 'vitest';
import {
  ESD_CAUTION_TEXT,
  ESD_HBM_CLASSES,
  EsdInputError,
  describeEsdClass,
  esdClassForVoltage,
} from '../../../shared/domain/esd/index.ts';

describe('esdClassForVoltage (ANSI/ESDA/JEDEC JS-001 HBM classes)', () => {
  // JS-001 HBM class limits, reference.md §6 [published; 0Z/0A split from memory].
  it.each([
    [0, '0Z'],
    [49.9, '0Z'],
    [50, '0A'],
    [124, '0A'],
    [125, '0B'],
    [249, '0B'],
    [250, '1A'],
    [499, '1A'],
    [500, '1B'],
    [999, '1B'],
    [1000, '1C'],
    [1999, '1C'],
    [2000, '2'],
    [3999, '2'],
    [4000, '3A'],
    [7999, '3A'],
    [8000, '3B'],
    [16000, '3B'],
  ])('a part that withstands %s V is class %s', (volts, id) => {
    expect(esdClassForVoltage(volts).id).toBe(id);
  });

  it.each([[-1], [Number.NaN], [Number.POSITIVE_INFINITY]])('a voltage of %s throws EsdInputError', (volts) => {
    expect(() => esdClassForVoltage(volts)).toThrow(EsdInputError);
  });

  it('the classes cover 0 V upward without gaps or overlaps', () => {
    expect(ESD_HBM_CLASSES[0].minVolts).toBe(0);
    for (let i = 1; i < ESD_HBM_CLASSES.length; i++) {
      expect(ESD_HBM_CLASSES[i].minVolts).toBe(ESD_HBM_CLASSES[i - 1].belowVolts);
    }
    expect(ESD_HBM_CLASSES.at(-1)?.belowVolts).toBeNull();
  });

  it.each([
    ['0Z', '< 50 V'],
    ['1A', '250 V to < 500 V'],
    ['3B', '≥ 8000 V'],
  ])('class %s is described as %s', (id, text) => {
    const esdClass = ESD_HBM_CLASSES.find((c) => c.id === id);
    expect(esdClass && describeEsdClass(esdClass)).toBe(text);
  });

  it('the caution text names the S20.20 protected workstation and the wrist strap', () => {
    // ANSI/ESD S20.20 programme elements, reference.md §6.
    expect(ESD_CAUTION_TEXT).toContain('ANSI/ESD S20.20');
    expect(ESD_CAUTION_TEXT).toContain('wrist strap');
  });
});
