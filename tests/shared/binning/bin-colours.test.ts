import { describe, expect, it } from 'vitest';
import { BIN_PALETTE_SIZE, OUTSIDE_BIN_COLOUR, binColour, contrastRatio } from '../../../shared/domain/binning/index.ts';

describe('bin colours', () => {
  it('every palette colour carries text with a contrast of at least 4.5 : 1 (WCAG 2.x AA, normal text)', () => {
    for (let i = 0; i < BIN_PALETTE_SIZE; i++) {
      const c = binColour(i);
      expect(contrastRatio(c.fill, c.text), c.name).toBeGreaterThanOrEqual(4.5);
    }
    expect(contrastRatio(OUTSIDE_BIN_COLOUR.fill, OUTSIDE_BIN_COLOUR.text)).toBeGreaterThanOrEqual(4.5);
  });

  it('neighbouring bins get different colours, and the palette repeats after its size', () => {
    const fills = Array.from({ length: BIN_PALETTE_SIZE }, (_, i) => binColour(i).fill);
    expect(new Set(fills).size).toBe(BIN_PALETTE_SIZE);
    expect(binColour(BIN_PALETTE_SIZE)).toEqual(binColour(0));
  });

  it('null or a negative index is the outside colour', () => {
    expect(binColour(null)).toBe(OUTSIDE_BIN_COLOUR);
    expect(binColour(-1)).toBe(OUTSIDE_BIN_COLOUR);
  });

  // WCAG 2.x: black on white is 21 : 1.
  it('contrastRatio of black on white is 21', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 6);
  });
});
