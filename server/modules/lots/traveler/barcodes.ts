import bwipjs from 'bwip-js';

/** Anything with pdfkit's rect + fill (kept narrow so the drawing is easy to test and reuse). */
interface Canvas {
  rect(x: number, y: number, w: number, h: number): unknown;
  fill(color?: string): unknown;
}

type Matrix = { pixs: number[]; pixx: number; pixy: number };
type Bars = { sbs: number[] };

/** Quiet zone of Code 128 on each side, in modules (ISO/IEC 15417: at least 10X). */
export const CODE128_QUIET_MODULES = 10;

/** Total width of a Code 128 symbol of `text` in modules, quiet zones included. */
export function code128Modules(text: string): number {
  const [sym] = bwipjs.raw({ bcid: 'code128', text }) as Bars[];
  return sym.sbs.reduce((a, b) => a + b, 0) + 2 * CODE128_QUIET_MODULES;
}

/**
 * Draws a Code 128 symbol as vector bars filling `w` (quiet zones included) and `h` high.
 * Returns the module width in points.
 */
export function drawCode128(doc: Canvas, text: string, x: number, y: number, w: number, h: number): number {
  const [sym] = bwipjs.raw({ bcid: 'code128', text }) as Bars[];
  const total = sym.sbs.reduce((a, b) => a + b, 0) + 2 * CODE128_QUIET_MODULES;
  const module = w / total;
  let cursor = x + CODE128_QUIET_MODULES * module;
  sym.sbs.forEach((width, i) => {
    // Even entries are bars, odd entries spaces.
    if (i % 2 === 0) doc.rect(cursor, y, width * module, h);
    cursor += width * module;
  });
  doc.fill('#000000');
  return module;
}

/**
 * Draws a Data Matrix (ECC 200) symbol as vector modules inside a `size` square, keeping a quiet
 * zone of one module on every side (ISO/IEC 16022 asks for at least 1X). Returns the module size.
 */
export function drawDataMatrix(doc: Canvas, text: string, x: number, y: number, size: number): number {
  const [sym] = bwipjs.raw({ bcid: 'datamatrix', text }) as Matrix[];
  const n = Math.max(sym.pixx, sym.pixy);
  const module = size / (n + 2);
  const ox = x + module;
  const oy = y + module;
  for (let r = 0; r < sym.pixy; r++) {
    // Runs of dark modules in a row become one rectangle: fewer seams when rasterised.
    let c = 0;
    while (c < sym.pixx) {
      if (!sym.pixs[r * sym.pixx + c]) {
        c++;
        continue;
      }
      const start = c;
      while (c < sym.pixx && sym.pixs[r * sym.pixx + c]) c++;
      doc.rect(ox + start * module, oy + r * module, (c - start) * module, module + 0.01);
    }
  }
  doc.fill('#000000');
  return module;
}
