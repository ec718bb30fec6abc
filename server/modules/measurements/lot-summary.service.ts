import type { DataSource } from 'typeorm';
import type { HistogramRuleParam, LotSummary, QuantityStats } from '../../../shared/api/lot-results.ts';
import { assignBin, type GainBin } from '../../../shared/domain/binning/index.ts';
import { REFERENCE_TEMP_C } from '../../../shared/domain/normalise/index.ts';
import { andersonDarling, capability, describe, histogram, StatisticsInputError, type Description } from '../../../shared/domain/statistics/index.ts';
import { loadLotContext } from '../bench/lot-context.ts';
import { GainBinRow } from '../catalog/gain-bin-scheme.entity.ts';

/**
 * The lot's current hFE and Vbe at 25 °C as two Float64Arrays. PostgreSQL packs each column into
 * one bytea of big-endian doubles (float8send + string_agg): one row of two values instead of
 * 100 000 rows, and no float-to-text formatting. Both aggregates run over the same scan, so index i
 * of the two arrays is the same part. (Measured against array_agg, a text array and the plain rows
 * in docs/benchmarks.md.)
 */
export async function loadLotValues(ds: DataSource, lotId: number): Promise<{ hfe: Float64Array; vbe: Float64Array }> {
  const [row] = (await ds.query(
    `SELECT string_agg(float8send(hfe_25), ''::bytea) AS h, string_agg(float8send(vbe_mv_25), ''::bytea) AS v
       FROM measurement WHERE lot_id = $1 AND NOT superseded`,
    [lotId],
  )) as { h: Buffer | null; v: Buffer | null }[];
  return { hfe: fromBigEndian(row?.h ?? null), vbe: fromBigEndian(row?.v ?? null) };
}

function fromBigEndian(buf: Buffer | null): Float64Array {
  if (!buf || buf.length === 0) return new Float64Array(0);
  // A fresh, 8-byte-aligned copy, byte-swapped in place when this machine is little-endian.
  const copy = Buffer.alloc(buf.length);
  buf.copy(copy);
  if (new Uint8Array(new Float64Array([1]).buffer)[0] === 0) copy.swap64();
  return new Float64Array(copy.buffer, copy.byteOffset, copy.length / 8);
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
  const tally = new Map(scheme.map((b) => [b.code, 0]));
  let outsideBins = 0;
  if (scheme.length) {
    // assignBin (shared/domain/binning) on one reused probe: no 100 000 short-lived objects.
    const probe = { hfe: 0, vbeMv: 0 };
    for (let i = 0; i < n; i++) {
      probe.hfe = hfe[i];
      probe.vbeMv = vbe[i];
      const code = assignBin(scheme, probe);
      if (code === null) outsideBins++;
      else tally.set(code, (tally.get(code) as number) + 1);
    }
  }
  const bins: LotSummary['bins'] = scheme.map((b) => {
    const count = tally.get(b.code) as number;
    return { code: b.code, label: b.label, hfeMin: b.hfeMin, hfeMax: b.hfeMax, count, yieldPct: n ? (100 * count) / n : 0 };
  });

  // The paired passes are done: sort each column once in place; describe, histogram and
  // Anderson–Darling then only copy the ascending arrays instead of sorting them again.
  hfe.sort();
  vbe.sort();
  const dh = n ? describe(hfe) : null;
  const dv = n ? describe(vbe) : null;

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
