import { createHash } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import PDFDocument from 'pdfkit';
import type { DataSource, EntityManager } from 'typeorm';
import type { MrbAction, Recommendation } from '../shared/api/disposition.ts';
import { planForLot } from '../shared/domain/inspection/index.ts';
import { mulberry32, standardNormal } from '../shared/domain/planning/index.ts';
import { advanceSwitching, initialSwitchingState, type SamplingMethod, type Severity, type SwitchingState } from '../shared/domain/sampling/index.ts';
import { readConfig } from '../server/config.ts';
import { recordAudit } from '../server/modules/audit/audit.service.ts';
import { nextLotCode } from '../server/modules/lots/lot-code.ts';
import { onLotDisposed } from '../server/modules/supplier-quality/drift.service.ts';
import { dispositionText, findingsText, loadLotFacts } from '../server/modules/supplier-quality/ncr-facts.ts';
import { nextNcrCode } from '../server/modules/supplier-quality/ncr.service.ts';

/*
 * Past lots of the invented Harrow Point Audio Works scenario, so the Suppliers area has history:
 * lots received over the past year with sampled readings (normal draws around plausible means from
 * a fixed seed), signed dispositions, certificates of conformance (some late, some missing), the
 * switching state that follows from the dispositions, one supplier's recent lot that holds two gain
 * populations (it raises a drift alert), and one open NCR. All numbers are invented.
 */

export interface HistoricLotSpec {
  supplierId: number;
  partTypeId: number;
  receivedAt: Date;
  quantity: number;
  status: 'accepted' | 'rejected' | 'mrb';
  mrbAction?: MrbAction;
  supplierLot: string;
  dateCode: string | null;
  purchaseOrder: string | null;
  supplierPartNumber?: string | null;
  /** hFE and Vbe (mV) at 25 °C (the session's ambient is 25 °C). */
  readings: { hfe: number; vbeMv: number }[];
  inspectorId: number;
  qualityId: number;
  reason: string;
  /** Recommendation stored with the signature; a plain one is built when absent. */
  recommendation?: Recommendation;
  /** A CoC uploaded at this time (its file is written under documentsRoot). */
  coc?: { uploadedAt: Date; documentsRoot: string } | null;
  /** Receiving override (supplier not approved). */
  override?: { by: number; reason: string } | null;
}

/**
 * Writes one disposed lot straight into the tables as the Bench leaves them (migration
 * 1764600400000-bench): the lot, one closed sample session at 25 °C, its readings in one
 * statement (unnest arrays), the signed disposition and, optionally, a CoC document with its file.
 * Used by the demo history and by tests that need a known data set.
 */
export async function insertHistoricLot(m: EntityManager, s: HistoricLotSpec): Promise<{ lotId: number; code: string }> {
  const code = await nextLotCode(m, s.receivedAt);
  const [{ id: lotId }] = (await m.query(
    `INSERT INTO lot (code, supplier_id, part_type_id, quantity, purchase_order, supplier_part_number, supplier_lot, date_code, status, received_by, received_at,
                      override_by, override_reason, created_at, updated_at)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $11, $11) RETURNING id`,
    [code, s.supplierId, s.partTypeId, s.quantity, s.purchaseOrder, s.supplierPartNumber ?? null, s.supplierLot, s.dateCode, s.status, s.inspectorId, s.receivedAt, s.override?.by ?? null, s.override?.reason ?? null],
  )) as { id: number }[];
  const started = new Date(s.receivedAt.getTime() + 20 * 3600_000);
  const closed = new Date(started.getTime() + 2 * 3600_000);
  const [{ id: sessionId }] = (await m.query(
    `INSERT INTO measurement_session (lot_id, instrument, ambient_c, operator_id, mode, started_at, closed_at) VALUES ($1, 'Bench tester 1 (demo)', 25, $2, 'sample', $3, $4) RETURNING id`,
    [lotId, s.inspectorId, started, closed],
  )) as { id: number }[];
  if (s.readings.length) {
    await m.query(
      `INSERT INTO measurement (lot_id, session_id, position, hfe, vbe_mv, hfe_25, vbe_mv_25, source, created_by, created_at)
       SELECT $1, $2, t.p, t.h, t.v, t.h, t.v, 'grid', $3, $4 FROM unnest($5::int[], $6::float8[], $7::float8[]) AS t(p, h, v)`,
      [lotId, sessionId, s.inspectorId, started, s.readings.map((_, i) => i + 1), s.readings.map((r) => r.hfe), s.readings.map((r) => r.vbeMv)],
    );
  }
  const decision = s.status === 'accepted' ? 'accept' : s.status === 'rejected' ? 'reject' : 'mrb';
  const rec: Recommendation = s.recommendation ?? {
    decision: decision === 'accept' ? 'accept' : 'reject',
    reason: 'demo history',
    measured: s.readings.length,
    defects: null,
    plan: null,
    severity: 'normal',
    sMethod: null,
  };
  const signedAt = new Date(closed.getTime() + 3 * 3600_000);
  await m.query(
    `INSERT INTO disposition (lot_id, recommended, recommendation, proposed_decision, proposed_mrb_action, proposed_by, proposed_at, proposal_reason, decision, mrb_action, reason, signed_by, signed_at)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $4, $5, $8, $9, $10)`,
    [lotId, rec.decision, JSON.stringify(rec), decision, decision === 'mrb' ? (s.mrbAction ?? 'screen-100') : null, s.inspectorId, closed, s.reason, s.qualityId, signedAt],
  );
  if (s.coc) {
    const bytes = await cocPdf(code, s.supplierLot);
    const sha256 = createHash('sha256').update(bytes).digest('hex');
    const [{ id: docId }] = (await m.query(`SELECT nextval(pg_get_serial_sequence('lot_document', 'id'))::int AS id`)) as { id: number }[];
    const storageKey = `${lotId}/${docId}-${sha256.slice(0, 8)}`;
    await m.query(
      `INSERT INTO lot_document (id, lot_id, kind, original_name, media_type, size_bytes, sha256, storage_key, uploaded_by, uploaded_at)
       VALUES ($1, $2, 'coc', $3, 'application/pdf', $4, $5, $6, $7, $8)`,
      [docId, lotId, `CoC-${s.supplierLot}.pdf`, bytes.length, sha256, storageKey, s.inspectorId, s.coc.uploadedAt],
    );
    const file = path.join(s.coc.documentsRoot, storageKey);
    await fs.mkdir(path.dirname(file), { recursive: true });
    await fs.writeFile(file, bytes);
  }
  return { lotId, code };
}

/** A one-page invented certificate of conformance. */
function cocPdf(lotCode: string, supplierLot: string): Promise<Buffer> {
  const doc = new PDFDocument({ size: 'A5', info: { Title: `Certificate of conformance ${supplierLot}`, Author: 'demo scenario' } });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));
  doc.fontSize(16).text('Certificate of conformance');
  doc.moveDown().fontSize(10).text(`Supplier lot ${supplierLot} (our lot ${lotCode}).`);
  doc.text('Invented document of the Binwright demo scenario.');
  doc.end();
  return done;
}

// --- the scenario ------------------------------------------------------------------------------

interface Series {
  supplier: string;
  partNumber: string;
  supplierPartNumber: string;
  /** One entry per lot, oldest first. */
  lots: {
    daysAgo: number;
    quantity: number;
    status: 'accepted' | 'rejected' | 'mrb';
    mrbAction?: MrbAction;
    /** Normal populations (mean, sd, share) the readings are drawn from. */
    mix: [mean: number, sd: number, share: number][];
    /** Extra readings added as they are (e.g. parts outside the limits). */
    extra?: number[];
    coc: 'on-time' | 'late' | 'none';
    dateCode: string;
    reason: string;
  }[];
  vbe: [mean: number, sd: number];
  override?: string;
}

const ok = (mean: number, sd: number): [number, number, number][] => [[mean, sd, 1]];

const SERIES: Series[] = [
  {
    supplier: 'KLC',
    partNumber: 'HPA-N201',
    supplierPartNumber: 'KL-2201-T92',
    vbe: [655, 6],
    lots: [
      { daysAgo: 335, quantity: 1000, status: 'accepted', mix: ok(186, 21), coc: 'on-time', dateCode: '2549', reason: 'No part outside the limits in the sample.' },
      { daysAgo: 300, quantity: 1000, status: 'accepted', mix: ok(188, 20), coc: 'on-time', dateCode: '2603', reason: 'No part outside the limits in the sample.' },
      { daysAgo: 250, quantity: 1000, status: 'accepted', mix: ok(187, 21), coc: 'on-time', dateCode: '2609', reason: 'No part outside the limits in the sample.' },
      { daysAgo: 205, quantity: 1000, status: 'accepted', mix: ok(187, 21), coc: 'on-time', dateCode: '2615', reason: 'No part outside the limits in the sample.' },
      { daysAgo: 150, quantity: 1000, status: 'accepted', mix: ok(190, 19), coc: 'late', dateCode: '2622', reason: 'No part outside the limits; CoC followed three days later.' },
      { daysAgo: 110, quantity: 1000, status: 'accepted', mix: ok(185, 21), coc: 'on-time', dateCode: '2627', reason: 'No part outside the limits in the sample.' },
      { daysAgo: 60, quantity: 1000, status: 'accepted', mix: ok(183, 20), coc: 'on-time', dateCode: '2634', reason: 'No part outside the limits in the sample.' },
      { daysAgo: 25, quantity: 1000, status: 'accepted', mix: ok(187, 22), coc: 'on-time', dateCode: '2639', reason: 'No part outside the limits in the sample.' },
    ],
  },
  {
    supplier: 'KLC',
    partNumber: 'HPA-N215',
    supplierPartNumber: 'KL-4150-S23',
    vbe: [640, 5],
    lots: [
      { daysAgo: 280, quantity: 500, status: 'accepted', mix: ok(312, 28), coc: 'on-time', dateCode: '2605', reason: 'Variables plan met.' },
      { daysAgo: 190, quantity: 500, status: 'accepted', mix: ok(318, 30), coc: 'on-time', dateCode: '2618', reason: 'Variables plan met.' },
      { daysAgo: 120, quantity: 500, status: 'accepted', mix: ok(309, 27), coc: 'on-time', dateCode: '2626', reason: 'Variables plan met.' },
      { daysAgo: 40, quantity: 500, status: 'accepted', mix: ok(315, 29), coc: 'on-time', dateCode: '2637', reason: 'Variables plan met.' },
    ],
  },
  {
    supplier: 'NES',
    partNumber: 'HPA-N201',
    supplierPartNumber: 'NM-N201A',
    vbe: [660, 7],
    lots: [
      { daysAgo: 320, quantity: 1000, status: 'accepted', mix: ok(172, 24), coc: 'on-time', dateCode: '2546', reason: 'One part at the limit, none outside.' },
      { daysAgo: 270, quantity: 1000, status: 'accepted', mix: ok(175, 23), coc: 'late', dateCode: '2602', reason: 'No part outside the limits; CoC late.' },
      { daysAgo: 215, quantity: 1000, status: 'rejected', mix: ok(168, 26), extra: [88, 91, 94, 96], coc: 'on-time', dateCode: '2610', reason: 'Four parts below hFE 100 in the sample; Re 2 reached. Return to supplier.' },
      { daysAgo: 170, quantity: 1000, status: 'accepted', mix: ok(174, 24), coc: 'on-time', dateCode: '2617', reason: 'No part outside the limits in the sample.' },
      { daysAgo: 100, quantity: 1000, status: 'accepted', mix: ok(171, 25), coc: 'late', dateCode: '2626', reason: 'No part outside the limits; CoC late.' },
      { daysAgo: 55, quantity: 1000, status: 'accepted', mix: ok(176, 23), coc: 'on-time', dateCode: '2633', reason: 'No part outside the limits in the sample.' },
      {
        daysAgo: 12,
        quantity: 1000,
        status: 'accepted',
        mix: [
          [138, 9, 0.5],
          [246, 11, 0.5],
        ],
        coc: 'on-time',
        dateCode: '2641',
        reason: 'All sampled parts inside the limits; the gain spread is unusually wide.',
      },
    ],
  },
  {
    supplier: 'NES',
    partNumber: 'HPA-N340',
    supplierPartNumber: 'NM-340-D',
    vbe: [745, 12],
    lots: [
      { daysAgo: 260, quantity: 500, status: 'accepted', mix: ok(118, 16), coc: 'on-time', dateCode: '2604', reason: 'No part outside the limits in the sample.' },
      { daysAgo: 180, quantity: 500, status: 'mrb', mrbAction: 'screen-100', mix: ok(112, 18), extra: [52, 55, 58], coc: 'on-time', dateCode: '2616', reason: 'Three parts below hFE 60; screen the lot 100 % and return the rejects.' },
      { daysAgo: 90, quantity: 500, status: 'accepted', mix: ok(120, 15), coc: 'on-time', dateCode: '2628', reason: 'No part outside the limits in the sample.' },
      { daysAgo: 30, quantity: 500, status: 'accepted', mix: ok(117, 16), coc: 'late', dateCode: '2636', reason: 'No part outside the limits; CoC late.' },
    ],
  },
  {
    supplier: 'BPX',
    partNumber: 'HPA-N201',
    supplierPartNumber: 'BW-SS-N201',
    vbe: [650, 9],
    override: 'Shortage of HPA-N201 at the approved distributors; broker stock taken under full inspection (demo).',
    lots: [
      { daysAgo: 95, quantity: 400, status: 'accepted', mix: ok(194, 28), coc: 'none', dateCode: '2619', reason: 'No part outside the limits in the sample; no CoC supplied.' },
      {
        daysAgo: 35,
        quantity: 400,
        status: 'rejected',
        mix: [
          [205, 24, 0.8],
          [72, 9, 0.2],
        ],
        coc: 'none',
        dateCode: '2611',
        reason: 'A fifth of the sample below hFE 100; markings look inconsistent. Return to supplier, NCR to follow.',
      },
    ],
  },
];

const MARKER = 'H'; // supplier lots of the history end in -H01, -H02, …
const DAY_MS = 86_400_000;

function draw(rng: () => number, n: number, mix: [number, number, number][], vbe: [number, number]): { hfe: number; vbeMv: number }[] {
  const out: { hfe: number; vbeMv: number }[] = [];
  for (const [mean, sd, share] of mix) {
    const k = Math.round(n * share);
    // Higher gain goes with slightly lower Vbe at the same current (about 2 mV per 10 % of gain, demo).
    for (let i = 0; i < k; i++) {
      const hfe = Math.max(5, mean + sd * standardNormal(rng));
      out.push({ hfe: Math.round(hfe * 10) / 10, vbeMv: Math.round((vbe[0] + vbe[1] * standardNormal(rng) - (hfe - mean) * 0.02) * 10) / 10 });
    }
  }
  // Interleave the populations the way parts come off a reel.
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(rng() * (i + 1));
    [out[i], out[j]] = [out[j]!, out[i]!];
  }
  return out.slice(0, n);
}

/**
 * Loads the demo history. Idempotent: a lot is created only when its supplier lot (…-H01) is
 * missing; the switching state is written only where none exists; the NCR only when the lot has
 * none. The random draws come from one fixed seed, so the readings are the same on every machine.
 */
export async function seedDemoHistory(ds: DataSource, log: (l: string) => void = () => {}, now = new Date()): Promise<number> {
  const documentsRoot = path.join(readConfig().dataDir, 'documents');
  const created = await ds.transaction(async (m) => {
    const user = async (email: string) => ((await m.query(`SELECT id FROM app_user WHERE email = $1`, [email])) as { id: number }[])[0]?.id;
    const inspectorId = await user('inspector@harrowpoint.test');
    const qualityId = await user('quality@harrowpoint.test');
    const buyerId = await user('buyer@harrowpoint.test');
    if (!inspectorId || !qualityId || !buyerId) return 0;
    let count = 0;
    const newLots: number[] = [];
    let ncrLot: number | null = null;
    for (const [si, series] of SERIES.entries()) {
      const [ids] = (await m.query(
        `SELECT s.id AS sid, pt.id AS pid, pt.sampling_method, pt.inspection_level, pt.aql, pt.hfe_min, pt.hfe_max, pt.vbe_min_mv, pt.vbe_max_mv
           FROM supplier s, part_type pt WHERE s.code = $1 AND pt.part_number = $2`,
        [series.supplier, series.partNumber],
      )) as { sid: number; pid: number; sampling_method: SamplingMethod; inspection_level: string; aql: number; hfe_min: number | null; hfe_max: number | null }[];
      if (!ids) continue;
      // One generator per series: adding a series later leaves the others' readings unchanged.
      const rng = mulberry32(20261201 + si * 7919);
      let state: SwitchingState = initialSwitchingState();
      const hadState = ((await m.query(`SELECT 1 FROM switching_state WHERE supplier_id = $1 AND part_type_id = $2`, [ids.sid, ids.pid])) as unknown[]).length > 0;
      for (const [li, lot] of series.lots.entries()) {
        const severity: Severity = state.severity === 'discontinued' ? 'tightened' : state.severity;
        const plan = planForLot({ method: ids.sampling_method, lotSize: lot.quantity, level: ids.inspection_level, aql: ids.aql, severity, hfeMin: ids.hfe_min, hfeMax: ids.hfe_max });
        const n = Math.min(plan.sampleSize, lot.quantity);
        const readings = draw(rng, n - (lot.extra?.length ?? 0), lot.mix, series.vbe);
        for (const [i, hfe] of (lot.extra ?? []).entries()) readings.splice(3 + i * 7, 0, { hfe, vbeMv: series.vbe[0] });
        const defects = readings.filter((r) => (ids.hfe_min !== null && r.hfe < ids.hfe_min) || (ids.hfe_max !== null && r.hfe > ids.hfe_max)).length;
        const supplierLot = `${series.supplier}-${series.partNumber.slice(4)}-${MARKER}${String(li + 1).padStart(2, '0')}`;
        const step = advanceSwitching(state, { accepted: lot.status === 'accepted', acceptNumber: plan.accept ?? 0, defects, wouldAcceptOneStepTighter: false }, { reducedApproved: false, productionSteady: true });
        state = step.state;
        if (((await m.query(`SELECT 1 FROM lot WHERE supplier_id = $1 AND supplier_lot = $2`, [ids.sid, supplierLot])) as unknown[]).length) continue;
        const receivedAt = new Date(now.getTime() - lot.daysAgo * DAY_MS - 3 * 3600_000);
        const cocAt = lot.coc === 'none' ? null : new Date(receivedAt.getTime() + (lot.coc === 'on-time' ? 2 : 74) * 3600_000);
        const { lotId, code } = await insertHistoricLot(m, {
          supplierId: ids.sid,
          partTypeId: ids.pid,
          receivedAt,
          quantity: lot.quantity,
          status: lot.status,
          mrbAction: lot.mrbAction,
          supplierLot,
          dateCode: lot.dateCode,
          purchaseOrder: `PO-${series.supplier}-${String(4100 + li * 13 + si * 101)}`,
          supplierPartNumber: series.supplierPartNumber,
          readings,
          inspectorId,
          qualityId,
          reason: lot.reason,
          recommendation: {
            decision: lot.status === 'accepted' ? 'accept' : 'reject',
            reason: `${defects} nonconforming in ${n} measured (demo history)`,
            measured: n,
            defects: plan.method === 'variables' ? null : defects,
            plan: { ...plan, severity: plan.severity },
            severity,
            sMethod: null,
          },
          coc: cocAt ? { uploadedAt: cocAt, documentsRoot } : null,
          override: series.override ? { by: qualityId, reason: series.override } : null,
        });
        await recordAudit(m, { actor: null, action: 'lot.create', entityType: 'lot', entityId: lotId, after: { code, supplierLot, status: lot.status }, note: 'demo history' });
        newLots.push(lotId);
        if (series.supplier === 'BPX' && lot.status === 'rejected') ncrLot = lotId;
        count++;
      }
      if (!hadState && count > 0) {
        await m.query(
          `INSERT INTO switching_state (supplier_id, part_type_id, state, reason, updated_at) VALUES ($1, $2, $3, $4, $5) ON CONFLICT DO NOTHING`,
          [ids.sid, ids.pid, JSON.stringify(state), `demo history: ${state.severity} after ${series.lots.length} lots`, now],
        );
      }
    }
    for (const lotId of newLots) await onLotDisposed(m, lotId);
    if (ncrLot !== null && !((await m.query(`SELECT 1 FROM ncr WHERE lot_id = $1`, [ncrLot])) as unknown[]).length) {
      const facts = await loadLotFacts(m, ncrLot);
      const ncrCode = await nextNcrCode(m, now);
      const due = new Date(now.getTime() + 21 * DAY_MS).toISOString().slice(0, 10);
      const [{ id }] = (await m.query(
        `INSERT INTO ncr (code, lot_id, supplier_id, part_type_id, findings, disposition, corrective_action, due_date, status, created_by)
         VALUES ($1, $2, $3, $4, $5, $6, $7, $8, 'open', $9) RETURNING id`,
        [
          ncrCode,
          ncrLot,
          facts.supplier.id,
          facts.partType.id,
          findingsText(facts),
          dispositionText(facts),
          'State the original manufacturer and its lot for this stock, explain the low-gain parts, and confirm how you will keep unverified stock out of future deliveries.',
          due,
          buyerId,
        ],
      )) as { id: number }[];
      await recordAudit(m, { actor: null, action: 'ncr.create', entityType: 'ncr', entityId: id, after: { code: ncrCode, lotId: ncrLot }, note: 'demo history' });
      count++;
    }
    return count;
  });
  if (created) log(`Demo scenario: created ${created} rows of supplier history (past lots with readings, dispositions, an NCR).`);
  return created;
}
