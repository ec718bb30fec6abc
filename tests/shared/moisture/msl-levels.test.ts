import { describe, it, expect } from 'vitest';
import {
  MSL_LEVELS,
  MoistureInputError,
  floorLifeHours,
  normaliseMslLevel,
} from '../../../shared/domain/moisture/index.ts';

describe('MSL levels (IPC/JEDEC J-STD-020)', () => {
  it('lists the eight levels in order of sensitivity', () => {
    // J-STD-020 levels (reference.md §3, §6).
    expect(MSL_LEVELS).toEqual(['1', '2', '2a', '3', '4', '5', '5a', '6']);
  });

  it.each([
    ['3', '3'],
    [' MSL 2A ', '2a'],
    ['Level 5a', '5a'],
    ['LVL:4', '4'],
    ['msl_6', '6'],
    ['7', null],
    ['2b', null],
    ['', null],
  ])('normalising "%s" gives %j', (text, level) => {
    expect(normaliseMslLevel(text)).toBe(level);
  });
});

describe('floorLifeHours (J-STD-033 at ≤ 30 °C / 60 % RH)', () => {
  // J-STD-033 floor life, reference.md §6 [from memory, consistent with several published summaries].
  it.each([
    ['1', null], // unlimited at ≤ 30 °C / 85 % RH
    ['2', 8760], // one year = 365 × 24 h
    ['2a', 672], // four weeks = 28 × 24 h
    ['3', 168],
    ['4', 72],
    ['5', 48],
    ['5a', 24],
    ['6', 0], // bake before use, then the time on the label
  ])('MSL %s has a floor life of %j hours', (level, hours) => {
    expect(floorLifeHours(level)).toBe(hours);
  });

  it('for "MSL 3" as printed on a label, reads 168 hours', () => {
    expect(floorLifeHours('MSL 3')).toBe(168); // J-STD-033 [from memory], reference.md §6
  });

  it('for an unknown level, throws MoistureInputError naming level', () => {
    expect(() => floorLifeHours('7')).toThrow(MoistureInputError);
    expect(() => floorLifeHours('7')).toThrow(/J-STD-020/);
  });
});
