import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import type { DataSource } from 'typeorm';
import { MRB_ACTION_LABELS, type DispositionView } from '../../../shared/api/disposition.ts';
import type { LotSummary } from '../../../shared/api/lot-results.ts';
import type { LotPlanResponse } from '../../../shared/api/sampling.ts';
import { lotSummary } from '../measurements/lot-summary.service.ts';
import { getLotPlan } from '../sampling/lot-plan.service.ts';
import { getDisposition } from './disposition.service.ts';

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
const PASS = '#2f7a47';
const INFO = '#2b5f8f';

/** The latin subset of Source Sans 3 lacks a few math signs: spell them out. */
export function pdfText(s: string): string {
  return s
    .replace(/≤/g, '<=')
    .replace(/≥/g, '>=')
    .replace(/−/g, '-')
    .replace(/x̄/g, 'mean')
    .replace(/∞/g, 'inf')
    .replace(/→/g, '->')
    .replace(/Ω/g, 'ohm')
    .replace(/²/g, '^2');
}

const fmt = (v: number | null | undefined, digits = 1) => (v === null || v === undefined || !Number.isFinite(v) ? '–' : v.toFixed(digits));

interface ReportData {
  plan: LotPlanResponse;
  summary: LotSummary;
  disposition: DispositionView;
  generatedAt: Date;
}

/** Collects the report's data: the plan used (the signed snapshot when signed), the statistics, the decision. */
export async function reportData(ds: DataSource, lotId: number): Promise<ReportData> {
  const [plan, summary, disposition] = await Promise.all([getLotPlan(ds, lotId), lotSummary(ds, lotId), getDisposition(ds, lotId)]);
  return { plan, summary, disposition, generatedAt: new Date() };
}

/**
 * The inspection report of a lot as a PDF: the lot and part, the plan used with its source, the
 * results at 25 °C, the hFE histogram drawn as vector shapes with the limit lines and gain-bin
 * edges, the yield per bin, and the disposition with who proposed and who signed.
 */
export function renderInspectionReport(data: ReportData): Promise<Buffer> {
  const { plan: ctx, summary: s, disposition: d } = data;
  const { lot, partType: p } = ctx;
  // Once signed, the plan and severity are those stored with the signature, not today's.
  const usedPlan = d.signature ? d.recommendation.plan : ctx.plan;
  const signedRec = d.signature ? d.recommendation : null;
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: 48, bottom: 56, left: 48, right: 48 },
    bufferPages: true,
    info: { Title: `Inspection report ${lot.code}`, Author: 'Binwright', Subject: `${p.partNumber} from ${lot.supplierName}` },
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
    if (doc.y > doc.page.height - 140) doc.addPage();
    doc.moveDown(0.6);
    doc.font('bold').fontSize(12).fillColor(INK).text(pdfText(t), left, doc.y);
    doc.moveTo(left, doc.y + 1).lineTo(left + width, doc.y + 1).lineWidth(0.5).strokeColor(RULE).stroke();
    doc.moveDown(0.35);
  };
  const pairs = (rows: [string, string][], colWidth = width / 2) => {
    const startY = doc.y;
    let y = startY;
    rows.forEach(([k, v], i) => {
      const col = i % 2;
      if (col === 0 && i > 0) y = doc.y + 2;
      const x = left + col * colWidth;
      doc.font('semibold').fontSize(8.5).fillColor(FAINT).text(pdfText(k).toUpperCase(), x, y, { width: colWidth - 10 });
      doc.font('regular').fontSize(10).fillColor(INK).text(pdfText(v), x, doc.y, { width: colWidth - 10 });
      if (col === 0) doc.y = Math.max(doc.y, y);
    });
    doc.x = left;
  };
  const para = (t: string, color = SOFT, size = 9.5) => {
    doc.font('regular').fontSize(size).fillColor(color).text(pdfText(t), left, doc.y, { width });
  };

  // Title block
  doc.rect(left, 40, width, 4).fill(COPPER);
  doc.font('bold').fontSize(20).fillColor(INK).text(`Inspection report — ${lot.code}`, left, 52);
  doc.font('regular').fontSize(10).fillColor(SOFT).text(
    pdfText(`${p.partNumber} ${p.polarity}, ${p.description} · from ${lot.supplierName} · generated ${data.generatedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC by Binwright`),
    left,
    doc.y,
    { width },
  );

  heading('Lot and part');
  const limit = (min: number | null, max: number | null, unit = '') => (min === null && max === null ? 'none' : `${min ?? 'open'} … ${max ?? 'open'}${unit}`);
  pairs([
    ['Lot', `${lot.code} (${lot.status})`],
    ['Quantity', `${lot.quantity.toLocaleString('en')} parts`],
    ['Supplier lot / date code', `${lot.supplierLot ?? '–'} / ${lot.dateCode ?? '–'}`],
    ['Received', lot.receivedAt.slice(0, 10)],
    ['hFE test condition', `IC ${p.hfeIcMa} mA, VCE ${p.hfeVceV} V`],
    ['Vbe test condition', `IC ${p.vbeIcMa} mA`],
    ['hFE limits (25 °C)', limit(p.hfeMin, p.hfeMax)],
    ['Vbe limits (25 °C)', limit(p.vbeMinMv, p.vbeMaxMv, ' mV')],
    ['Temperature coefficients', `Vbe ${p.vbeTcMvPerC} mV/°C, hFE ${p.hfeTcPctPerC} %/°C`],
    ['ESD class (HBM)', p.esdHbmClass ?? 'not stated'],
  ]);

  heading('Sampling plan used');
  if (usedPlan) {
    const planLine =
      usedPlan.method === 'variables'
        ? `s-method on hFE, Z1.9 letter ${usedPlan.codeLetter}, n = ${usedPlan.sampleSize}, k = ${usedPlan.k}`
        : `code letter ${usedPlan.codeLetter}${usedPlan.planLetter !== usedPlan.codeLetter ? ` (arrow to ${usedPlan.planLetter})` : ''}, n = ${usedPlan.sampleSize}${usedPlan.hundredPercent ? ' (100 %)' : ''}, Ac ${usedPlan.accept} / Re ${usedPlan.reject}`;
    pairs([
      ['Method', usedPlan.method === 'attribute' ? 'Attribute, single sampling' : usedPlan.method === 'zero-acceptance' ? 'Zero acceptance (c = 0)' : 'Variables, s-method'],
      ['Level / AQL / severity', `${p.inspectionLevel} / ${p.aql} % / ${usedPlan.severity}`],
      ['Plan', planLine],
      signedRec
        ? ['Switching state when signed', signedRec.severity]
        : ['Switching state', `${ctx.switching.severity}: ${ctx.switching.reason}`],
    ]);
    doc.moveDown(0.2);
    para(`Source: ${usedPlan.source}`, SOFT, 8.5);
    for (const n of usedPlan.notes) para(`Note: ${n}`, FAINT, 8.5);
  } else {
    para(`No sampling plan applies: ${ctx.planError ?? 'unknown'}`, FAIL);
  }

  heading('Results (values referred to 25 °C)');
  para(
    `${s.n.toLocaleString('en')} parts measured; ${s.outsideLimits} outside the limits (hFE low ${s.outsideBy.hfeLow}, high ${s.outsideBy.hfeHigh}; Vbe low ${s.outsideBy.vbeLow}, high ${s.outsideBy.vbeHigh}).`,
    INK,
    10,
  );
  doc.moveDown(0.3);
  const cols = ['', 'mean', 's', 'min', 'p5', 'median', 'p95', 'max', 'Cp', 'Cpk'];
  const colW = width / cols.length;
  const tableRow = (cells: string[], font: string, color: string) => {
    const y = doc.y;
    cells.forEach((c, i) => doc.font(font).fontSize(9.5).fillColor(color).text(c, left + i * colW, y, { width: colW - 4, align: i === 0 ? 'left' : 'right' }));
    doc.y = y + 14;
  };
  tableRow(cols, 'semibold', FAINT);
  tableRow(['hFE', fmt(s.hfe.mean), fmt(s.hfe.sd, 2), fmt(s.hfe.min), fmt(s.hfe.p05), fmt(s.hfe.median), fmt(s.hfe.p95), fmt(s.hfe.max), fmt(s.hfe.cp, 2), fmt(s.hfe.cpk, 2)], 'regular', INK);
  tableRow(['Vbe (mV)', fmt(s.vbeMv.mean), fmt(s.vbeMv.sd, 2), fmt(s.vbeMv.min), fmt(s.vbeMv.p05), fmt(s.vbeMv.median), fmt(s.vbeMv.p95), fmt(s.vbeMv.max), fmt(s.vbeMv.cp, 2), fmt(s.vbeMv.cpk, 2)], 'regular', INK);
  doc.x = left;
  if (s.normality) {
    para(
      `Anderson–Darling (hFE): A^2 = ${s.normality.a2.toFixed(3)}, A*^2 = ${s.normality.a2Star.toFixed(3)}, p ${s.normality.pValueBand} — ${s.normality.normalAt5 ? 'normality not rejected at 5 %' : 'not normal at 5 %: look for mixed date codes'}. Cp/Cpk per NIST/SEMATECH e-Handbook §6.1.6 (one-sided where a limit is open).`,
      SOFT,
      8.5,
    );
  }

  if (s.n > 0 && s.histogram.counts.length) {
    if (doc.y > doc.page.height - 260) doc.addPage();
    doc.moveDown(0.6);
    drawHistogram(doc, s, left, doc.y, width, 180);
  }

  if (s.bins.length) {
    heading('Yield per gain bin');
    const bw = width / 4;
    const y0 = doc.y;
    ['Bin', 'hFE range', 'Parts', 'Yield'].forEach((h, i) => doc.font('semibold').fontSize(9).fillColor(FAINT).text(h, left + i * bw, y0, { width: bw - 6, align: i < 2 ? 'left' : 'right' }));
    doc.y = y0 + 13;
    for (const b of [...s.bins, { code: '', label: 'outside all bins', hfeMin: NaN, hfeMax: NaN, count: s.outsideBins, yieldPct: s.n ? (100 * s.outsideBins) / s.n : 0 }]) {
      const y = doc.y;
      const cells = [`${b.code} ${b.label}`.trim(), Number.isFinite(b.hfeMin) ? `${b.hfeMin} – ${b.hfeMax}` : '', b.count.toLocaleString('en'), `${b.yieldPct.toFixed(1)} %`];
      cells.forEach((c, i) => doc.font('regular').fontSize(9.5).fillColor(INK).text(pdfText(c), left + i * bw, y, { width: bw - 6, align: i < 2 ? 'left' : 'right' }));
      doc.y = y + 13;
    }
    doc.x = left;
  }

  heading('Disposition');
  const rec = signedRec ?? d.recommendation;
  para(`Recommendation: ${rec.decision.toUpperCase()} — ${rec.reason}`, INK, 10);
  if (d.proposal) {
    doc.moveDown(0.2);
    para(
      `Proposed by ${d.proposal.by.name} on ${d.proposal.by.at.slice(0, 16).replace('T', ' ')} UTC: ${d.proposal.decision}${d.proposal.mrbAction ? ` (${MRB_ACTION_LABELS[d.proposal.mrbAction]})` : ''} — ${d.proposal.reason}`,
    );
  }
  doc.moveDown(0.4);
  if (doc.y + 80 > doc.page.height - doc.page.margins.bottom) doc.addPage();
  if (d.signature) {
    const sig = d.signature;
    const colour = sig.decision === 'accept' ? PASS : sig.decision === 'reject' ? FAIL : INFO;
    const boxY = doc.y;
    doc.rect(left, boxY, width, 58).lineWidth(1).strokeColor(colour).stroke();
    doc.font('bold').fontSize(14).fillColor(colour).text(`${sig.decision.toUpperCase()}${sig.mrbAction ? ` — MRB: ${MRB_ACTION_LABELS[sig.mrbAction]}` : ''}`, left + 10, boxY + 8, { width: width - 20 });
    doc.font('regular').fontSize(9.5).fillColor(INK).text(pdfText(`Signed by ${sig.by.name} (quality engineer) on ${sig.by.at.slice(0, 16).replace('T', ' ')} UTC. Reason: ${sig.reason}`), left + 10, doc.y + 2, { width: width - 20 });
    doc.y = Math.max(doc.y, boxY + 58) + 6;
  } else {
    para('NOT SIGNED — this is a draft. A quality engineer signs the disposition.', FAIL, 10);
  }
  doc.x = left;

  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.height - 36;
    doc.page.margins.bottom = 0;
    doc.font('regular').fontSize(8).fillColor(FAINT);
    doc.text(`Binwright recommends; qualified people decide. Lot ${lot.code}.`, left, bottom, { width: width - 60, lineBreak: false });
    doc.text(`Page ${i + 1} of ${range.count}`, left + width - 60, bottom, { width: 60, align: 'right', lineBreak: false });
  }
  doc.end();
  return done;
}

/** hFE histogram as vector shapes: bars, limit lines (dashed) and gain-bin edges (dotted). */
function drawHistogram(doc: PDFKit.PDFDocument, s: LotSummary, x: number, y: number, w: number, h: number): void {
  const { edges, counts } = s.histogram;
  const binEdges = s.bins.length ? [s.bins[0].hfeMin, ...s.bins.map((b) => b.hfeMax)] : [];
  const limits = [s.limits.hfeMin, s.limits.hfeMax].filter((v): v is number => v !== null);
  let lo = Math.min(edges[0], ...limits, ...binEdges);
  let hi = Math.max(edges[edges.length - 1], ...limits, ...binEdges);
  const pad = (hi - lo) * 0.04 || 1;
  lo -= pad;
  hi += pad;
  const plotX = x + 34;
  const plotW = w - 40;
  const plotY = y + 30;
  const plotH = h - 54;
  const sx = (v: number) => plotX + ((v - lo) / (hi - lo)) * plotW;
  const maxCount = Math.max(1, ...counts);
  const sy = (c: number) => plotY + plotH - (c / maxCount) * plotH;

  doc.font('semibold').fontSize(9.5).fillColor(INK).text(`hFE at 25 °C — histogram (${s.histogram.rule}), n = ${s.n.toLocaleString('en')}`, x, y);
  doc.lineWidth(0.5).strokeColor(RULE);
  for (let k = 0; k <= 4; k++) {
    const c = (maxCount * k) / 4;
    doc.moveTo(plotX, sy(c)).lineTo(plotX + plotW, sy(c)).stroke();
    doc.font('regular').fontSize(7).fillColor(FAINT).text(String(Math.round(c)), x, sy(c) - 3, { width: 30, align: 'right' });
  }
  counts.forEach((c, i) => {
    if (!c) return;
    const x0 = sx(edges[i]);
    const x1 = sx(edges[i + 1]);
    doc.rect(x0, sy(c), Math.max(0.6, x1 - x0 - 0.4), plotY + plotH - sy(c)).fill(COPPER);
  });
  doc.moveTo(plotX, plotY + plotH).lineTo(plotX + plotW, plotY + plotH).lineWidth(0.8).strokeColor(INK).stroke();
  for (const e of binEdges) {
    doc.moveTo(sx(e), plotY).lineTo(sx(e), plotY + plotH).lineWidth(0.6).dash(1.5, { space: 2 }).strokeColor(INFO).stroke().undash();
  }
  for (const [v, name] of [[s.limits.hfeMin, 'min'], [s.limits.hfeMax, 'max']] as const) {
    if (v === null) continue;
    doc.moveTo(sx(v), plotY - 4).lineTo(sx(v), plotY + plotH).lineWidth(1.2).dash(4, { space: 3 }).strokeColor(FAIL).stroke().undash();
    doc.font('semibold').fontSize(7.5).fillColor(FAIL).text(`${name} ${v}`, sx(v) - 30, plotY - 13, { width: 60, align: 'center' });
  }
  const ticks = 6;
  for (let k = 0; k <= ticks; k++) {
    const v = lo + ((hi - lo) * k) / ticks;
    doc.font('regular').fontSize(7).fillColor(FAINT).text(v.toFixed(0), sx(v) - 20, plotY + plotH + 3, { width: 40, align: 'center' });
  }
  const legendY = plotY + plotH + 14;
  doc.rect(plotX, legendY + 2, 8, 6).fill(COPPER);
  doc.font('regular').fontSize(7.5).fillColor(SOFT).text('parts per class', plotX + 11, legendY, { lineBreak: false });
  doc.moveTo(plotX + 90, legendY + 5).lineTo(plotX + 104, legendY + 5).lineWidth(1.2).dash(4, { space: 3 }).strokeColor(FAIL).stroke().undash();
  doc.text('hFE limits', plotX + 107, legendY, { lineBreak: false });
  if (binEdges.length) {
    doc.moveTo(plotX + 160, legendY + 5).lineTo(plotX + 174, legendY + 5).lineWidth(0.6).dash(1.5, { space: 2 }).strokeColor(INFO).stroke().undash();
    doc.text('gain-bin edges', plotX + 177, legendY, { lineBreak: false });
  }
  doc.x = x;
  doc.y = y + h + 4;
}
