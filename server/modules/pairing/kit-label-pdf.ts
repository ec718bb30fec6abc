import type { KitDetail } from '../../../shared/api/pairing.ts';
import { kitLabelPayload, type KitLabelPayload } from '../../../shared/domain/kitting/index.ts';
import { drawDataMatrixFast } from '../bins/draw-data-matrix.ts';
import { drawCode128 } from '../lots/traveler/barcodes.ts';
import { MM, fitLine, fmtNum, newDocument } from './kit-pdf-common.ts';

export const KIT_LABEL_WIDTH_MM = 100;
export const KIT_LABEL_HEIGHT_MM = 50;

export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** Where the symbols sit on the 100 × 50 mm kit label (points), exported so tests can crop them. */
export function kitLabelGeometry(): { pad: number; dm: Box; text: Box; bar: Box; barText: Box } {
  const W = KIT_LABEL_WIDTH_MM * MM;
  const H = KIT_LABEL_HEIGHT_MM * MM;
  const pad = 2.5 * MM;
  const barH = 9 * MM;
  const codeTextH = 3.2 * MM;
  const bar: Box = { x: pad, y: H - pad - codeTextH - barH, w: W - 2 * pad, h: barH };
  const dmSize = bar.y - pad - 1.5 * MM;
  const dm: Box = { x: W - pad - dmSize, y: pad, w: dmSize, h: dmSize };
  return { pad, dm, text: { x: pad, y: pad, w: dm.x - 2 * pad, h: dmSize }, bar, barText: { x: bar.x, y: bar.y + barH + 0.4 * MM, w: bar.w, h: codeTextH } };
}

/** The Data Matrix message of a kit: T kit code, P part number(s), Q parts, 11Z part references. */
export function kitLabelMessage(kit: KitDetail): KitLabelPayload {
  return kitLabelPayload({
    kitCode: kit.code,
    partNumbers: kit.partNumbers,
    parts: kit.pickList.map((p) => ({ containerCode: p.containerCode, position: p.position })),
  });
}

/**
 * The kit label, 100 × 50 mm: kit code, part(s), sets and tolerances, worst mismatch, a Data
 * Matrix (ISO/IEC 15434 format 06, Macro 06) naming the kit and its parts, and a Code 128 of the
 * kit code. Source Sans 3 embedded; the creation date is the kit's, so a reprint is identical.
 */
export async function renderKitLabel(kit: KitDetail): Promise<{ pdf: Buffer; payload: KitLabelPayload }> {
  const payload = kitLabelMessage(kit);
  const W = KIT_LABEL_WIDTH_MM * MM;
  const H = KIT_LABEL_HEIGHT_MM * MM;
  const created = new Date(kit.createdAt);
  created.setUTCMilliseconds(0);
  const { doc, done } = newDocument([W, H], { title: `Kit label ${kit.code}`, subject: `Matched-set kit ${kit.code}`, creationDate: created });
  doc.addPage({ size: [W, H], margin: 0 });
  const g = kitLabelGeometry();
  drawDataMatrixFast(doc, payload.message, g.dm.x, g.dm.y, g.dm.w);
  drawCode128(doc, kit.code, g.bar.x, g.bar.y, g.bar.w, g.bar.h);
  doc.font('Bold').fontSize(8).fillColor('#000000').text(kit.code, g.barText.x, g.barText.y, { width: g.barText.w, align: 'center', lineBreak: false });
  const worst = kit.sets.reduce((a, s) => (s.mismatch > a.mismatch ? s : a), kit.sets[0] ?? null);
  const kind = kit.mode === 'complementary' ? 'complementary NPN + PNP' : 'same polarity';
  const unit = kit.setSize === 2 ? (kit.sets.length === 1 ? 'pair' : 'pairs') : kit.sets.length === 1 ? 'quad' : 'quads';
  const lines: { font: string; text: string; size: number }[] = [
    { font: 'Bold', text: 'MATCHED KIT', size: 8 },
    { font: 'Bold', text: kit.code, size: 15 },
    { font: 'Bold', text: kit.partNumbers.join(' + '), size: 10 },
    { font: 'Regular', text: `${kit.sets.length} ${unit}, ${kind} · ${kit.parts} parts`, size: 8 },
    { font: 'Regular', text: `Matched within hFE ${fmtNum(kit.hfeTolerancePct, 1)} %, Vbe ${fmtNum(kit.vbeToleranceMv, 2)} mV (25 °C)`, size: 7.5 },
    ...(worst ? [{ font: 'Regular', text: `Worst set: hFE ${fmtNum(worst.hfeSpreadPct, 1)} %, ΔVbe ${fmtNum(worst.vbeSpreadMv, 2)} mV`, size: 7.5 }] : []),
    { font: 'Regular', text: `${kit.createdAt.slice(0, 10)} · ${kit.createdByName}`, size: 7 },
    { font: 'Regular', text: 'ESD sensitive: handle at an ESD-protected workstation.', size: 6.5 },
  ];
  let y = g.text.y;
  for (const l of lines) {
    const s = fitLine(doc, l.font, l.text, g.text.x, y, g.text.w, l.size);
    y += s * 1.22;
  }
  doc.end();
  return { pdf: await done, payload };
}
