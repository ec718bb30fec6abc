import { describe, it, expect } from 'vitest';
import { assignBin, binCounts, BinningInputError, type GainBin } from '../../../shared/domain/binning/index.ts';

// Product rule of the binning module: [hfeMin, hfeMax), the last bin closed. Edge cases derived from it.
const scheme: GainBin[] = [
  { code: 'L', label: 'low', hfeMin: 100, hfeMax: 160 },
  { code: 'M', label: 'mid', hfeMin: 160, hfeMax: 230 },
  { code: 'H', label: 'high', hfeMin: 240, hfeMax: 300, gapBeforeIntended: true },
];

describe('assignBin', () => {
  const cases = [
    { situation: 'the lowest bin edge', hfe: 100, code: 'L' },
    { situation: 'just below the lowest edge', hfe: 99.999, code: null },
    { situation: 'a shared edge (belongs to the upper bin)', hfe: 160, code: 'M' },
    { situation: 'just below a shared edge', hfe: 159.999, code: 'L' },
    { situation: 'the start of an intended gap', hfe: 230, code: null },
    { situation: 'inside the intended gap', hfe: 235, code: null },
    { situation: 'the top edge of the last bin (closed)', hfe: 300, code: 'H' },
    { situation: 'above the last bin', hfe: 300.001, code: null },
  ];
  it.each(cases)('at $situation (hFE $hfe) gives $code', ({ hfe, code }) => {
    expect(assignBin(scheme, { hfe })).toBe(code);
  });

  describe('with a Vbe window on a bin', () => {
    const windowed: GainBin[] = [
      { code: 'P1', label: 'pair grade', hfeMin: 200, hfeMax: 250, vbeMinMv: 640, vbeMaxMv: 660 },
      { code: 'P2', label: 'upper', hfeMin: 250, hfeMax: 300, vbeMinMv: 640 },
    ];
    const cases = [
      { situation: 'Vbe inside', part: { hfe: 220, vbeMv: 650 }, code: 'P1' },
      { situation: 'Vbe on the closed window edges', part: { hfe: 220, vbeMv: 660 }, code: 'P1' },
      { situation: 'Vbe above the window', part: { hfe: 220, vbeMv: 661 }, code: null },
      { situation: 'no Vbe reading', part: { hfe: 220 }, code: null },
      { situation: 'a null Vbe reading', part: { hfe: 220, vbeMv: null }, code: null },
      { situation: 'an open upper Vbe end', part: { hfe: 260, vbeMv: 900 }, code: 'P2' },
      { situation: 'below an open-ended window', part: { hfe: 260, vbeMv: 639 }, code: null },
    ];
    it.each(cases)('and $situation gives $code', ({ part, code }) => {
      expect(assignBin(windowed, part)).toBe(code);
    });
  });

  it('with an empty scheme, puts every part outside', () => {
    expect(assignBin([], { hfe: 150 })).toBeNull();
  });

  it('with a non-finite hFE, throws naming the field', () => {
    expect(() => assignBin(scheme, { hfe: Number.NaN })).toThrowError(expect.objectContaining({ field: 'part.hfe' }));
    expect(() => assignBin(scheme, { hfe: 150, vbeMv: Number.NaN })).toThrow(BinningInputError);
  });
});

describe('binCounts', () => {
  it('counts parts per bin in scheme order and the parts outside all bins', () => {
    const parts = [99, 100, 150, 160, 229.9, 230, 240, 300, 301].map((hfe) => ({ hfe }));
    expect(binCounts(scheme, parts)).toEqual({
      counts: [
        { code: 'L', count: 2 },
        { code: 'M', count: 2 },
        { code: 'H', count: 2 },
      ],
      outside: 3,
      total: 9,
    });
  });

  it('agrees with assignBin on every part', () => {
    const parts = Array.from({ length: 250 }, (_, i) => ({ hfe: 90 + i * 0.9 }));
    const result = binCounts(scheme, parts);
    const byAssign = new Map<string | null, number>();
    for (const p of parts) {
      const code = assignBin(scheme, p);
      byAssign.set(code, (byAssign.get(code) ?? 0) + 1);
    }
    for (const { code, count } of result.counts) expect(count).toBe(byAssign.get(code) ?? 0);
    expect(result.outside).toBe(byAssign.get(null) ?? 0);
  });

  it('with a bad part, throws naming its index', () => {
    expect(() => binCounts(scheme, [{ hfe: 150 }, { hfe: Number.POSITIVE_INFINITY }])).toThrowError(
      expect.objectContaining({ field: 'parts[1].hfe' }),
    );
  });
});
