import type { DataSource } from 'typeorm';
import type { SwitchingSeverityName } from '../../../shared/api/sampling.ts';
import {
  SEVERITY_RANK,
  type PartScorecard,
  type ScorecardFigures,
  type ScorecardLot,
  type ScorecardPage,
  type ScorecardPeriod,
  type ScorecardRow,
  type ScorecardSort,
  type SupplierScorecard,
} from '../../../shared/api/supplier-quality.ts';
import { xbarSChart } from '../../../shared/domain/drift/index.ts';
import { histogram } from '../../../shared/domain/statistics/index.ts';
import { AppError } from '../../http/app-error.ts';
import { sweepDriftChecks } from './drift.service.ts';
import { FINAL_STATUSES, sampleHfeByLot } from './lot-readings.ts';

/** A certificate of conformance counts as on time when uploaded within this many hours of receipt. */
export const COC_ON_TIME_HOURS = 24;

interface LotFact {
  id: number;
  code: string;
  supplier_id: number;
  part_type_id: number;
  status: string;
  received_at: Date;
  date_code: string | null;
  n: number;
  d: number;
  mean: number | null;
  sd: number | null;
  coc_on_time: boolean;
  alert_id: number | null;
}

/** Start (inclusive) and end (exclusive) instants of a period of whole UTC days. */
function bounds(p: ScorecardPeriod): [Date, Date] {
  const end = new Date(`${p.to}T00:00:00Z`);
  end.setUTCDate(end.getUTCDate() + 1);
  return [new Date(`${p.from}T00:00:00Z`), end];
}

/**
 * One row per lot received in the period: its sample readings (count, readings outside a part
 * limit at 25 °C, mean and sd of hFE), whether its CoC came on time, and its drift alert.
 */
async function lotFacts(ds: DataSource, period: ScorecardPeriod, supplierId?: number): Promise<LotFact[]> {
  const [from, to] = bounds(period);
  const params: unknown[] = [from, to, COC_ON_TIME_HOURS];
  let supplierSql = '';
  if (supplierId !== undefined) {
    params.push(supplierId);
    supplierSql = `AND l.supplier_id = $${params.length}`;
  }
  const rows = (await ds.query(
    `WITH lots AS (
       SELECT l.id, l.code, l.supplier_id, l.part_type_id, l.status, l.received_at, l.date_code
         FROM lot l WHERE l.received_at >= $1 AND l.received_at < $2 ${supplierSql}
     ), samp AS (
       SELECT m.lot_id, count(*)::int AS n,
              count(*) FILTER (WHERE (pt.hfe_min IS NOT NULL AND m.hfe_25 < pt.hfe_min) OR (pt.hfe_max IS NOT NULL AND m.hfe_25 > pt.hfe_max)
                                  OR (pt.vbe_min_mv IS NOT NULL AND m.vbe_mv_25 < pt.vbe_min_mv) OR (pt.vbe_max_mv IS NOT NULL AND m.vbe_mv_25 > pt.vbe_max_mv))::int AS d,
              avg(m.hfe_25)::float8 AS mean, stddev_samp(m.hfe_25)::float8 AS sd
         FROM measurement m
         JOIN measurement_session s ON s.id = m.session_id AND s.mode = 'sample'
         JOIN lots l ON l.id = m.lot_id
         JOIN part_type pt ON pt.id = l.part_type_id
        WHERE NOT m.superseded
        GROUP BY m.lot_id
     )
     SELECT l.*, COALESCE(samp.n, 0) AS n, COALESCE(samp.d, 0) AS d, samp.mean, samp.sd,
            EXISTS (SELECT 1 FROM lot_document doc WHERE doc.lot_id = l.id AND doc.kind = 'coc'
                     AND doc.uploaded_at <= l.received_at + make_interval(hours => $3)) AS coc_on_time,
            (SELECT a.id FROM drift_alert a WHERE a.lot_id = l.id) AS alert_id
       FROM lots l LEFT JOIN samp ON samp.lot_id = l.id
      ORDER BY l.received_at, l.id`,
    params,
  )) as LotFact[];
  return rows;
}

interface CurrentState {
  severity: Map<string, { severity: SwitchingSeverityName; reason: string }>;
  openAlerts: Map<string, number>;
  openNcrs: Map<string, number>;
}

const key = (supplierId: number, partTypeId: number) => `${supplierId}:${partTypeId}`;

/** Switching severity, open alerts and open NCRs as they stand now (not bound to the period). */
async function currentState(ds: DataSource, supplierId?: number): Promise<CurrentState> {
  const filter = supplierId === undefined ? '' : 'WHERE supplier_id = $1';
  const params = supplierId === undefined ? [] : [supplierId];
  const sw = (await ds.query(`SELECT supplier_id, part_type_id, state->>'severity' AS severity, reason FROM switching_state ${filter}`, params)) as {
    supplier_id: number;
    part_type_id: number;
    severity: SwitchingSeverityName;
    reason: string;
  }[];
  const alerts = (await ds.query(
    `SELECT supplier_id, part_type_id, count(*)::int AS n FROM drift_alert ${filter ? `${filter} AND` : 'WHERE'} status = 'open' GROUP BY 1, 2`,
    params,
  )) as { supplier_id: number; part_type_id: number; n: number }[];
  const ncrs = (await ds.query(
    `SELECT supplier_id, part_type_id, count(*)::int AS n FROM ncr ${filter ? `${filter} AND` : 'WHERE'} status <> 'closed' GROUP BY 1, 2`,
    params,
  )) as { supplier_id: number; part_type_id: number; n: number }[];
  return {
    severity: new Map(sw.map((r) => [key(r.supplier_id, r.part_type_id), { severity: r.severity, reason: r.reason }])),
    openAlerts: new Map(alerts.map((r) => [key(r.supplier_id, r.part_type_id), r.n])),
    openNcrs: new Map(ncrs.map((r) => [key(r.supplier_id, r.part_type_id), r.n])),
  };
}

const isFinal = (status: string) => (FINAL_STATUSES as readonly string[]).includes(status);

/**
 * The scorecard figures of a set of lots. Definitions:
 * - lot acceptance rate = accepted / disposed (accepted + rejected + MRB);
 * - DPPM = readings outside a part limit / readings, over the sample sessions of disposed lots,
 *   × 10⁶ — an estimate from the samples, not a count over every part delivered;
 * - CoC on time = a certificate of conformance uploaded within COC_ON_TIME_HOURS of receipt;
 * - mean hFE = mean of the lot means; its spread = sd of the lot means.
 */
export function figuresOf(
  lots: LotFact[],
  current: { severities: SwitchingSeverityName[]; openAlerts: number; openNcrs: number },
): ScorecardFigures {
  const disposed = lots.filter((l) => isFinal(l.status));
  const accepted = lots.filter((l) => l.status === 'accepted').length;
  const rejected = lots.filter((l) => l.status === 'rejected').length;
  const mrb = lots.filter((l) => l.status === 'mrb').length;
  const sampledParts = disposed.reduce((a, l) => a + l.n, 0);
  const sampledDefects = disposed.reduce((a, l) => a + l.d, 0);
  const cocOnTime = lots.filter((l) => l.coc_on_time).length;
  const means = lots.filter((l) => l.mean !== null).map((l) => l.mean as number);
  const meanHfe = means.length ? means.reduce((a, x) => a + x, 0) / means.length : null;
  const sdOfLotMeans =
    means.length > 1 && meanHfe !== null ? Math.sqrt(means.reduce((a, x) => a + (x - meanHfe) ** 2, 0) / (means.length - 1)) : null;
  const severity = current.severities.reduce<SwitchingSeverityName>((worst, s) => (SEVERITY_RANK[s] > SEVERITY_RANK[worst] ? s : worst), 'normal');
  return {
    lotsReceived: lots.length,
    accepted,
    rejected,
    mrb,
    pending: lots.length - disposed.length,
    acceptanceRate: disposed.length ? accepted / disposed.length : null,
    sampledParts,
    sampledDefects,
    dppm: sampledParts ? (sampledDefects / sampledParts) * 1e6 : null,
    cocOnTime,
    cocOnTimeRate: lots.length ? cocOnTime / lots.length : null,
    meanHfe,
    sdOfLotMeans,
    severity: current.severities.length ? severity : 'normal',
    openAlerts: current.openAlerts,
    openNcrs: current.openNcrs,
  };
}

/** Figures over all part types of a supplier: a mean hFE across different part types means nothing, so it is left out then. */
function supplierFigures(lots: LotFact[], current: Parameters<typeof figuresOf>[1]): ScorecardFigures {
  const f = figuresOf(lots, current);
  return new Set(lots.map((l) => l.part_type_id)).size > 1 ? { ...f, meanHfe: null, sdOfLotMeans: null } : f;
}

function sumFor(map: Map<string, number>, supplierId: number): number {
  let n = 0;
  for (const [k, v] of map) if (k.startsWith(`${supplierId}:`)) n += v;
  return n;
}

function severitiesFor(state: CurrentState, supplierId: number, partTypeId?: number): SwitchingSeverityName[] {
  const out: SwitchingSeverityName[] = [];
  for (const [k, v] of state.severity) {
    if (partTypeId === undefined ? k.startsWith(`${supplierId}:`) : k === key(supplierId, partTypeId)) out.push(v.severity);
  }
  return out;
}

export interface ScorecardQuery {
  period: ScorecardPeriod;
  page: number;
  pageSize: number;
  sort?: ScorecardSort;
  dir?: 'asc' | 'desc';
  search?: string;
}

/** Every supplier's scorecard over the period, sorted and paged on the server. */
export async function listScorecards(ds: DataSource, q: ScorecardQuery): Promise<ScorecardPage> {
  await sweepDriftChecks(ds);
  const suppliers = (await ds.query(`SELECT id, code, name, approval FROM supplier ORDER BY name, id`)) as { id: number; code: string; name: string; approval: string }[];
  const [facts, state] = await Promise.all([lotFacts(ds, q.period), currentState(ds)]);
  const search = q.search?.toLowerCase();
  const rows: ScorecardRow[] = suppliers
    .filter((s) => !search || s.name.toLowerCase().includes(search) || s.code.toLowerCase().includes(search))
    .map((s) => {
      const lots = facts.filter((l) => l.supplier_id === s.id);
      return {
        supplierId: s.id,
        supplierCode: s.code,
        supplierName: s.name,
        approval: s.approval,
        partTypes: new Set(lots.map((l) => l.part_type_id)).size,
        ...supplierFigures(lots, { severities: severitiesFor(state, s.id), openAlerts: sumFor(state.openAlerts, s.id), openNcrs: sumFor(state.openNcrs, s.id) }),
      };
    });
  const sort = q.sort ?? 'supplierName';
  const dir = q.dir === 'desc' ? -1 : 1;
  rows.sort((a, b) => {
    const x = a[sort];
    const y = b[sort];
    // Rows without a figure go last in either direction.
    if (x === null && y !== null) return 1;
    if (y === null && x !== null) return -1;
    const c = typeof x === 'string' ? x.localeCompare(String(y)) : (x as number) - (y as number);
    return c * dir || a.supplierName.localeCompare(b.supplierName);
  });
  const start = (q.page - 1) * q.pageSize;
  return { items: rows.slice(start, start + q.pageSize), total: rows.length, page: q.page, pageSize: q.pageSize, period: q.period };
}

/** Lots whose distributions are overlaid in the detail chart. */
const OVERLAID_LOTS = 4;

function toLot(l: LotFact): ScorecardLot {
  return {
    lotId: l.id,
    code: l.code,
    receivedAt: new Date(l.received_at).toISOString(),
    status: l.status,
    dateCode: l.date_code,
    n: l.n,
    mean: l.mean,
    sd: l.sd,
    defects: l.d,
    cocOnTime: l.coc_on_time,
    alertId: l.alert_id,
  };
}

async function partScorecard(ds: DataSource, part: PartScorecard['partType'], lots: LotFact[], state: CurrentState, supplierId: number): Promise<PartScorecard> {
  const k = key(supplierId, part.id);
  const figures = figuresOf(lots, { severities: severitiesFor(state, supplierId, part.id), openAlerts: state.openAlerts.get(k) ?? 0, openNcrs: state.openNcrs.get(k) ?? 0 });

  const plotted = lots.filter((l) => l.n >= 2 && l.mean !== null && l.sd !== null);
  const reference = plotted.filter((l) => l.status === 'accepted');
  let chart: PartScorecard['chart'] = null;
  if (reference.length >= 2) {
    const sub = (l: LotFact) => ({ n: l.n, mean: l.mean as number, sd: l.sd as number });
    const c = xbarSChart(plotted.map(sub), reference.map(sub));
    chart = {
      method: c.method,
      grandMean: c.grandMean,
      sBar: c.sBar,
      referenceLots: c.subgroups,
      points: c.points.map((p, i) => {
        const l = plotted[i] as LotFact;
        return { ...p, lotId: l.id, code: l.code, receivedAt: new Date(l.received_at).toISOString(), accepted: l.status === 'accepted' };
      }),
    };
  }

  const months = new Map<string, { disposed: number; accepted: number }>();
  for (const l of lots) {
    if (!isFinal(l.status)) continue;
    const m = new Date(l.received_at).toISOString().slice(0, 7);
    const e = months.get(m) ?? { disposed: 0, accepted: 0 };
    e.disposed++;
    if (l.status === 'accepted') e.accepted++;
    months.set(m, e);
  }
  const acceptance = [...months.entries()].sort(([a], [b]) => a.localeCompare(b)).map(([month, e]) => ({ month, ...e, rate: e.disposed ? e.accepted / e.disposed : null }));

  const last = lots.filter((l) => isFinal(l.status) && l.n >= 5).slice(-OVERLAID_LOTS);
  let distributions: PartScorecard['distributions'] = null;
  if (last.length) {
    const values = await sampleHfeByLot(ds.manager, last.map((l) => l.id));
    const all = last.flatMap((l) => values.get(l.id) ?? []);
    let edges = histogram(all, { rule: 'freedman-diaconis' }).edges;
    if (edges.length > 41) edges = histogram(all, { rule: 'sturges' }).edges;
    distributions = {
      edges,
      lots: last.map((l) => {
        const v = values.get(l.id) ?? [];
        const counts = histogram(v, { edges }).counts;
        return { lotId: l.id, code: l.code, receivedAt: new Date(l.received_at).toISOString(), n: v.length, percent: counts.map((c) => (v.length ? (c / v.length) * 100 : 0)) };
      }),
    };
  }
  return { partType: part, figures, severityReason: state.severity.get(k)?.reason ?? null, lots: lots.map(toLot), chart, acceptance, distributions };
}

/** One supplier's scorecard over the period: totals, and per part type the lots, charts and figures. */
export async function supplierScorecard(ds: DataSource, supplierId: number, period: ScorecardPeriod): Promise<SupplierScorecard> {
  const [supplier] = (await ds.query(`SELECT id, code, name, approval FROM supplier WHERE id = $1`, [supplierId])) as SupplierScorecard['supplier'][];
  if (!supplier) throw AppError.notFound(`Supplier ${supplierId}`);
  await sweepDriftChecks(ds);
  const [facts, state] = await Promise.all([lotFacts(ds, period, supplierId), currentState(ds, supplierId)]);
  const partIds = [...new Set(facts.map((l) => l.part_type_id))];
  const parts = partIds.length
    ? ((await ds.query(
        `SELECT id, part_number AS "partNumber", description, polarity, hfe_min AS "hfeMin", hfe_max AS "hfeMax" FROM part_type WHERE id = ANY($1) ORDER BY part_number`,
        [partIds],
      )) as PartScorecard['partType'][])
    : [];
  const perPart: PartScorecard[] = [];
  for (const p of parts) perPart.push(await partScorecard(ds, p, facts.filter((l) => l.part_type_id === p.id), state, supplierId));
  return {
    supplier,
    period,
    totals: supplierFigures(facts, { severities: severitiesFor(state, supplierId), openAlerts: sumFor(state.openAlerts, supplierId), openNcrs: sumFor(state.openNcrs, supplierId) }),
    parts: perPart,
  };
}

const csvCell = (v: string | number | null) => {
  if (v === null) return '';
  const s = String(v);
  // Quote when needed; a leading = + - @ is prefixed so a spreadsheet does not run it as a formula.
  const safe = /^[=+\-@]/.test(s) && typeof v === 'string' ? `'${s}` : s;
  return /[",\n\r]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
};

/** The scorecards as CSV: one row per supplier × part type with lots in the period. */
export async function scorecardsCsv(ds: DataSource, period: ScorecardPeriod): Promise<string> {
  const [facts, state] = await Promise.all([lotFacts(ds, period), currentState(ds)]);
  const names = (await ds.query(
    `SELECT s.id AS sid, s.code AS scode, s.name AS sname, pt.id AS pid, pt.part_number FROM supplier s CROSS JOIN part_type pt
      WHERE EXISTS (SELECT 1 FROM lot l WHERE l.supplier_id = s.id AND l.part_type_id = pt.id) ORDER BY s.name, pt.part_number`,
  )) as { sid: number; scode: string; sname: string; pid: number; part_number: string }[];
  const header = [
    'supplier_code', 'supplier_name', 'part_number', 'period_from', 'period_to', 'lots_received', 'accepted', 'rejected', 'mrb', 'pending',
    'lot_acceptance_rate_pct', 'sampled_parts', 'sampled_defects', 'dppm', 'coc_on_time', 'coc_on_time_pct', 'mean_hfe_of_lot_means', 'sd_of_lot_means',
    'sampling_severity', 'open_alerts', 'open_ncrs',
  ];
  const lines = [header.join(',')];
  const round = (x: number | null, d: number) => (x === null ? null : Number(x.toFixed(d)));
  for (const n of names) {
    const lots = facts.filter((l) => l.supplier_id === n.sid && l.part_type_id === n.pid);
    if (lots.length === 0) continue;
    const k = key(n.sid, n.pid);
    const f = figuresOf(lots, { severities: severitiesFor(state, n.sid, n.pid), openAlerts: state.openAlerts.get(k) ?? 0, openNcrs: state.openNcrs.get(k) ?? 0 });
    const cells: (string | number | null)[] = [
      n.scode, n.sname, n.part_number, period.from, period.to, f.lotsReceived, f.accepted, f.rejected, f.mrb, f.pending,
      round(f.acceptanceRate === null ? null : f.acceptanceRate * 100, 1), f.sampledParts, f.sampledDefects, round(f.dppm, 0), f.cocOnTime,
      round(f.cocOnTimeRate === null ? null : f.cocOnTimeRate * 100, 1), round(f.meanHfe, 2), round(f.sdOfLotMeans, 2), f.severity, f.openAlerts, f.openNcrs,
    ];
    lines.push(cells.map(csvCell).join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}
