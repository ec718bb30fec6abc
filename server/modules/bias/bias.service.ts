import type { DataSource } from 'typeorm';
import type { BiasEvaluateRequest, BiasEvaluateResponse, BiasSourcePartType, BiasStage, FitForUseRequest, FitForUseResponse, HistogramData, Spread } from '../../../shared/api/bias.ts';
import type { Polarity } from '../../../shared/api/catalog.ts';
import { BiasInputError, DEFAULT_VCE_SAT_V, biasSpread, evaluateDividerBias } from '../../../shared/domain/bias/index.ts';
import { describe, histogram, percentile } from '../../../shared/domain/statistics/index.ts';
import { AppError } from '../../http/app-error.ts';

/** Most readings a part-type check uses (the newest); a lot uses all of its own. */
export const FIT_FOR_USE_LIMIT = 50_000;
/** Classes at most per histogram, so a wide spread stays readable. */
const MAX_CLASSES = 40;

function biasError(e: unknown, prefix = ''): never {
  if (e instanceof BiasInputError) {
    const field = prefix + e.field;
    throw AppError.badRequest(`Check ${field}: ${e.message}.`, [{ field, message: e.message }]);
  }
  throw e;
}

/** POST /api/bias/evaluate: the operating point of one transistor in the stage, SI units. */
export function evaluateBias(req: BiasEvaluateRequest): BiasEvaluateResponse {
  try {
    return { ...evaluateDividerBias({ vcc: req.vcc, r1: req.r1, r2: req.r2, re: req.re, rc: req.rc, hfe: req.hfe, vbeV: req.vbeV }) };
  } catch (e) {
    return biasError(e);
  }
}

function spread(values: Float64Array): Spread {
  const d = describe(values);
  return { min: d.min, p05: d.p05, mean: d.mean, p95: d.p95, max: d.max };
}

/** Histogram classes by Freedman–Diaconis (statistics.histogram), at most MAX_CLASSES equal classes. */
function classes(values: Float64Array): HistogramData {
  const h = histogram(values, { rule: 'freedman-diaconis' });
  if (h.counts.length <= MAX_CLASSES) return { edges: h.edges, counts: h.counts };
  const lo = h.edges[0] as number;
  const hi = h.edges[h.edges.length - 1] as number;
  const edges = Array.from({ length: MAX_CLASSES + 1 }, (_, i) => lo + ((hi - lo) * i) / MAX_CLASSES);
  edges[MAX_CLASSES] = hi;
  const e = histogram(values, { edges });
  return { edges: e.edges, counts: e.counts };
}

interface Source {
  kind: 'lot' | 'part-type';
  id: number;
  label: string;
  partNumber: string;
  polarity: Polarity;
  lots: number;
}

async function loadReadings(ds: DataSource, req: FitForUseRequest): Promise<{ source: Source; hfe: Float64Array; vbeV: Float64Array }> {
  if ((req.lotId === undefined) === (req.partTypeId === undefined)) {
    throw AppError.badRequest('Give either lotId or partTypeId.', [{ field: req.lotId === undefined ? 'lotId' : 'partTypeId', message: 'send lotId or partTypeId, not both' }]);
  }
  let source: Source;
  let rows: { hfe_25: number; vbe_mv_25: number }[];
  if (req.lotId !== undefined) {
    const [lot] = (await ds.query(`SELECT l.id, l.code, l.supplier_lot, p.part_number, p.polarity FROM lot l JOIN part_type p ON p.id = l.part_type_id WHERE l.id = $1`, [req.lotId])) as {
      id: number;
      code: string;
      supplier_lot: string | null;
      part_number: string;
      polarity: Polarity;
    }[];
    if (!lot) throw AppError.notFound(`Lot ${req.lotId}`);
    source = { kind: 'lot', id: lot.id, label: `Lot ${lot.code}${lot.supplier_lot ? ` (supplier lot ${lot.supplier_lot})` : ''}`, partNumber: lot.part_number, polarity: lot.polarity, lots: 1 };
    rows = (await ds.query(`SELECT hfe_25, vbe_mv_25 FROM measurement WHERE lot_id = $1 AND NOT superseded`, [lot.id])) as typeof rows;
  } else {
    const [pt] = (await ds.query(`SELECT id, part_number, polarity FROM part_type WHERE id = $1`, [req.partTypeId])) as { id: number; part_number: string; polarity: Polarity }[];
    if (!pt) throw AppError.notFound(`Part type ${req.partTypeId}`);
    rows = (await ds.query(
      `SELECT me.hfe_25, me.vbe_mv_25 FROM measurement me JOIN lot l ON l.id = me.lot_id WHERE l.part_type_id = $1 AND NOT me.superseded ORDER BY me.id DESC LIMIT $2`,
      [pt.id, FIT_FOR_USE_LIMIT],
    )) as typeof rows;
    const [{ lots }] = (await ds.query(`SELECT count(DISTINCT me.lot_id)::int AS lots FROM measurement me JOIN lot l ON l.id = me.lot_id WHERE l.part_type_id = $1 AND NOT me.superseded`, [pt.id])) as {
      lots: number;
    }[];
    source = { kind: 'part-type', id: pt.id, label: `Part type ${pt.part_number}, all lots`, partNumber: pt.part_number, polarity: pt.polarity, lots };
  }
  if (rows.length === 0) {
    throw AppError.unprocessable(`${source.label} has no measured parts yet: measure a sample at the Bench first.`, [
      { field: req.lotId !== undefined ? 'lotId' : 'partTypeId', message: 'no measured parts' },
    ]);
  }
  // Vbe of a PNP part may carry a sign; the stage works with its magnitude (V).
  return { source, hfe: Float64Array.from(rows, (r) => r.hfe_25), vbeV: Float64Array.from(rows, (r) => Math.abs(r.vbe_mv_25) / 1000) };
}

/**
 * POST /api/bias/fit-for-use: the stage run against every measured part of a lot or part type
 * (current readings at 25 °C; for a PNP part the magnitudes, the supply reversed): spreads of IC,
 * VB, VE, VC and VCE, the share that would saturate or stay cut off, and histograms of IC and VCE.
 */
export async function fitForUse(ds: DataSource, req: FitForUseRequest): Promise<FitForUseResponse> {
  const stage: BiasStage = { vcc: req.stage.vcc, r1: req.stage.r1, r2: req.stage.r2, re: req.stage.re, rc: req.stage.rc };
  const { source, hfe, vbeV } = await loadReadings(ds, req);
  const n = hfe.length;
  const parts = Array.from({ length: n }, (_, i) => ({ hfe: hfe[i] as number, vbeV: vbeV[i] as number }));
  let s: ReturnType<typeof biasSpread>;
  try {
    s = biasSpread(stage, parts);
  } catch (e) {
    return biasError(e, 'stage.');
  }
  const ic = new Float64Array(n);
  const vce = new Float64Array(n);
  let saturatedCount = 0;
  let cutoffCount = 0;
  for (let i = 0; i < n; i++) {
    const p = evaluateDividerBias({ ...stage, hfe: hfe[i] as number, vbeV: vbeV[i] as number });
    ic[i] = p.ic;
    vce[i] = p.vce;
    if (p.state === 'saturated') saturatedCount++;
    if (p.state === 'cutoff') cutoffCount++;
  }
  const sortedH = Float64Array.from(hfe).sort();
  const sortedV = Float64Array.from(vbeV).sort();
  const typical = evaluateDividerBias({ ...stage, hfe: percentile(sortedH, 50), vbeV: percentile(sortedV, 50) });
  const pick = (x: { min: number; max: number; mean: number; p05: number; p95: number }): Spread => ({ min: x.min, p05: x.p05, mean: x.mean, p95: x.p95, max: x.max });
  return {
    source,
    stage,
    n,
    inputs: { hfe: spread(hfe), vbeV: spread(vbeV) },
    spreads: { ic: pick(s.ic), vb: pick(s.vb), ve: pick(s.ve), vc: pick(s.vc), vce: spread(vce) },
    saturatedCount,
    saturatedShare: s.saturatedShare,
    cutoffCount,
    cutoffShare: s.cutoffShare,
    histograms: { ic: classes(ic), vce: classes(vce) },
    saturationVceV: DEFAULT_VCE_SAT_V,
    typical: { ...typical },
    limit: FIT_FOR_USE_LIMIT,
  };
}

/** GET /api/bias/sources: part types with measured parts, and their lots with counts (newest lots first). */
export async function biasSources(ds: DataSource): Promise<BiasSourcePartType[]> {
  const rows = (await ds.query(
    `SELECT p.id AS part_type_id, p.part_number, p.polarity, l.id AS lot_id, l.code AS lot_code, l.supplier_lot, count(*)::int AS measured
       FROM measurement me JOIN lot l ON l.id = me.lot_id JOIN part_type p ON p.id = l.part_type_id
      WHERE NOT me.superseded
      GROUP BY p.id, l.id
      ORDER BY p.part_number, l.received_at DESC, l.id DESC`,
  )) as { part_type_id: number; part_number: string; polarity: Polarity; lot_id: number; lot_code: string; supplier_lot: string | null; measured: number }[];
  const out = new Map<number, BiasSourcePartType>();
  for (const r of rows) {
    const pt = out.get(r.part_type_id) ?? { partTypeId: r.part_type_id, partNumber: r.part_number, polarity: r.polarity, measured: 0, lots: [] };
    pt.measured += r.measured;
    pt.lots.push({ lotId: r.lot_id, lotCode: r.lot_code, supplierLot: r.supplier_lot, measured: r.measured });
    out.set(r.part_type_id, pt);
  }
  return [...out.values()];
}
