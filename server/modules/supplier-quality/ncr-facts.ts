import type { DataSource, EntityManager } from 'typeorm';
import { MRB_ACTION_LABELS, type MrbAction } from '../../../shared/api/disposition.ts';
import type { DriftFigures, DriftFlag } from '../../../shared/api/supplier-quality.ts';
import { describe } from '../../../shared/domain/statistics/index.ts';
import { AppError } from '../../http/app-error.ts';
import { SAMPLE_READINGS_SQL } from './lot-readings.ts';

/** What an NCR says about its lot, read from the records. */
export interface LotFacts {
  lot: {
    id: number;
    code: string;
    status: string;
    quantity: number;
    purchaseOrder: string | null;
    supplierPartNumber: string | null;
    supplierLot: string | null;
    dateCode: string | null;
    countryOfOrigin: string | null;
    receivedAt: Date;
  };
  supplier: { id: number; code: string; name: string };
  partType: {
    id: number;
    partNumber: string;
    description: string;
    polarity: string;
    hfeMin: number | null;
    hfeMax: number | null;
    vbeMinMv: number | null;
    vbeMaxMv: number | null;
    hfeIcMa: number;
    hfeVceV: number;
  };
  sample: { n: number; outside: number; hfe: ReturnType<typeof describe> | null; vbeMin: number | null; vbeMax: number | null };
  disposition: { decision: string | null; mrbAction: string | null; reason: string | null; signedBy: string | null; signedAt: Date | null } | null;
  alert: { id: number; flags: DriftFlag[]; figures: DriftFigures } | null;
}

export async function loadLotFacts(m: DataSource | EntityManager, lotId: number, alertId: number | null = null): Promise<LotFacts> {
  const [row] = (await m.query(
    `SELECT l.id, l.code, l.status, l.quantity, l.purchase_order, l.supplier_part_number, l.supplier_lot, l.date_code, l.country_of_origin, l.received_at,
            s.id AS sid, s.code AS scode, s.name AS sname,
            pt.id AS pid, pt.part_number, pt.description, pt.polarity, pt.hfe_min, pt.hfe_max, pt.vbe_min_mv, pt.vbe_max_mv, pt.hfe_ic_ma, pt.hfe_vce_v,
            d.decision, d.mrb_action, d.reason, d.signed_at, u.name AS signer
       FROM lot l
       JOIN supplier s ON s.id = l.supplier_id
       JOIN part_type pt ON pt.id = l.part_type_id
       LEFT JOIN disposition d ON d.lot_id = l.id
       LEFT JOIN app_user u ON u.id = d.signed_by
      WHERE l.id = $1`,
    [lotId],
  )) as Record<string, unknown>[];
  if (!row) throw AppError.notFound(`Lot ${lotId}`);
  const readings = (await m.query(`SELECT r.hfe_25, r.vbe_mv_25 FROM (${SAMPLE_READINGS_SQL} AND m.lot_id = $1) r`, [lotId])) as { hfe_25: number; vbe_mv_25: number }[];
  const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));
  const hfeMin = num(row.hfe_min);
  const hfeMax = num(row.hfe_max);
  const vbeMin = num(row.vbe_min_mv);
  const vbeMax = num(row.vbe_max_mv);
  const outside = readings.filter(
    (r) => (hfeMin !== null && r.hfe_25 < hfeMin) || (hfeMax !== null && r.hfe_25 > hfeMax) || (vbeMin !== null && r.vbe_mv_25 < vbeMin) || (vbeMax !== null && r.vbe_mv_25 > vbeMax),
  ).length;
  let alert: LotFacts['alert'] = null;
  if (alertId !== null) {
    const [a] = (await m.query(`SELECT id, lot_id, flags, figures FROM drift_alert WHERE id = $1`, [alertId])) as { id: number; lot_id: number; flags: DriftFlag[]; figures: DriftFigures }[];
    if (!a) throw AppError.unprocessable(`There is no drift alert ${alertId}.`, [{ field: 'alertId', message: `no drift alert ${alertId}` }]);
    if (a.lot_id !== lotId) throw AppError.unprocessable(`Drift alert ${alertId} is about another lot.`, [{ field: 'alertId', message: 'the alert is about another lot' }]);
    alert = { id: a.id, flags: a.flags, figures: a.figures };
  }
  return {
    lot: {
      id: row.id as number,
      code: row.code as string,
      status: row.status as string,
      quantity: row.quantity as number,
      purchaseOrder: row.purchase_order as string | null,
      supplierPartNumber: row.supplier_part_number as string | null,
      supplierLot: row.supplier_lot as string | null,
      dateCode: row.date_code as string | null,
      countryOfOrigin: row.country_of_origin as string | null,
      receivedAt: new Date(row.received_at as string),
    },
    supplier: { id: row.sid as number, code: row.scode as string, name: row.sname as string },
    partType: {
      id: row.pid as number,
      partNumber: row.part_number as string,
      description: row.description as string,
      polarity: row.polarity as string,
      hfeMin,
      hfeMax,
      vbeMinMv: vbeMin,
      vbeMaxMv: vbeMax,
      hfeIcMa: Number(row.hfe_ic_ma),
      hfeVceV: Number(row.hfe_vce_v),
    },
    sample: {
      n: readings.length,
      outside,
      hfe: readings.length ? describe(readings.map((r) => r.hfe_25)) : null,
      vbeMin: readings.length ? Math.min(...readings.map((r) => r.vbe_mv_25)) : null,
      vbeMax: readings.length ? Math.max(...readings.map((r) => r.vbe_mv_25)) : null,
    },
    disposition: row.decision
      ? {
          decision: row.decision as string,
          mrbAction: row.mrb_action as string | null,
          reason: row.reason as string | null,
          signedBy: row.signer as string | null,
          signedAt: row.signed_at ? new Date(row.signed_at as string) : null,
        }
      : null,
    alert,
  };
}

const day = (d: Date) => d.toISOString().slice(0, 10);
const range = (min: number | null, max: number | null, unit = '') => (min === null && max === null ? 'no limits' : `${min ?? 'open'}–${max ?? 'open'}${unit}`);

/** The findings paragraph, filled from the lot's records and, when given, the drift alert. */
export function findingsText(f: LotFacts): string {
  const { lot, partType: p, sample: s } = f;
  const lines = [
    `Lot ${lot.code}: ${lot.quantity} × ${p.partNumber} (${p.polarity}, ${p.description})${lot.supplierPartNumber ? `, supplier part ${lot.supplierPartNumber}` : ''}; supplier lot ${lot.supplierLot ?? 'not stated'}, date code ${lot.dateCode ?? 'not stated'}${lot.purchaseOrder ? `, purchase order ${lot.purchaseOrder}` : ''}; received ${day(lot.receivedAt)}.`,
  ];
  if (s.n && s.hfe) {
    lines.push(
      `Sample inspection: ${s.n} parts measured, hFE at IC = ${p.hfeIcMa} mA, VCE = ${p.hfeVceV} V, referred to 25 °C. ${s.outside} part${s.outside === 1 ? '' : 's'} outside the limits (hFE ${range(p.hfeMin, p.hfeMax)}, Vbe ${range(p.vbeMinMv, p.vbeMaxMv, ' mV')}).`,
      `hFE: mean ${s.hfe.mean.toFixed(1)}, standard deviation ${s.hfe.sd?.toFixed(1) ?? '–'}, range ${s.hfe.min.toFixed(1)}–${s.hfe.max.toFixed(1)}; Vbe ${s.vbeMin?.toFixed(0)}–${s.vbeMax?.toFixed(0)} mV.`,
    );
  } else {
    lines.push('No sample readings are recorded for this lot.');
  }
  if (f.alert) {
    lines.push(`Compared with the parts of your earlier lots that we accepted: ${f.alert.flags.map((x) => x.message).join(' ')}`);
  }
  return lines.join('\n');
}

/** The lot's signed disposition in words, or a placeholder to be replaced before sending. */
export function dispositionText(f: LotFacts): string {
  const d = f.disposition;
  if (!d?.decision) return 'Disposition not signed yet.';
  const what =
    d.decision === 'accept' ? 'Accepted' : d.decision === 'reject' ? 'Rejected' : `Material review board: ${MRB_ACTION_LABELS[d.mrbAction as MrbAction] ?? d.mrbAction}`;
  return `${what}${d.signedBy ? `, signed by ${d.signedBy}` : ''}${d.signedAt ? ` on ${day(d.signedAt)}` : ''}${d.reason ? `: ${d.reason}` : '.'}`;
}
