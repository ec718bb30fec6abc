import PDFDocument from 'pdfkit';
import type { BinLabelStock } from '../../../shared/api/bins.ts';
import { OUTSIDE_BINS_CODE } from '../../../shared/api/bins.ts';
import { binColour } from '../../../shared/domain/binning/index.ts';
import { labelSlots } from '../../../shared/domain/screening/index.ts';
import { drawCode128 } from '../lots/traveler/barcodes.ts';
import { drawDataMatrixFast } from './draw-data-matrix.ts';
import { sourceSans } from '../lots/traveler/fonts.ts';

export const MM = 72 / 25.4;
const INK = '#000000';
const SOFT = '#333333';

type Doc = PDFKit.PDFDocument;

/** Everything printed on one bin label. */
export interface BinLabelContent {
  containerCode: string;
  /** null: parts outside all bins. */
  binCode: string | null;
  binLabel: string;
  /** Position of the bin in its scheme, for its colour; null outside. */
  binIndex: number | null;
  /** "100 ≤ hFE < 150" (or a note for the parts outside all bins). */
  interval: string;
  testCondition: string;
  partNumber: string;
  lotCode: string;
  supplierLot: string | null;
  quantity: number;
  /** Day the container was opened, YYYY-MM-DD. */
  date: string;
  inspector: string;
  /** The ISO/IEC 15434 format-06 message for the Data Matrix. */
  payload: string;
}

export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

/**
 * Where things sit on a label of w × h points: the colour band with the bin code on the left,
 * the Data Matrix at the top right, the text between, the Code 128 across the bottom. Exported
 * so tests can find the symbols in a rendering.
 */
export function binLabelGeometry(w: number, h: number): { pad: number; band: Box; dm: Box; text: Box; bar: Box; barText: Box } {
  const pad = (h < 36 * MM ? 1.6 : 2.5) * MM;
  const bandW = Math.max(12 * MM, w * 0.2);
  const codeTextH = Math.max(5.5, h * 0.065);
  const barH = h * (h < 36 * MM ? 0.2 : 0.19);
  const barBox: Box = { x: bandW + pad, y: h - pad - codeTextH - barH, w: w - bandW - 2 * pad, h: barH };
  const dmSize = Math.min(barBox.y - 2 * pad + pad * 0.5, (w - bandW - 2 * pad) * 0.42);
  const dm: Box = { x: w - pad - dmSize, y: pad, w: dmSize, h: dmSize };
  return {
    pad,
    band: { x: 0, y: 0, w: bandW, h },
    dm,
    text: { x: bandW + pad, y: pad, w: dm.x - bandW - 2 * pad, h: barBox.y - 2 * pad },
    bar: barBox,
    barText: { x: barBox.x, y: barBox.y + barH + 0.5, w: barBox.w, h: codeTextH },
  };
}

const charWidths = new Map<string, Map<string, number>>();

/**
 * Width of `text` at 1 pt from per-character advance widths, measured once per font and
 * character. Shaping a whole string in pdfkit (fontkit) is the costliest step of a large print
 * job; kerning is left out, which the 3 % margin in `fit` covers.
 */
function widthAt1(doc: Doc, font: string, text: string): number {
  let widths = charWidths.get(font);
  if (!widths) {
    widths = new Map();
    charWidths.set(font, widths);
  }
  let w = 0;
  for (const ch of text) {
    let cw = widths.get(ch);
    if (cw === undefined) {
      cw = doc.font(font).fontSize(1).widthOfString(ch);
      widths.set(ch, cw);
    }
    w += cw;
  }
  return w;
}

/** Largest font size ≤ `size` (≥ `min`) at which `text` fits `width`; widths grow linearly with size. */
function fit(doc: Doc, font: string, text: string, width: number, size: number, min = 3.5): number {
  const w1 = widthAt1(doc, font, text) * 1.03;
  if (w1 <= 0) return size;
  return Math.max(min, Math.min(size, Math.floor((width / w1) * 4) / 4));
}

function line(doc: Doc, font: string, text: string, x: number, y: number, width: number, size: number, color = INK): number {
  const s = fit(doc, font, text, width, size);
  doc.font(font).fontSize(s).fillColor(color).text(text, x, y, { lineBreak: false });
  return s;
}

function drawLabel(doc: Doc, l: BinLabelContent, ox: number, oy: number, w: number, h: number): void {
  const g = binLabelGeometry(w, h);
  const colour = binColour(l.binCode === null ? null : l.binIndex);
  const compact = h < 40 * MM;

  // The colour band always carries the bin code (or OUT) in large type and the word BIN.
  doc.rect(ox, oy, g.band.w, h).fill(colour.fill);
  const code = l.binCode ?? OUTSIDE_BINS_CODE;
  const inner = g.band.w - 2 * g.pad * 0.6;
  const codeSize = fit(doc, 'Bold', code, inner, Math.min(h * 0.42, 40));
  const word = l.binCode === null ? 'OUTSIDE' : 'BIN';
  const wordSize = fit(doc, 'Bold', word, inner, Math.min(h * 0.11, 9));
  const blockH = wordSize * 1.2 + codeSize;
  const by = oy + (h - blockH) / 2;
  doc.font('Bold').fontSize(wordSize).fillColor(colour.text).text(word, ox, by, { width: g.band.w, align: 'center', lineBreak: false });
  doc.font('Bold').fontSize(codeSize).fillColor(colour.text).text(code, ox, by + wordSize * 1.2, { width: g.band.w, align: 'center', lineBreak: false });

  drawDataMatrixFast(doc, l.payload, ox + g.dm.x, oy + g.dm.y, g.dm.w);
  drawCode128(doc, l.containerCode, ox + g.bar.x, oy + g.bar.y, g.bar.w, g.bar.h);
  const ct = fit(doc, 'Bold', l.containerCode, g.barText.w, g.barText.h);
  doc.font('Bold').fontSize(ct).fillColor(INK).text(l.containerCode, ox + g.barText.x, oy + g.barText.y, { width: g.barText.w, align: 'center', lineBreak: false });

  const t = g.text;
  const lines: { font: string; text: string; size: number; color?: string }[] = compact
    ? [
        { font: 'Bold', text: l.binLabel, size: 9 },
        { font: 'Regular', text: l.interval, size: 6.5 },
        { font: 'Regular', text: l.testCondition, size: 5.5, color: SOFT },
        { font: 'Bold', text: l.partNumber, size: 8 },
        { font: 'Regular', text: `Lot ${l.lotCode} · Sup. lot ${l.supplierLot ?? '—'}`, size: 6 },
        { font: 'Regular', text: `Qty ${l.quantity} · ${l.date} · ${l.inspector}`, size: 6 },
      ]
    : [
        { font: 'Bold', text: l.binLabel, size: 12 },
        { font: 'Regular', text: l.interval, size: 9 },
        { font: 'Regular', text: l.testCondition, size: 7.5, color: SOFT },
        { font: 'Bold', text: l.partNumber, size: 11 },
        { font: 'Regular', text: `Our lot ${l.lotCode}`, size: 7.5 },
        { font: 'Regular', text: `Supplier lot ${l.supplierLot ?? '—'}`, size: 7.5 },
        { font: 'Bold', text: `Qty ${l.quantity} pcs`, size: 9 },
        { font: 'Regular', text: `${l.date} · Inspector ${l.inspector}`, size: 7, color: SOFT },
      ];
  const needed = lines.reduce((a, x) => a + x.size * 1.12, 0);
  const k = Math.min(1.4, t.h / needed);
  let cy = oy + t.y;
  for (const x of lines) {
    line(doc, x.font, x.text, ox + t.x, cy, t.w, x.size * k, x.color);
    cy += x.size * k * 1.12;
  }
}

/**
 * Renders bin labels into one PDF: one label per page on a roll, or a grid on a sheet starting
 * at `startPosition` (cells before it are left blank). Source Sans 3 is embedded. `creationDate`
 * goes into the PDF's info and file id, so the same input always gives the same bytes.
 */
export function renderBinLabels(labels: readonly BinLabelContent[], stock: BinLabelStock, startPosition: number, creationDate: Date): Promise<Buffer> {
  const fonts = sourceSans();
  const W = stock.pageWidthMm * MM;
  const H = stock.pageHeightMm * MM;
  const cw = stock.labelWidthMm * MM;
  const ch = stock.labelHeightMm * MM;
  const doc = new PDFDocument({
    size: [W, H],
    margin: 0,
    autoFirstPage: false,
    info: { Title: `Bin labels (${labels.length})`, Author: 'Binwright', Subject: `Bin labels on ${stock.label}`, CreationDate: creationDate, ModDate: creationDate },
  });
  doc.registerFont('Regular', fonts.regular);
  doc.registerFont('Bold', fonts.bold);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const slots = labelSlots(labels.length, stock.columns * stock.rows, startPosition);
  let page = -1;
  slots.forEach((slot, i) => {
    while (page < slot.page) {
      doc.addPage({ size: [W, H], margin: 0 });
      page++;
    }
    const col = slot.cell % stock.columns;
    const row = Math.floor(slot.cell / stock.columns);
    const x = (stock.marginLeftMm + col * (stock.labelWidthMm + stock.gapXMm)) * MM;
    const y = (stock.marginTopMm + row * (stock.labelHeightMm + stock.gapYMm)) * MM;
    doc.save();
    doc.rect(x, y, cw, ch).clip();
    drawLabel(doc, labels[i] as BinLabelContent, x, y, cw, ch);
    doc.restore();
  });
  if (page < 0) doc.addPage({ size: [W, H], margin: 0 });
  doc.end();
  return done;
}
