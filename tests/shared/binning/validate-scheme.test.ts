import { describe, it, expect } from 'vitest';
import { validateBinScheme, type GainBin } from '../../../shared/domain/binning/index.ts';

const open = { hfeMin: null, hfeMax: null };

/** A valid three-bin scheme inside a 100–300 part (the 2N3904 10 mA limits, reference.md §4). */
const threeBins: GainBin[] = [
  { code: 'L', label: 'hFE 100–160', hfeMin: 100, hfeMax: 160 },
  { code: 'M', label: 'hFE 160–230', hfeMin: 160, hfeMax: 230 },
  { code: 'H', label: 'hFE 230–300', hfeMin: 230, hfeMax: 300 },
];
const limits2N3904 = { hfeMin: 100, hfeMax: 300 };

describe('validateBinScheme', () => {
  it('accepts adjacent bins that exactly fill the part limits', () => {
    expect(validateBinScheme(threeBins, limits2N3904)).toEqual({ ok: true, errors: [] });
  });

  it('rejects the European gain groups A 110–220, B 200–450, C 420–800 as a scheme, because they overlap', () => {
    // reference.md §4 [published in datasheets]: the printed group limits overlap (B starts at 200
    // inside A, C at 420 inside B), so they cannot serve as one-bin-per-part intervals.
    const groups: GainBin[] = [
      { code: 'A', label: 'Group A', hfeMin: 110, hfeMax: 220 },
      { code: 'B', label: 'Group B', hfeMin: 200, hfeMax: 450 },
      { code: 'C', label: 'Group C', hfeMin: 420, hfeMax: 800 },
    ];
    const r = validateBinScheme(groups, { hfeMin: 110, hfeMax: 800 });
    expect(r.ok).toBe(false);
    expect(r.errors.map(({ index, field }) => ({ index, field }))).toEqual([
      { index: 1, field: 'hfeMin' },
      { index: 2, field: 'hfeMin' },
    ]);
    expect(r.errors[0]!.message).toMatch(/overlaps/);
  });

  const invalid: { situation: string; bins: GainBin[]; limits?: { hfeMin: number | null; hfeMax: number | null }; index: number; field: string; message: RegExp }[] = [
    { situation: 'an empty list', bins: [], index: -1, field: 'bins', message: /at least one bin/ },
    {
      situation: 'a duplicate code',
      bins: [threeBins[0]!, { ...threeBins[1]!, code: 'L' }],
      index: 1,
      field: 'code',
      message: /already used/,
    },
    {
      situation: 'an empty code',
      bins: [{ ...threeBins[0]!, code: '  ' }],
      index: 0,
      field: 'code',
      message: /must not be empty/,
    },
    {
      situation: 'an empty label',
      bins: [{ ...threeBins[0]!, label: '' }],
      index: 0,
      field: 'label',
      message: /must not be empty/,
    },
    {
      situation: 'hfeMin equal to hfeMax',
      bins: [{ code: 'X', label: 'x', hfeMin: 150, hfeMax: 150 }],
      index: 0,
      field: 'hfeMax',
      message: /greater than hfeMin/,
    },
    {
      situation: 'a NaN bound',
      bins: [{ code: 'X', label: 'x', hfeMin: Number.NaN, hfeMax: 150 }],
      index: 0,
      field: 'hfeMin',
      message: /finite/,
    },
    {
      situation: 'an inverted Vbe window',
      bins: [{ code: 'X', label: 'x', hfeMin: 100, hfeMax: 150, vbeMinMv: 660, vbeMaxMv: 640 }],
      index: 0,
      field: 'vbeMaxMv',
      message: /greater than vbeMinMv/,
    },
    {
      situation: 'an unmarked gap',
      bins: [threeBins[0]!, { ...threeBins[1]!, hfeMin: 170 }],
      index: 1,
      field: 'hfeMin',
      message: /gap from 160 to 170/,
    },
    {
      situation: 'bins out of order',
      bins: [threeBins[1]!, threeBins[0]!],
      index: 1,
      field: 'hfeMin',
      message: /ascending/,
    },
    {
      situation: 'a bin below the part minimum',
      bins: [{ ...threeBins[0]!, hfeMin: 90 }, threeBins[1]!, threeBins[2]!],
      limits: limits2N3904,
      index: 0,
      field: 'hfeMin',
      message: /below the part's minimum/,
    },
    {
      situation: 'a bin above the part maximum',
      bins: [threeBins[0]!, threeBins[1]!, { ...threeBins[2]!, hfeMax: 320 }],
      limits: limits2N3904,
      index: 2,
      field: 'hfeMax',
      message: /above the part's maximum/,
    },
  ];
  it.each(invalid)('rejects $situation, naming the bin and $field', ({ bins, limits, index, field, message }) => {
    const r = validateBinScheme(bins, limits ?? open);
    expect(r.ok).toBe(false);
    expect(r.errors).toContainEqual({ index, field, message: expect.stringMatching(message) });
  });

  it('accepts a gap the engineer marked as intended', () => {
    const bins = [threeBins[0]!, { ...threeBins[1]!, hfeMin: 170, gapBeforeIntended: true }];
    expect(validateBinScheme(bins, limits2N3904).ok).toBe(true);
  });

  it('with open part limits, accepts bins at any hFE', () => {
    const bins: GainBin[] = [{ code: 'X', label: 'x', hfeMin: 1, hfeMax: 5000 }];
    expect(validateBinScheme(bins, open).ok).toBe(true);
    expect(validateBinScheme(bins, { hfeMin: 40, hfeMax: null }).errors).toHaveLength(1);
  });

  it('reports every problem, not only the first', () => {
    // An empty label, a reused code, min above max, and an overlap with bin 0 (140 < 150).
    const bins: GainBin[] = [
      { code: 'A', label: '', hfeMin: 100, hfeMax: 150 },
      { code: 'A', label: 'b', hfeMin: 140, hfeMax: 130 },
    ];
    expect(validateBinScheme(bins, open).errors.map((e) => e.field).sort()).toEqual(['code', 'hfeMax', 'hfeMin', 'label']);
  });
});
