import { BinaryBitmap, DataMatrixReader, DecodeHintType, HybridBinarizer, RGBLuminanceSource } from '@zxing/library';
import bwipjs from 'bwip-js/generic';
import { describe, expect, it } from 'vitest';
import { dataMatrixCodewords, encodeDataMatrix, formatLabel, LabelFormatError } from '../../../shared/domain/labels/index.ts';

/** Reads a symbol back with a general-purpose decoder (ZXing's port, test-only dependency). */
function decode(text: string): string {
  const { size, modules } = encodeDataMatrix(text);
  const scale = 4;
  const quiet = 2;
  const side = (size + 2 * quiet) * scale;
  const lum = new Uint8ClampedArray(side * side).fill(255);
  for (let y = 0; y < size; y++)
    for (let x = 0; x < size; x++)
      if (modules[y * size + x])
        for (let dy = 0; dy < scale; dy++)
          for (let dx = 0; dx < scale; dx++) lum[((y + quiet) * scale + dy) * side + (x + quiet) * scale + dx] = 0;
  const bitmap = new BinaryBitmap(new HybridBinarizer(new RGBLuminanceSource(lum, side, side)));
  return new DataMatrixReader().decode(bitmap, new Map([[DecodeHintType.PURE_BARCODE, true]])).getText();
}

// ISO/IEC 16022 ASCII encodation: a character is its code + 1, a digit pair 130 + its value,
// Macro 06 (codeword 237) stands for the "[)>RS06GS … RS EOT" envelope [published].
describe('dataMatrixCodewords', () => {
  it('packs digit pairs and shifts single characters by one', () => {
    expect(dataMatrixCodewords('A1')).toEqual([66, 50]);
    expect(dataMatrixCodewords('123')).toEqual([142, 52]);
    expect(dataMatrixCodewords('00')).toEqual([130]);
  });
  it('turns a format-06 envelope into the Macro 06 codeword', () => {
    const msg = formatLabel([{ di: 'Q', value: '5' }]);
    expect(dataMatrixCodewords(msg)).toEqual([237, 82, 54]);
  });
  it('refuses characters beyond Latin-1, naming text', () => {
    expect(() => dataMatrixCodewords('Ω')).toThrow(LabelFormatError);
  });
});

describe('encodeDataMatrix', () => {
  it('picks the smallest square symbol: 3 codewords fit 10 × 10, 4 need 12 × 12', () => {
    expect(encodeDataMatrix('ABC').size).toBe(10);
    expect(encodeDataMatrix('ABCD').size).toBe(12);
  });

  it('draws the finder (solid left and bottom) and clock (alternating top and right) patterns', () => {
    const { size, modules } = encodeDataMatrix('Binwright');
    const at = (x: number, y: number) => modules[y * size + x];
    for (let i = 0; i < size; i++) {
      expect(at(0, i)).toBe(1);
      expect(at(i, size - 1)).toBe(1);
      expect(at(i, 0)).toBe(i % 2 === 0 ? 1 : 0);
      if (i < size - 1) expect(at(size - 1, i)).toBe(i % 2 === 1 ? 1 : 0);
    }
  });

  const payloads = [
    'A',
    '0123456789',
    'C-20261201-0012',
    'Mixed case, spaces & punctuation: hFE 100–<150?'.replace('–', '-'),
    formatLabel([
      { di: 'P', value: 'HP-NPN-SS-01' },
      { di: 'T', value: 'C-20261201-0012' },
      { di: '1T', value: 'RV-88231' },
      { di: 'Q', value: '48' },
    ]),
    'Latin-1: café °C µA',
    'X'.repeat(90),
    '7'.repeat(300),
    'long text that needs a symbol with two data regions per side and two interleaved blocks '.repeat(2).slice(0, 190),
  ];
  it.each(payloads.map((p) => ({ p, n: p.length })))('a symbol of $n characters decodes back to the same text', ({ p }) => {
    expect(decode(p)).toBe(p);
  });

  it('sizes with several data regions and interleaved blocks decode back', () => {
    const sizes = new Set<number>();
    for (const n of [40, 70, 100, 130, 160, 190, 240, 270]) {
      const text = 'AB'.repeat(n).slice(0, n);
      sizes.add(encodeDataMatrix(text).size);
      expect(decode(text)).toBe(text);
    }
    expect([...sizes].some((s) => s >= 52)).toBe(true);
  });

  // Cross-check: the same codewords given to bwip-js (a BWIPP port) as raw input must give the
  // same modules, bit for bit — padding, Reed–Solomon, interleaving and placement included.
  it.each(['C-20261201-0012', 'Hello world 12345 abc', 'x'.repeat(120), 'AB'.repeat(120)])('modules equal bwip-js for the same codewords (%#)', (text) => {
    const raw = dataMatrixCodewords(text)
      .map((c) => `^${String(c).padStart(3, '0')}`)
      .join('');
    const [sym] = bwipjs.raw({ bcid: 'datamatrix', text: raw, raw: true } as never) as unknown as { pixs: number[]; pixx: number }[];
    const mine = encodeDataMatrix(text);
    expect(mine.size).toBe(sym?.pixx);
    expect(Array.from(mine.modules)).toEqual(sym?.pixs);
  });

  it('text too long for 64 × 64 is refused naming text', () => {
    expect(() => encodeDataMatrix('A'.repeat(400))).toThrowError(expect.objectContaining({ field: 'text' }));
  });
});
