import { encodeDataMatrix } from '../../../shared/domain/labels/index.ts';

interface Canvas {
  rect(x: number, y: number, w: number, h: number): unknown;
  fill(color?: string): unknown;
}

/**
 * Draws a Data Matrix ECC 200 symbol of `text` as vector modules filling a `size` square with a
 * one-module quiet zone on every side (ISO/IEC 16022 asks for at least 1X). Uses our own encoder
 * (shared/domain/labels/data-matrix), many times faster than a general barcode library, which
 * matters for print jobs of hundreds of labels. Returns the module size in points.
 */
export function drawDataMatrixFast(doc: Canvas, text: string, x: number, y: number, size: number): number {
  const sym = encodeDataMatrix(text);
  const n = sym.size;
  const module = size / (n + 2);
  const ox = x + module;
  const oy = y + module;
  for (let r = 0; r < n; r++) {
    // Runs of dark modules in a row become one rectangle: fewer seams when rasterised.
    let c = 0;
    while (c < n) {
      if (!sym.modules[r * n + c]) {
        c++;
        continue;
      }
      const start = c;
      while (c < n && sym.modules[r * n + c]) c++;
      doc.rect(ox + start * module, oy + r * module, (c - start) * module, module + 0.01);
    }
  }
  doc.fill('#000000');
  return module;
}
