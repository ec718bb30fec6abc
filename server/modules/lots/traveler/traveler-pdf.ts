import PDFDocument from 'pdfkit';
import { TRAVELER_STOCKS, type LotDetail, type TravelerStockId } from '../../../../shared/api/lots.ts';
import { MSL_FLOOR_LIFE, normaliseMslLevel } from '../../../../shared/domain/moisture/index.ts';
import { drawCode128, drawDataMatrix } from './barcodes.ts';
import { sourceSans } from './fonts.ts';

const MM = 72 / 25.4;
const INK = '#000000';
const SOFT = '#444444';

type Doc = PDFKit.PDFDocument;

interface Marks {
  esdTag: string;
  esdLine: string;
  mslTag: string | null;
  mslLine: string | null;
}

/** The ESD and MSL marks of the traveler, in our own wording (cautions defer to local procedure). */
export function travelerMarks(lot: LotDetail): Marks {
  const esdClass = lot.partType.esdHbmClass;
  const esdTag = esdClass ? `ESD ${esdClass}` : 'ESD';
  const esdLine = esdClass
    ? `ESD SENSITIVE — HBM class ${esdClass}${lot.esd ? ` (${lot.esd.range})` : ''}. Handle at an ESD-protected workstation.`
    : 'ESD SENSITIVE — HBM class not stated. Handle at an ESD-protected workstation.';
  const level = normaliseMslLevel(lot.msl ?? '') ?? normaliseMslLevel(lot.partType.msl);
  if (!level) return { esdTag, esdLine, mslTag: null, mslLine: null };
  const hours = MSL_FLOOR_LIFE[level].hours;
  const mslLine =
    level === '1'
      ? 'MSL 1 — floor life unlimited at ≤ 30 °C / 85 % RH.'
      : level === '2'
        ? 'MSL 2 — floor life one year at ≤ 30 °C / 60 % RH after bag opening.'
        : level === '6'
          ? 'MSL 6 — bake before use, then use within the time on the label (J-STD-033).'
          : `MSL ${level} — floor life ${hours} h after bag opening at ≤ 30 °C / 60 % RH; bake if exceeded (J-STD-033, local procedure).`;
  const mslTag = level === '6' ? 'MSL 6' : hours === null ? `MSL ${level}` : `MSL ${level} · ${hours >= 8760 ? '1 yr' : `${hours} h`}`;
  return { esdTag, esdLine, mslTag, mslLine };
}

/** Largest font size ≤ `size` (and ≥ `min`) at which `text` fits `width`. */
function fit(doc: Doc, font: string, text: string, width: number, size: number, min = 4): number {
  doc.font(font);
  let s = size;
  while (s > min && doc.fontSize(s).widthOfString(text) > width) s -= 0.25;
  return s;
}

function line(doc: Doc, font: string, text: string, x: number, y: number, width: number, size: number, color = INK): number {
  const s = fit(doc, font, text, width, size);
  doc.font(font).fontSize(s).fillColor(color).text(text, x, y, { lineBreak: false });
  return s;
}

/** A mark of our own design: a reversed tag (white on black) and a line of text in a bordered box. */
function markBox(doc: Doc, tag: string, text: string, x: number, y: number, w: number, h: number, scale: number) {
  const border = 1.2 * scale;
  doc.lineWidth(border).rect(x, y, w, h).stroke(INK);
  const tagSize = fit(doc, 'Bold', tag, w * 0.3, 11 * scale);
  const tagW = doc.font('Bold').fontSize(tagSize).widthOfString(tag) + 6 * scale;
  doc.rect(x, y, tagW, h).fill(INK);
  doc.font('Bold').fontSize(tagSize).fillColor('#ffffff').text(tag, x + 3 * scale, y + (h - tagSize) / 2, { lineBreak: false });
  const tx = x + tagW + 4 * scale;
  const tw = w - tagW - 8 * scale;
  doc.font('Regular').fontSize(7.5 * scale).fillColor(INK);
  const textH = doc.heightOfString(text, { width: tw });
  doc.text(text, tx, y + Math.max(1, (h - textH) / 2), { width: tw, height: h, lineBreak: true, ellipsis: true });
}

function fmtDate(iso: string): string {
  return iso.slice(0, 10);
}

function qty(n: number): string {
  return n.toLocaleString('en-GB').replace(/,/g, ' ');
}

/** Steps a sheet traveler lists for initials as the lot moves through receiving inspection. */
const ROUTE_STEPS = [
  'Received; label and quantity checked',
  'Documents checked (CoC, date code, MSL)',
  'Sample drawn and measured at the bench',
  'Disposition signed',
  'Binned, stored or released to the line',
];

/** A full traveler: header band, lot code, Code 128, Data Matrix with the fields, marks. */
function drawTall(doc: Doc, lot: LotDetail, x: number, y: number, w: number, h: number, printedAt: Date) {
  const s = Math.min(1.6, Math.max(1, w / (92 * MM)));
  const marks = travelerMarks(lot);
  let cy = y;

  const band = 8 * MM * s;
  doc.rect(x, cy, w, band).fill(INK);
  doc.font('Bold').fontSize(10 * s).fillColor('#ffffff').text('LOT TRAVELER', x + 3 * s, cy + (band - 10 * s * 1.25) / 2, { lineBreak: false });
  const right = `Binwright · received ${fmtDate(lot.receivedAt)}`;
  doc.font('Regular').fontSize(7.5 * s);
  doc.text(right, x + w - doc.widthOfString(right) - 3 * s, cy + (band - 7.5 * s * 1.25) / 2, { lineBreak: false });
  cy += band + 2.5 * MM * s;

  const codeSize = line(doc, 'Bold', lot.code, x, cy, w, 24 * s);
  cy += doc.font('Bold').fontSize(codeSize).currentLineHeight(true) + 1 * MM * s;

  const barH = 14 * MM * s;
  drawCode128(doc, lot.code, x, cy, w, barH);
  cy += barH + 4 * MM * s;

  const dm = 34 * MM * s;
  drawDataMatrix(doc, lot.code, x, cy, dm);
  const fx = x + dm + 4 * MM * s;
  const fw = w - dm - 4 * MM * s;
  const rows: [string, string][] = [
    ['Part', `${lot.partType.partNumber} — ${lot.partType.polarity}, ${lot.partType.packageName}`],
    ['Supplier', `${lot.supplier.name} (${lot.supplier.code})`],
    ['Quantity', `${qty(lot.quantity)} pcs`],
    ['Date code · country', `${lot.dateCode ?? '—'} · ${lot.countryOfOrigin ?? '—'}`],
    ['Supplier lot', lot.supplierLot ?? '—'],
    ['Purchase order', lot.purchaseOrder ?? '—'],
  ];
  let fy = cy;
  const rowH = 21 * s;
  for (const [label, value] of rows) {
    doc.font('Regular').fontSize(6.5 * s).fillColor(SOFT).text(label.toUpperCase(), fx, fy, { lineBreak: false });
    line(doc, 'Bold', value, fx, fy + 7.5 * s, fw, 10.5 * s);
    fy += rowH;
  }
  cy = Math.max(cy + dm, fy) + 1.5 * MM * s;
  line(doc, 'Regular', lot.partType.description, x, cy, w, 8 * s, SOFT);
  cy += 8 * s * 1.6 + 1 * MM * s;

  const markH = 11 * MM * s;
  markBox(doc, marks.esdTag, marks.esdLine, x, cy, w, markH, s);
  cy += markH + 2 * MM * s;
  if (marks.mslTag && marks.mslLine) {
    markBox(doc, marks.mslTag, marks.mslLine, x, cy, w, markH, s);
    cy += markH + 2.5 * MM * s;
    const opened = lot.bagOpenedAt
      ? `Dry bag opened: ${lot.bagOpenedAt.slice(0, 16).replace('T', ' ')} UTC`
      : 'Dry bag opened: ____________________ (date, time, initials)';
    line(doc, 'Regular', opened, x, cy, w, 9 * s);
    cy += 9 * s * 1.6;
  }

  const footerH = 7 * s * 1.4;
  const stepH = 8 * MM * Math.min(s, 1.1);
  if (y + h - footerH - cy > (ROUTE_STEPS.length + 1) * stepH + 6 * MM * s) {
    cy += 4 * MM * s;
    doc.font('Bold').fontSize(9 * s).fillColor(INK).text('ROUTE', x, cy, { lineBreak: false });
    const colDate = x + w * 0.64;
    const colInit = x + w * 0.84;
    doc.font('Regular').fontSize(6.5 * s).fillColor(SOFT);
    doc.text('DATE', colDate, cy + 2 * s, { lineBreak: false });
    doc.text('INITIALS', colInit, cy + 2 * s, { lineBreak: false });
    cy += 5 * MM * s;
    doc.lineWidth(0.6).moveTo(x, cy).lineTo(x + w, cy).stroke(INK);
    for (const step of ROUTE_STEPS) {
      line(doc, 'Regular', step, x, cy + (stepH - 9 * s * 1.25) / 2, colDate - x - 4 * s, 9 * s);
      cy += stepH;
      doc.lineWidth(0.4).moveTo(x, cy).lineTo(x + w, cy).stroke(SOFT);
    }
    doc.lineWidth(0.4).moveTo(colDate - 3 * s, cy - stepH * ROUTE_STEPS.length).lineTo(colDate - 3 * s, cy).stroke(SOFT);
    doc.moveTo(colInit - 3 * s, cy - stepH * ROUTE_STEPS.length).lineTo(colInit - 3 * s, cy).stroke(SOFT);
  }

  const footer = `Received by ${lot.receivedBy.name} · printed ${printedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
  const footY = Math.max(cy + 2 * s, y + h - footerH);
  if (footY + footerH <= y + h + 1) line(doc, 'Regular', footer, x, footY, w, 7 * s, SOFT);
}

/** A small label: Data Matrix and lines of text above, Code 128 across the bottom. */
function drawCompact(doc: Doc, lot: LotDetail, W: number, H: number, printedAt: Date) {
  const m = (H < 40 * MM ? 2 : 3) * MM;
  const marks = travelerMarks(lot);
  const barH = H * 0.22;
  const gap = 1 * MM;
  const topH = H - 2 * m - barH - gap;
  const dm = Math.min(topH, W * 0.36);
  drawDataMatrix(doc, lot.code, m, m, dm);
  drawCode128(doc, lot.code, m, H - m - barH, W - 2 * m, barH);

  const x = m + dm + 1.5 * MM;
  const w = W - x - m;
  const wide = H >= 40 * MM;
  const lines: { font: string; text: string; size: number; color?: string }[] = [
    { font: 'Bold', text: lot.code, size: 14 },
    { font: 'Bold', text: lot.partType.partNumber, size: 11 },
    ...(wide ? [{ font: 'Regular', text: `${lot.supplier.name} (${lot.supplier.code})`, size: 8 }] : []),
    { font: 'Regular', text: `Qty ${qty(lot.quantity)} · DC ${lot.dateCode ?? '—'}`, size: 8 },
    ...(wide ? [{ font: 'Regular', text: `Lot ${lot.supplierLot ?? '—'} · PO ${lot.purchaseOrder ?? '—'}`, size: 7, color: SOFT }] : []),
  ];
  const tagSize = wide ? 7.5 : 6;
  const needed = lines.reduce((a, l) => a + l.size * 1.12, 0) + tagSize * 1.6;
  const k = Math.min(1, topH / needed);
  let cy = m;
  for (const l of lines) {
    line(doc, l.font, l.text, x, cy, w, l.size * k, l.color);
    cy += l.size * k * 1.12;
  }
  // Marks: reversed tags of our own design.
  let tx = x;
  const ts = tagSize * k;
  for (const tag of [marks.esdTag, marks.mslTag].filter((t): t is string => Boolean(t))) {
    const tw = doc.font('Bold').fontSize(ts).widthOfString(tag) + 3;
    if (tx + tw > W - m) break;
    doc.rect(tx, cy, tw, ts * 1.35).fill(INK);
    doc.font('Bold').fontSize(ts).fillColor('#ffffff').text(tag, tx + 1.5, cy + ts * 0.15, { lineBreak: false });
    tx += tw + 2;
  }
  if (wide && marks.mslLine) {
    const caution = lot.bagOpenedAt ? `Bag opened ${lot.bagOpenedAt.slice(0, 16).replace('T', ' ')} UTC` : 'Floor life starts at bag opening';
    line(doc, 'Regular', caution, tx + 1, cy + ts * 0.2, Math.max(10, W - m - tx - 1), ts * 0.95, SOFT);
  }
  void printedAt;
}

/** Renders the lot traveler on a label stock (mm) or an A4/Letter sheet, Source Sans 3 embedded. */
export function renderTraveler(lot: LotDetail, stockId: TravelerStockId, printedAt = new Date()): Promise<Buffer> {
  const stock = TRAVELER_STOCKS.find((s) => s.id === stockId) ?? TRAVELER_STOCKS[0];
  const W = stock.widthMm * MM;
  const H = stock.heightMm * MM;
  const fonts = sourceSans();
  const doc = new PDFDocument({
    size: [W, H],
    margin: 0,
    info: { Title: `Lot traveler ${lot.code}`, Author: 'Binwright', Subject: `${lot.partType.partNumber} from ${lot.supplier.name}`, CreationDate: printedAt },
  });
  doc.registerFont('Regular', fonts.regular);
  doc.registerFont('Bold', fonts.bold);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  if (stock.id === 'a4' || stock.id === 'letter') {
    const margin = 15 * MM;
    const w = Math.min(W - 2 * margin, 130 * MM);
    drawTall(doc, lot, (W - w) / 2, margin, w, H - 2 * margin, printedAt);
  } else if (stock.heightMm >= 100) {
    const margin = 4 * MM;
    drawTall(doc, lot, margin, margin, W - 2 * margin, H - 2 * margin, printedAt);
  } else {
    drawCompact(doc, lot, W, H, printedAt);
  }
  doc.end();
  return done;
}
