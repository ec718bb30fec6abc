/** Statistics of one quantity of a lot's current measurements (values referred to 25 °C). */
export interface QuantityStats {
  mean: number | null;
  sd: number | null;
  min: number | null;
  max: number | null;
  p05: number | null;
  p25: number | null;
  median: number | null;
  p75: number | null;
  p95: number | null;
}

export interface HfeStats extends QuantityStats {
  /** (USL − LSL)/6s; null when a limit is open or s is 0. */
  cp: number | null;
  /** min(CPU, CPL) over the limits that exist. */
  cpk: number | null;
  cpl: number | null;
  cpu: number | null;
}

export interface VbeStats extends QuantityStats {
  cp: number | null;
  cpk: number | null;
}

/** GET /api/lots/:id/summary */
export interface LotSummary {
  n: number;
  hfe: HfeStats;
  vbeMv: VbeStats;
  /** Parts with hFE or Vbe (at 25 °C) outside the part type's limits. */
  outsideLimits: number;
  outsideBy: { hfeLow: number; hfeHigh: number; vbeLow: number; vbeHigh: number };
  /** Count per gain bin of the lot's scheme version (empty without a scheme). */
  bins: { code: string; label: string; hfeMin: number; hfeMax: number; count: number; yieldPct: number }[];
  outsideBins: number;
  histogram: { edges: number[]; counts: number[]; rule: string };
  /** Anderson–Darling normality check of hFE; null below 3 parts or with all values equal. */
  normality: { a2: number; a2Star: number; pValueBand: string; normalAt5: boolean } | null;
  limits: { hfeMin: number | null; hfeMax: number | null; vbeMinMv: number | null; vbeMaxMv: number | null };
  /** The summary refers every value to this temperature, °C. */
  referenceTempC: number;
  computedMs: number;
}

export type HistogramRuleParam = 'sturges' | 'scott' | 'freedman-diaconis' | 'bins';
