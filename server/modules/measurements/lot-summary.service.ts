import type { DataSource } from 'typeorm';
import type { HistogramRuleParam, LotSummary, QuantityStats } from '../../../shared/api/lot-results.ts';
import { binCounts, type GainBin } from '../../../shared/domain/binning/index.ts';
import { REFERENCE_TEMP_C } from '../../../shared/domain/normalise/index.ts';
import { andersonDarling, capability, describe, histogram, StatisticsInputError, type Description } from '../../../shared/domain/statistics/index.ts';
import { loadLotContext } from '../bench/lot-context.ts';
import { GainBinRow } from '../catalog/gain-bin-scheme.entity.ts';

/**
 * The lot's current hFE and Vbe at 25 °C as two Float64Arrays. PostgreSQL packs each column into
 * one bytea of big-endian doubles (float8send + string_agg), which is far cheaper to send and read
 * than 100 000 rows or a text array. Both aggregates run over the same scan, so index i of the two
 * arrays is the same part.
 */
export async function loadLotValues(ds: DataSource, lotId: number): Promise<{ hfe: Float64Array; vbe: Float64Array }> {
  const [row] = (await ds.query(
    `SELECT string_agg(float8send(hfe_25), ''::bytea) AS h, string_agg(float8send(vbe_mv_25), ''::bytea) AS v
       FROM measurement WHERE lot_id = $1 AND NOT superseded`,
    [lotId],
  )) as { h: Buffer | null; v: Buffer | null }[];
  return { hfe: fromBigEndian(row.h), vbe: fromBigEndian(row.v) };
}

function fromBigEndian(buf: Buffer | null): Float64Array {
  if (!buf) return new Float64Array(0);
  const n = buf.length / 8;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = buf.readDoubleBE(i * 8);
  return out;
}

const EMPTY_STATS: QuantityStats = { mean: null, sd: null, min: null, max: null, p05: null, p25: null, median: null, p75: null, p95: null };

function stats(d: Description | null): QuantityStats {
  if (!d) return EMPTY_STATS;
  return { mean: d.mean, sd: d.sd, min: d.min, max: d.max, p05: d.p05, p25: d.p25, median: d.median, p75: d.p75, p95: d.p95 };
}

function cap(d: Description | null, lsl: number | null, usl: number | null) {
  if (!d || d.sd === null || !(d.sd > 0) || (lsl === null && usl === null)) return { cp: null, cpk: null, cpl: null, cpu: null };
  return capability({ mean: d.mean, sd: d.sd, lsl, usl });
}

/**
 * Statistics of a lot's current readings at 25 °C, computed on the server from the database with
 * the pure functions of shared/domain/statistics and shared/domain/binning: describe (n, mean,
 * s, extremes, R-7 percentiles), capability (Cp/Cpk, one-sided where a limit is open),
 * Anderson–Darling on hFE, a histogram of hFE (Freedman–Diaconis by default, or aligned to the
 * gain bins), the count outside the part's limits and the yield per gain bin.
 */
export async function lotSummary(ds: DataSource, lotId: number, rule: HistogramRuleParam = 'freedman-diaconis'): Promise<LotSummary> {
  const started = performance.now();
  const { lot, partType: p } = await loadLotContext(ds.manager, lotId);
  const [{ hfe, vbe }, binRows] = await Promise.all([
    loadLotValues(ds, lotId),
    lot.binSchemeId ? ds.getRepository(GainBinRow).find({ where: { schemeId: lot.binSchemeId }, order: { position: 'ASC' } }) : Promise.resolve([]),
  ]);
  const n = hfe.length;
  const dh = n ? describe(hfe) : null;
  const dv = n ? describe(vbe) : null;

  const outsideBy = { hfeLow: 0, hfeHigh: 0, vbeLow: 0, vbeHigh: 0 };
  let outsideLimits = 0;
  const hMin = p.hfeMin ?? -Infinity;
  const hMax = p.hfeMax ?? Infinity;
  const vMin = p.vbeMinMv ?? -Infinity;
  const vMax = p.vbeMaxMv ?? Infinity;
  for (let i = 0; i < n; i++) {
    const h = hfe[i];
    const v = vbe[i];
    const lowH = h < hMin;
    const highH = h > hMax;
    const lowV = v < vMin;
    const highV = v > vMax;
    if (lowH) outsideBy.hfeLow++;
    if (highH) outsideBy.hfeHigh++;
    if (lowV) outsideBy.vbeLow++;
    if (highV) outsideBy.vbeHigh++;
    if (lowH || highH || lowV || highV) outsideLimits++;
  }

  const scheme: GainBin[] = binRows.map((b) => ({ code: b.code, label: b.label, hfeMin: b.hfeMin, hfeMax: b.hfeMax, vbeMinMv: b.vbeMinMv, vbeMaxMv: b.vbeMaxMv }));
  let bins: LotSummary['bins'] = [];
  let outsideBins = 0;
  if (scheme.length && n) {
    const parts = new Array(n);
    for (let i = 0; i < n; i++) parts[i] = { hfe: hfe[i], vbeMv: vbe[i] };
    const counts = binCounts(scheme, parts);
    bins = counts.counts.map((c, i) => ({ code: c.code, label: scheme[i].label, hfeMin: scheme[i].hfeMin, hfeMax: scheme[i].hfeMax, count: c.count, yieldPct: (100 * c.count) / n }));
    outsideBins = counts.outside;
  } else {
    bins = scheme.map((b) => ({ code: b.code, label: b.label, hfeMin: b.hfeMin, hfeMax: b.hfeMax, count: 0, yieldPct: 0 }));
  }

  let hist: LotSummary['histogram'] = { edges: [], counts: [], rule: 'none' };
  if (n) {
    if (rule === 'bins' && scheme.length) {
      const edges = [scheme[0].hfeMin, ...scheme.map((b) => b.hfeMax)];
      const strictlyIncreasing = edges.every((e, i) => i === 0 || e > edges[i - 1]);
      if (strictlyIncreasing) {
        const h = histogram(hfe, { edges });
        hist = { edges: h.edges, counts: h.counts, rule: 'gain bins' };
      }
    }
    if (hist.rule === 'none') {
      const h = histogram(hfe, { rule: rule === 'bins' ? 'freedman-diaconis' : rule });
      hist = { edges: h.edges, counts: h.counts, rule: h.rule };
    }
  }

  let normality: LotSummary['normality'] = null;
  if (n >= 3) {
    try {
      const ad = andersonDarling(hfe);
      normality = { a2: ad.a2, a2Star: ad.a2Star, pValueBand: ad.pValueBand, normalAt5: ad.normalAt5 };
    } catch (e) {
      if (!(e instanceof StatisticsInputError)) throw e;
    }
  }

  const hc = cap(dh, p.hfeMin, p.hfeMax);
  const vc = cap(dv, p.vbeMinMv, p.vbeMaxMv);
  return {
    n,
    hfe: { ...stats(dh), cp: hc.cp, cpk: hc.cpk, cpl: hc.cpl, cpu: hc.cpu },
    vbeMv: { ...stats(dv), cp: vc.cp, cpk: vc.cpk },
    outsideLimits,
    outsideBy,
    bins,
    outsideBins,
    histogram: hist,
    normality,
    limits: { hfeMin: p.hfeMin, hfeMax: p.hfeMax, vbeMinMv: p.vbeMinMv, vbeMaxMv: p.vbeMaxMv },
    referenceTempC: REFERENCE_TEMP_C,
    computedMs: Math.round((performance.now() - started) * 10) / 10,
  };
}
