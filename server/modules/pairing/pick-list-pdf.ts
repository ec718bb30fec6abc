import type { KitDetail, KitPartLine } from '../../../shared/api/pairing.ts';
import { HFE_TOLERANCE_DEFINITION, KIT_STATUS_LABELS } from '../../../shared/api/pairing.ts';
import { pullProgress } from '../../../shared/domain/kitting/index.ts';
import { drawCode128 } from '../lots/traveler/barcodes.ts';
import { MM, fitLine, fmtNum, fmtTime, newDocument, type Doc } from './kit-pdf-common.ts';

const W = 210 * MM;
const H = 297 * MM;
const M = 14 * MM;
const SOFT = '#444444';
const RULE = '#999999';

interface Column {
  title: string;
  width: number;
  align?: 'left' | 'right' | 'center';
  value: (p: KitPartLine, i: number) => string;
}

const COLUMNS: Column[] = [
  { title: '#', width: 8 * MM, align: 'right', value: (_p, i) => String(i + 1) },
  { title: 'Location', width: 30 * MM, value: (p) => p.location },
  { title: 'Container', width: 30 * MM, value: (p) => p.containerCode },
  { title: 'Pos.', width: 10 * MM, align: 'right', value: (p) => String(p.position) },
  { title: 'Set', width: 9 * MM, align: 'right', value: (p) => String(p.setIndex) },
  { title: 'Part', width: 24 * MM, value: (p) => `${p.partNumber}` },
  { title: 'Lot / supplier lot', width: 33 * MM, value: (p) => `${p.lotCode} / ${p.supplierLot ?? '—'}` },
  { title: 'hFE', width: 11 * MM, align: 'right', value: (p) => fmtNum(p.hfe25, 1) },
  { title: 'Vbe mV', width: 13 * MM, align: 'right', value: (p) => fmtNum(p.vbeMv25, 1) },
  { title: 'Pulled', width: 14 * MM, align: 'center', value: (p) => (p.pulledAt ? p.pulledAt.slice(11, 16) : '') },
];

function header(doc: Doc, kit: KitDetail, page: number): number {
  fitLine(doc, 'Bold', 'Pick list', M, M, 60 * MM, 18);
  fitLine(doc, 'Bold', kit.code, M, M + 22, 80 * MM, 14);
  drawCode128(doc, kit.code, W - M - 70 * MM, M, 70 * MM, 12 * MM);
  doc.font('Regular').fontSize(7).fillColor(SOFT).text(`${kit.code} · page ${page}`, W - M - 70 * MM, M + 13 * MM, { width: 70 * MM, align: 'center', lineBreak: false });
  return M + 17 * MM;
}

function tableHeader(doc: Doc, y: number): number {
  let x = M;
  doc.font('Bold').fontSize(7.5).fillColor('#000000');
  for (const c of COLUMNS) {
    doc.text(c.title, x + 1.5, y, { width: c.width - 3, align: c.align ?? 'left', lineBreak: false });
    x += c.width;
  }
  doc.moveTo(M, y + 11).lineTo(W - M, y + 11).lineWidth(0.8).stroke('#000000');
  return y + 14;
}

/**
 * The pick list of a kit as an A4 PDF: the request (part types, tolerances with their
 * definition, reservation end), every part ordered by storage location with its container,
 * position, set, lot and supplier lot and readings, a box to tick per part (or the pull time),
 * the sets with what their mismatch means in a circuit, and the ESD caution. Source Sans 3.
 */
export async function renderPickList(kit: KitDetail): Promise<Buffer> {
  const created = new Date(kit.createdAt);
  created.setUTCMilliseconds(0);
  const { doc, done } = newDocument([W, H], { title: `Pick list ${kit.code}`, subject: `Pick list of kit ${kit.code}`, creationDate: created });
  let page = 1;
  doc.addPage({ size: [W, H], margin: 0 });
  let y = header(doc, kit, page);
  const progress = pullProgress(kit.pickList);
  const facts: [string, string][] = [
    ['Part', kit.partTypes.map((p) => `${p.partNumber} (${p.polarity}) — ${p.description}`).join('; ')],
    ['Sets', `${kit.sets.length} × ${kit.setSize === 2 ? 'pair' : 'quad'}, ${kit.mode === 'complementary' ? 'complementary NPN + PNP' : 'same polarity'} · ${kit.parts} parts from ${new Set(kit.pickList.map((p) => p.containerId)).size} containers`],
    ['Tolerances', `hFE ${HFE_TOLERANCE_DEFINITION} with t = ${fmtNum(kit.hfeTolerancePct, 1)} %; |Vbe1 − Vbe2| ≤ ${fmtNum(kit.vbeToleranceMv, 2)} mV; readings at 25 °C`],
    ['Status', `${KIT_STATUS_LABELS[kit.status]} · ${progress.text} · reserved until ${fmtTime(kit.reservedUntil)}`],
    ['Requested', `${fmtTime(kit.createdAt)} by ${kit.createdByName}${kit.note ? ` · ${kit.note}` : ''}`],
  ];
  for (const [k, v] of facts) {
    doc.font('Bold').fontSize(8.5).fillColor('#000000').text(k, M, y, { width: 24 * MM, lineBreak: false });
    fitLine(doc, 'Regular', v, M + 24 * MM, y, W - 2 * M - 24 * MM, 8.5);
    y += 12;
  }
  y += 6;
  y = tableHeader(doc, y);
  const rowH = 13;
  kit.pickList.forEach((p, i) => {
    if (y + rowH > H - M - 16 * MM) {
      doc.addPage({ size: [W, H], margin: 0 });
      page++;
      y = tableHeader(doc, header(doc, kit, page));
    }
    let x = M;
    for (const c of COLUMNS) {
      const text = c.value(p, i);
      if (c.title === 'Pulled' && !p.pulledAt) {
        doc.rect(x + c.width / 2 - 4, y, 8, 8).lineWidth(0.8).stroke('#000000');
      } else {
        const size = Math.min(8, fitSizeFor(doc, c.title === 'Container' || c.title === 'Location' ? 'Bold' : 'Regular', text, c.width - 3));
        doc.font(c.title === 'Container' || c.title === 'Location' ? 'Bold' : 'Regular').fontSize(size).fillColor('#000000').text(text, x + 1.5, y, { width: c.width - 3, align: c.align ?? 'left', lineBreak: false });
      }
      x += c.width;
    }
    doc.moveTo(M, y + rowH - 3).lineTo(W - M, y + rowH - 3).lineWidth(0.3).stroke(RULE);
    y += rowH;
  });

  y += 10;
  if (y + 40 + kit.sets.length * 11 > H - M - 16 * MM) {
    doc.addPage({ size: [W, H], margin: 0 });
    page++;
    y = header(doc, kit, page);
  }
  fitLine(doc, 'Bold', 'Sets and what their mismatch means', M, y, 120 * MM, 10);
  y += 14;
  const setCols = ['Set', 'Parts', 'hFE spread', 'ΔVbe', 'Mirror IC1/IC2', 'Diff-pair offset', 'hFE ratio'];
  const setW = [10, 62, 20, 18, 26, 26, 20].map((v) => v * MM);
  let x = M;
  setCols.forEach((t, i) => {
    doc.font('Bold').fontSize(7.5).text(t, x + 1.5, y, { width: (setW[i] as number) - 3, lineBreak: false });
    x += setW[i] as number;
  });
  y += 11;
  for (const s of kit.sets) {
    const cells = [
      String(s.index),
      s.parts.map((p) => `${p.containerCode}/${p.position}`).join(', '),
      `${fmtNum(s.hfeSpreadPct, 2)} %`,
      `${fmtNum(s.vbeSpreadMv, 2)} mV`,
      `${fmtNum(s.meaning.mirrorRatio, 4)} (+${fmtNum(s.meaning.mirrorErrorPct, 2)} %)`,
      `${fmtNum(s.meaning.offsetMv, 2)} mV`,
      fmtNum(s.meaning.hfeRatio, 3),
    ];
    x = M;
    cells.forEach((t, i) => {
      const w = (setW[i] as number) - 3;
      doc.font('Regular').fontSize(Math.min(7.5, fitSizeFor(doc, 'Regular', t, w))).fillColor('#000000').text(t, x + 1.5, y, { width: w, lineBreak: false });
      x += setW[i] as number;
    });
    y += 11;
    if (y > H - M - 20 * MM) {
      doc.addPage({ size: [W, H], margin: 0 });
      page++;
      y = header(doc, kit, page);
    }
  }
  y += 6;
  doc
    .font('Regular')
    .fontSize(7)
    .fillColor(SOFT)
    .text(
      `Mirror IC1/IC2 = exp(ΔVbe/VT) with VT = ${fmtNum(kit.sets[0]?.meaning.vtMv ?? 25.693, 3)} mV at 25 °C, at equal saturation currents; a differential pair's input offset equals ΔVbe at equal currents. The hFE ratio is the smaller over the larger reading.`,
      M,
      y,
      { width: W - 2 * M },
    );
  const foot = H - M - 10 * MM;
  doc.rect(M, foot, W - 2 * M, 10 * MM).lineWidth(1).stroke('#000000');
  doc
    .font('Bold')
    .fontSize(8)
    .fillColor('#000000')
    .text('ESD sensitive parts: pull them at an ESD-protected workstation with a grounded wrist strap (ANSI/ESD S20.20), following your site\'s procedures. Confirm each pull by scanning the container and position on the kit\'s page.', M + 4, foot + 4, {
      width: W - 2 * M - 8,
    });
  doc.end();
  return done;
}

function fitSizeFor(doc: Doc, font: string, text: string, width: number): number {
  doc.font(font);
  let s = 8;
  while (s > 4 && doc.fontSize(s).widthOfString(text) > width) s -= 0.25;
  return s;
}
