import { LabelFormatError } from './errors.ts';

/**
 * Data Matrix ECC 200 (ISO/IEC 16022) encoder for our own labels, written for speed: ASCII
 * encodation (digit pairs packed, Macro 06 for an ISO/IEC 15434 format-06 envelope),
 * Reed–Solomon error correction over GF(2⁸) with the field polynomial x⁸+x⁵+x³+x²+1 (301), the
 * standard module placement of ISO/IEC 16022 Annex F, and square symbols 10×10 to 64×64.
 */
export interface DataMatrixSymbol {
  /** Modules per side, finder and clock patterns included (no quiet zone). */
  size: number;
  /** size × size modules, row by row from the top left; 1 = dark. */
  modules: Uint8Array;
}

interface SymbolSpec {
  size: number;
  dataCodewords: number;
  eccCodewords: number;
  /** Data regions per side. */
  regions: number;
  /** Interleaved Reed–Solomon blocks. */
  blocks: number;
}

// ISO/IEC 16022 Table 7, square ECC 200 symbols up to 64 × 64 [published].
const SPECS: readonly SymbolSpec[] = [
  { size: 10, dataCodewords: 3, eccCodewords: 5, regions: 1, blocks: 1 },
  { size: 12, dataCodewords: 5, eccCodewords: 7, regions: 1, blocks: 1 },
  { size: 14, dataCodewords: 8, eccCodewords: 10, regions: 1, blocks: 1 },
  { size: 16, dataCodewords: 12, eccCodewords: 12, regions: 1, blocks: 1 },
  { size: 18, dataCodewords: 18, eccCodewords: 14, regions: 1, blocks: 1 },
  { size: 20, dataCodewords: 22, eccCodewords: 18, regions: 1, blocks: 1 },
  { size: 22, dataCodewords: 30, eccCodewords: 20, regions: 1, blocks: 1 },
  { size: 24, dataCodewords: 36, eccCodewords: 24, regions: 1, blocks: 1 },
  { size: 26, dataCodewords: 44, eccCodewords: 28, regions: 1, blocks: 1 },
  { size: 32, dataCodewords: 62, eccCodewords: 36, regions: 2, blocks: 1 },
  { size: 36, dataCodewords: 86, eccCodewords: 42, regions: 2, blocks: 1 },
  { size: 40, dataCodewords: 114, eccCodewords: 48, regions: 2, blocks: 1 },
  { size: 44, dataCodewords: 144, eccCodewords: 56, regions: 2, blocks: 1 },
  { size: 48, dataCodewords: 174, eccCodewords: 68, regions: 2, blocks: 1 },
  { size: 52, dataCodewords: 204, eccCodewords: 84, regions: 2, blocks: 2 },
  { size: 64, dataCodewords: 280, eccCodewords: 112, regions: 4, blocks: 2 },
];

const MACRO_06_HEAD = '[)>\u001e06\u001d';
const MACRO_06_TAIL = '\u001e\u0004';
const PAD = 129;
const UPPER_SHIFT = 235;
const MACRO_06 = 237;

/** ASCII encodation: digit pairs → 130 + value, other characters → code + 1, 128–255 via Upper Shift. */
export function dataMatrixCodewords(text: string): number[] {
  const out: number[] = [];
  let body = text;
  if (body.startsWith(MACRO_06_HEAD) && body.endsWith(MACRO_06_TAIL) && body.length >= MACRO_06_HEAD.length + MACRO_06_TAIL.length) {
    out.push(MACRO_06);
    body = body.slice(MACRO_06_HEAD.length, body.length - MACRO_06_TAIL.length);
  }
  for (let i = 0; i < body.length; i++) {
    const c = body.charCodeAt(i);
    const next = i + 1 < body.length ? body.charCodeAt(i + 1) : -1;
    if (c >= 48 && c <= 57 && next >= 48 && next <= 57) {
      out.push(130 + (c - 48) * 10 + (next - 48));
      i++;
    } else if (c < 128) {
      out.push(c + 1);
    } else if (c < 256) {
      out.push(UPPER_SHIFT, c - 128 + 1);
    } else {
      throw new LabelFormatError(`character U+${c.toString(16).padStart(4, '0')} cannot be encoded (Latin-1 only)`, 'text');
    }
  }
  return out;
}

// GF(256) with the Data Matrix field polynomial 301.
const EXP = new Uint8Array(512);
const LOG = new Uint8Array(256);
{
  let x = 1;
  for (let i = 0; i < 255; i++) {
    EXP[i] = x;
    LOG[x] = i;
    x <<= 1;
    if (x & 0x100) x ^= 301;
  }
  for (let i = 255; i < 512; i++) EXP[i] = EXP[i - 255] as number;
}
const mul = (a: number, b: number) => (a === 0 || b === 0 ? 0 : (EXP[(LOG[a] as number) + (LOG[b] as number)] as number));

const generators = new Map<number, Uint8Array>();
/** Coefficients of ∏(x − αⁱ), i = 1…n, highest power first, leading 1 dropped. */
function generator(n: number): Uint8Array {
  let g = generators.get(n);
  if (g) return g;
  let poly = [1];
  for (let i = 1; i <= n; i++) {
    const next = new Array<number>(poly.length + 1).fill(0);
    for (let j = 0; j < poly.length; j++) {
      next[j] = (next[j] as number) ^ (poly[j] as number);
      next[j + 1] = (next[j + 1] as number) ^ mul(poly[j] as number, EXP[i] as number);
    }
    poly = next;
  }
  g = Uint8Array.from(poly.slice(1));
  generators.set(n, g);
  return g;
}

function reedSolomon(data: readonly number[], n: number): number[] {
  const g = generator(n);
  const rem = new Uint8Array(n);
  for (const d of data) {
    const f = d ^ (rem[0] as number);
    rem.copyWithin(0, 1);
    rem[n - 1] = 0;
    if (f !== 0) for (let j = 0; j < n; j++) rem[j] = (rem[j] as number) ^ mul(f, g[j] as number);
  }
  return [...rem];
}

/** Data padded to the symbol's capacity, followed by its interleaved error correction. */
function fullCodewords(data: number[], spec: SymbolSpec): number[] {
  const cw = [...data];
  if (cw.length < spec.dataCodewords) cw.push(PAD);
  while (cw.length < spec.dataCodewords) {
    const pos = cw.length + 1;
    let v = PAD + ((149 * pos) % 253) + 1;
    if (v > 254) v -= 254;
    cw.push(v);
  }
  const eccPerBlock = spec.eccCodewords / spec.blocks;
  const ecc = new Array<number>(spec.eccCodewords);
  for (let b = 0; b < spec.blocks; b++) {
    const blockData = cw.filter((_, i) => i % spec.blocks === b);
    reedSolomon(blockData, eccPerBlock).forEach((e, j) => {
      ecc[b + j * spec.blocks] = e;
    });
  }
  return cw.concat(ecc);
}

/** ISO/IEC 16022 Annex F: which codeword bit each module of the nrow × ncol mapping matrix holds. */
function placement(nrow: number, ncol: number): Int32Array {
  const a = new Int32Array(nrow * ncol);
  const mod = (row: number, col: number, chr: number, bit: number) => {
    if (row < 0) {
      row += nrow;
      col += 4 - ((nrow + 4) % 8);
    }
    if (col < 0) {
      col += ncol;
      row += 4 - ((ncol + 4) % 8);
    }
    a[row * ncol + col] = 10 * chr + bit;
  };
  const utah = (row: number, col: number, chr: number) => {
    mod(row - 2, col - 2, chr, 1);
    mod(row - 2, col - 1, chr, 2);
    mod(row - 1, col - 2, chr, 3);
    mod(row - 1, col - 1, chr, 4);
    mod(row - 1, col, chr, 5);
    mod(row, col - 2, chr, 6);
    mod(row, col - 1, chr, 7);
    mod(row, col, chr, 8);
  };
  const corner = (chr: number, cells: [number, number][]) => cells.forEach(([r, c], i) => mod(r, c, chr, i + 1));
  let chr = 1;
  let row = 4;
  let col = 0;
  do {
    if (row === nrow && col === 0) corner(chr++, [[nrow - 1, 0], [nrow - 1, 1], [nrow - 1, 2], [0, ncol - 2], [0, ncol - 1], [1, ncol - 1], [2, ncol - 1], [3, ncol - 1]]);
    if (row === nrow - 2 && col === 0 && ncol % 4 !== 0) corner(chr++, [[nrow - 3, 0], [nrow - 2, 0], [nrow - 1, 0], [0, ncol - 4], [0, ncol - 3], [0, ncol - 2], [0, ncol - 1], [1, ncol - 1]]);
    if (row === nrow - 2 && col === 0 && ncol % 8 === 4) corner(chr++, [[nrow - 3, 0], [nrow - 2, 0], [nrow - 1, 0], [0, ncol - 2], [0, ncol - 1], [1, ncol - 1], [2, ncol - 1], [3, ncol - 1]]);
    if (row === nrow + 4 && col === 2 && ncol % 8 === 0) corner(chr++, [[nrow - 1, 0], [nrow - 1, ncol - 1], [0, ncol - 3], [0, ncol - 2], [0, ncol - 1], [1, ncol - 3], [1, ncol - 2], [1, ncol - 1]]);
    do {
      if (row < nrow && col >= 0 && a[row * ncol + col] === 0) utah(row, col, chr++);
      row -= 2;
      col += 2;
    } while (row >= 0 && col < ncol);
    row += 1;
    col += 3;
    do {
      if (row >= 0 && col < ncol && a[row * ncol + col] === 0) utah(row, col, chr++);
      row += 2;
      col -= 2;
    } while (row < nrow && col >= 0);
    row += 3;
    col += 1;
  } while (row < nrow || col < ncol);
  // The fixed pattern in the lower right corner when four modules are left over.
  if (a[nrow * ncol - 1] === 0) {
    a[nrow * ncol - 1] = 1;
    a[nrow * ncol - ncol - 2] = 1;
  }
  return a;
}

const placements = new Map<number, Int32Array>();

/**
 * Encodes text (Latin-1) as the smallest square Data Matrix ECC 200 symbol that holds it.
 * @throws LabelFormatError (field `text`) for characters beyond Latin-1 or text too long for 64 × 64.
 */
export function encodeDataMatrix(text: string): DataMatrixSymbol {
  const data = dataMatrixCodewords(text);
  const spec = SPECS.find((s) => s.dataCodewords >= data.length);
  if (!spec) throw new LabelFormatError(`the text needs ${data.length} codewords; the largest symbol here holds ${SPECS[SPECS.length - 1]?.dataCodewords}`, 'text');
  const cw = fullCodewords(data, spec);
  const regionData = (spec.size - 2 * spec.regions) / spec.regions;
  const n = regionData * spec.regions;
  let map = placements.get(spec.size);
  if (!map) {
    map = placement(n, n);
    placements.set(spec.size, map);
  }
  const bit = (r: number, c: number): number => {
    const v = (map as Int32Array)[r * n + c] as number;
    if (v === 1) return 1;
    if (v < 10) return 0;
    const codeword = cw[Math.floor(v / 10) - 1] as number;
    return (codeword >> (8 - (v % 10))) & 1;
  };
  const size = spec.size;
  const modules = new Uint8Array(size * size);
  const block = regionData + 2;
  for (let y = 0; y < size; y++) {
    const ry = y % block;
    for (let x = 0; x < size; x++) {
      const rx = x % block;
      let v: number;
      if (ry === block - 1) v = 1; // bottom finder edge
      else if (rx === 0) v = 1; // left finder edge
      else if (ry === 0) v = x % 2 === 0 ? 1 : 0; // top clock track
      else if (rx === block - 1) v = ry % 2 === 1 ? 1 : 0; // right clock track
      else v = bit(Math.floor(y / block) * regionData + ry - 1, Math.floor(x / block) * regionData + rx - 1);
      modules[y * size + x] = v;
    }
  }
  return { size, modules };
}
