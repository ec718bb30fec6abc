import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import { NCR_STATUS_LABELS, type NcrStatus } from '../../../shared/api/supplier-quality.ts';
import type { LotFacts } from './ncr-facts.ts';

const require = createRequire(import.meta.url);
const FONT = {
  regular: require.resolve('@fontsource/source-sans-3/files/source-sans-3-latin-400-normal.woff'),
  semibold: require.resolve('@fontsource/source-sans-3/files/source-sans-3-latin-600-normal.woff'),
  bold: require.resolve('@fontsource/source-sans-3/files/source-sans-3-latin-700-normal.woff'),
};

const INK = '#1f2a33';
const SOFT = '#4a5661';
const FAINT = '#7b858d';
const RULE = '#d9d6cc';
const COPPER = '#b5652b';
const FAIL = '#b3261e';

/** The latin subset of Source Sans 3 lacks a few signs: spell them out. */
function pdfText(s: string): string {
  return s
    .replace(/≤/g, '<=')
    .replace(/≥/g, '>=')
    .replace(/−/g, '-')
    .replace(/±/g, '+/-')
    .replace(/→/g, '->')
    .replace(/x̄/g, 'mean')
    .replace(/\u2009/g, ' ');
}

export interface NcrPdfData {
  code: string;
  status: NcrStatus;
  createdAt: Date;
  createdBy: string;
  dueDate: string;
  findings: string;
  disposition: string;
  correctiveAction: string;
  recipient: { name: string; email: string } | null;
  answer: { text: string; by: string; at: Date; documentName: string } | null;
  facts: LotFacts;
  generatedAt: Date;
}

/**
 * The nonconformance report as a PDF (A4): who it is for, the lot and part, what was found (with
 * the figures), the disposition, the corrective action requested and its due date, and, once
 * recorded, the supplier's answer. Text is Source Sans 3 (latin WOFF subset of @fontsource).
 */
export function renderNcrPdf(d: NcrPdfData): Promise<Buffer> {
  const { lot, supplier, partType: p } = d.facts;
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: 48, bottom: 56, left: 52, right: 52 },
    bufferPages: true,
    info: { Title: `Nonconformance report ${d.code}`, Author: 'Binwright', Subject: `${p.partNumber} lot ${lot.code} from ${supplier.name}` },
  });
  doc.registerFont('regular', FONT.regular);
  doc.registerFont('semibold', FONT.semibold);
  doc.registerFont('bold', FONT.bold);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const left = doc.page.margins.left;
  const width = doc.page.width - left - doc.page.margins.right;

  const heading = (t: string) => {
    if (doc.y > doc.page.height - 150) doc.addPage();
    doc.moveDown(0.7);
    doc.font('bold').fontSize(12).fillColor(INK).text(pdfText(t), left, doc.y);
    doc.moveTo(left, doc.y + 1).lineTo(left + width, doc.y + 1).lineWidth(0.5).strokeColor(RULE).stroke();
    doc.moveDown(0.4);
  };
  const para = (t: string, color = INK, size = 10) => doc.font('regular').fontSize(size).fillColor(color).text(pdfText(t), left, doc.y, { width, lineGap: 1.5 });
  const pairs = (rows: [string, string][]) => {
    const col = width / 3;
    for (let i = 0; i < rows.length; i += 3) {
      const y = doc.y;
      let bottom = y;
      rows.slice(i, i + 3).forEach(([k, v], j) => {
        const x = left + j * col;
        doc.font('semibold').fontSize(8).fillColor(FAINT).text(pdfText(k).toUpperCase(), x, y, { width: col - 10 });
        doc.font('regular').fontSize(10).fillColor(INK).text(pdfText(v), x, doc.y, { width: col - 10 });
        bottom = Math.max(bottom, doc.y);
      });
      doc.y = bottom + 4;
    }
    doc.x = left;
  };

  // Title block
  doc.rect(left, 40, width, 4).fill(COPPER);
  doc.font('bold').fontSize(20).fillColor(INK).text(`Nonconformance report ${d.code}`, left, 54, { width });
  doc
    .font('regular')
    .fontSize(10)
    .fillColor(SOFT)
    .text(pdfText(`To ${supplier.name} (${supplier.code})${d.recipient ? `, attn. ${d.recipient.name} <${d.recipient.email}>` : ''}`), left, doc.y, { width });
  doc.text(pdfText(`Raised ${d.createdAt.toISOString().slice(0, 10)} by ${d.createdBy} · status ${NCR_STATUS_LABELS[d.status]}`), left, doc.y, { width });

  doc.moveDown(0.6);
  const boxY = doc.y;
  doc.rect(left, boxY, width, 34).lineWidth(1).strokeColor(FAIL).stroke();
  doc.font('bold').fontSize(11).fillColor(FAIL).text(pdfText(`Corrective action requested by ${d.dueDate}`), left + 10, boxY + 6, { width: width - 20 });
  doc.font('regular').fontSize(9).fillColor(SOFT).text(`Please answer with your root cause and corrective action, quoting ${d.code}.`, left + 10, doc.y, { width: width - 20 });
  doc.y = boxY + 42;

  heading('Lot and part');
  pairs([
    ['Our lot', lot.code],
    ['Supplier lot', lot.supplierLot ?? 'not stated'],
    ['Date code', lot.dateCode ?? 'not stated'],
    ['Part', `${p.partNumber} (${p.polarity})`],
    ['Supplier part number', lot.supplierPartNumber ?? 'not stated'],
    ['Purchase order', lot.purchaseOrder ?? 'not stated'],
    ['Quantity', String(lot.quantity)],
    ['Received', lot.receivedAt.toISOString().slice(0, 10)],
    ['Country of origin', lot.countryOfOrigin ?? 'not stated'],
  ]);
  para(p.description, SOFT, 9);

  heading('Findings');
  for (const line of d.findings.split('\n')) {
    para(line);
    doc.moveDown(0.25);
  }
  const s = d.facts.sample;
  if (s.hfe) {
    doc.moveDown(0.3);
    pairs([
      ['Sample size', String(s.n)],
      ['Outside limits', `${s.outside} of ${s.n}`],
      ['hFE limits', `${p.hfeMin ?? 'open'} to ${p.hfeMax ?? 'open'}`],
      ['hFE mean / sd', `${s.hfe.mean.toFixed(1)} / ${s.hfe.sd?.toFixed(1) ?? '-'}`],
      ['hFE min / max', `${s.hfe.min.toFixed(1)} / ${s.hfe.max.toFixed(1)}`],
      ['hFE median', s.hfe.median.toFixed(1)],
    ]);
  }
  const a = d.facts.alert;
  if (a) {
    const f = a.figures;
    pairs([
      ['KS D / p', f.ks ? `${f.ks.d.toFixed(3)} / ${f.ks.pValue < 0.0001 ? '< 0.0001' : f.ks.pValue.toFixed(4)}` : 'not computed'],
      ['Median shift', f.median.shiftPct !== null ? `${f.median.shiftPct > 0 ? '+' : ''}${f.median.shiftPct.toFixed(1)} %` : 'not computed'],
      ['Bimodality b', f.bimodality ? f.bimodality.b.toFixed(3) : 'not computed'],
    ]);
    para('Readings compared with the parts of earlier lots of this part from you that we accepted. These figures are a reason to investigate, not a finding on the origin of the parts.', SOFT, 8.5);
  }

  heading('Disposition');
  para(d.disposition);

  heading('Corrective action requested');
  para(d.correctiveAction);
  doc.moveDown(0.2);
  para(`Due date: ${d.dueDate}`, INK, 10);

  if (d.answer) {
    heading('Supplier answer');
    para(d.answer.text);
    doc.moveDown(0.2);
    para(`Recorded ${d.answer.at.toISOString().slice(0, 10)} by ${d.answer.by}; document: ${d.answer.documentName}`, SOFT, 9);
  }

  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const y = doc.page.height - 40;
    // The footer sits in the bottom margin: without this pdfkit would start a new page for it.
    doc.page.margins.bottom = 0;
    doc.font('regular').fontSize(8).fillColor(FAINT);
    doc.text(pdfText(`${d.code} · lot ${lot.code} · generated ${d.generatedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC by Binwright`), left, y, { width: width - 80, lineBreak: false });
    doc.text(`Page ${i - range.start + 1} of ${range.count}`, left + width - 80, y, { width: 80, align: 'right', lineBreak: false });
  }
  doc.end();
  return done;
}
