import { StatisticsInputError, assertFiniteSample, sortedCopy } from './errors.ts';
import { percentile } from './describe.ts';

export type BinWidthRule = 'sturges' | 'scott' | 'freedman-diaconis';

export type HistogramOptions = { rule: BinWidthRule } | { edges: readonly number[] };

export interface Histogram {
  /** k + 1 ascending edges. */
  edges: number[];
  /** counts[i] over [edges[i], edges[i+1]); the last bin is closed [edges[k−1], edges[k]]. */
  counts: number[];
  /** The rule that set the edges: a Scott or Freedman–Diaconis request that degenerates falls back to 'sturges'. */
  rule: BinWidthRule | 'edges';
  /** Values below edges[0] (only with explicit edges; 0 otherwise). */
  below: number;
  /** Values above the last edge (only with explicit edges; 0 otherwise). */
  above: number;
}

/** Upper bound on rule-derived bins, so one wild outlier cannot allocate millions of empty bins. */
export const MAX_RULE_BINS = 1000;

/**
 * Histogram of a sample, with bins from a published bin-width rule or from explicit edges
 * (e.g. aligned to a gain-bin scheme). Rules (as summarised in reference.md §7):
 * Sturges k = ⌈log₂ n⌉ + 1 (H. A. Sturges, JASA 21 (1926) 65–66);
 * Scott h = 3.49·s·n^(−1/3), s the n − 1 standard deviation (D. W. Scott, Biometrika 66 (1979) 605–610);
 * Freedman–Diaconis h = 2·IQR·n^(−1/3), IQR by R-7 percentiles (Z. Wahrscheinlichkeitstheorie 57 (1981) 453–476).
 * For a width h the bin count is k = ⌈(max − min)/h⌉ and the k bins split [min, max] equally
 * (the convention NumPy's histogram_bin_edges uses). When all values are equal the single bin is
 * [v − 0.5, v + 0.5]; when s or the IQR is 0, Sturges is used instead.
 * Bins are half-open [eᵢ, eᵢ₊₁) except the last, which is closed.
 */
export function histogram(values: ArrayLike<number>, options: HistogramOptions): Histogram {
  assertFiniteSample(values, 'values');
  const sorted = sortedCopy(values);
  if ('edges' in options) {
    const edges = [...options.edges];
    validateEdges(edges);
    return { edges, ...countInto(sorted, edges), rule: 'edges' };
  }
  const { edges, rule } = ruleEdges(sorted, options.rule);
  return { edges, ...countInto(sorted, edges), rule };
}

function validateEdges(edges: number[]): void {
  if (edges.length < 2) throw new StatisticsInputError('edges', 'edges needs at least two values');
  for (let i = 0; i < edges.length; i++) {
    const e = edges[i] as number;
    if (!Number.isFinite(e)) throw new StatisticsInputError('edges', `edges[${i}] is not a finite number`);
    if (i > 0 && e <= (edges[i - 1] as number)) {
      throw new StatisticsInputError('edges', 'edges must be strictly increasing');
    }
  }
}

function ruleEdges(sorted: Float64Array, rule: BinWidthRule): { edges: number[]; rule: BinWidthRule } {
  const n = sorted.length;
  const min = sorted[0] as number;
  const max = sorted[n - 1] as number;
  const range = max - min;
  if (range === 0) return { edges: [min - 0.5, max + 0.5], rule };
  const sturges = Math.ceil(Math.log2(n)) + 1;
  let k = sturges;
  let used: BinWidthRule = 'sturges';
  if (rule !== 'sturges') {
    const h = rule === 'scott' ? 3.49 * sampleSd(sorted) * Math.cbrt(1 / n) : 2 * iqr(sorted) * Math.cbrt(1 / n);
    if (h > 0) {
      k = Math.min(MAX_RULE_BINS, Math.max(1, Math.ceil(range / h)));
      used = rule;
    }
  }
  const edges = new Array<number>(k + 1);
  for (let i = 0; i <= k; i++) edges[i] = min + (range * i) / k;
  edges[k] = max;
  return { edges, rule: used };
}

function sampleSd(values: Float64Array): number {
  let mean = 0;
  let m2 = 0;
  for (let i = 0; i < values.length; i++) {
    const x = values[i] as number;
    const delta = x - mean;
    mean += delta / (i + 1);
    m2 += delta * (x - mean);
  }
  return values.length > 1 ? Math.sqrt(m2 / (values.length - 1)) : 0;
}

function iqr(sorted: Float64Array): number {
  return percentile(sorted, 75) - percentile(sorted, 25);
}

/** Counts an ascending sample into [eᵢ, eᵢ₊₁) bins, last bin closed; one sweep over values and edges. */
function countInto(sorted: Float64Array, edges: number[]): { counts: number[]; below: number; above: number } {
  const k = edges.length - 1;
  const first = edges[0] as number;
  const last = edges[k] as number;
  const counts = new Array<number>(k).fill(0);
  let below = 0;
  let above = 0;
  let bin = 0;
  for (let i = 0; i < sorted.length; i++) {
    const x = sorted[i] as number;
    if (x < first) {
      below++;
    } else if (x > last) {
      above++;
    } else {
      while (bin < k - 1 && x >= (edges[bin + 1] as number)) bin++;
      counts[bin] = (counts[bin] as number) + 1;
    }
  }
  return { counts, below, above };
}
