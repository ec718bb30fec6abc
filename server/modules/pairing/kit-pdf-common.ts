import PDFDocument from 'pdfkit';
import { sourceSans } from '../lots/traveler/fonts.ts';

export const MM = 72 / 25.4;
export type Doc = PDFKit.PDFDocument;

/**
 * A pdfkit document with Source Sans 3 (Regular, Bold) registered and embedded, collecting its
 * bytes. `creationDate` goes into the info and file id, so the same kit gives the same bytes.
 */
export function newDocument(size: [number, number], info: { title: string; subject: string; creationDate: Date }): { doc: Doc; done: Promise<Buffer> } {
  const fonts = sourceSans();
  const doc = new PDFDocument({
    size,
    margin: 0,
    autoFirstPage: false,
    info: { Title: info.title, Author: 'Binwright', Subject: info.subject, CreationDate: info.creationDate, ModDate: info.creationDate },
  });
  doc.registerFont('Regular', fonts.regular);
  doc.registerFont('Bold', fonts.bold);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  return { doc, done };
}

/** Largest font size ≤ `size` (≥ `min`) at which `text` fits `width`. */
export function fitSize(doc: Doc, font: string, text: string, width: number, size: number, min = 4): number {
  doc.font(font);
  let s = size;
  while (s > min && doc.fontSize(s).widthOfString(text) > width) s -= 0.25;
  return s;
}

/** One line of text shrunk to fit `width`; returns the size used. */
export function fitLine(doc: Doc, font: string, text: string, x: number, y: number, width: number, size: number, color = '#000000'): number {
  const s = fitSize(doc, font, text, width, size);
  doc.font(font).fontSize(s).fillColor(color).text(text, x, y, { lineBreak: false });
  return s;
}

export const fmtNum = (v: number, digits: number): string => (Number.isFinite(v) ? v.toFixed(digits) : '—');

/** "2026-12-01 14:05 UTC" */
export const fmtTime = (iso: string | null): string => (iso ? `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC` : '—');
