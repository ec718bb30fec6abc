import { bimodalityCoefficient, describe, ksTwoSample } from '../statistics/index.ts';
import { DriftInputError } from './errors.ts';
import { explainDrift } from './explain.ts';
import { resolveDriftSettings, type DriftSettings } from './settings.ts';

export type DriftCheck = 'ks' | 'median' | 'bimodal' | 'outside';

/** The part's gain group: hFE limits at 25 °C; null = open on that side. */
export interface GainGroup {
  hfeMin: number | null;
  hfeMax: number | null;
}

export interface DriftInput {
  /** The lot's hFE readings at 25 °C. */
  lot: ArrayLike<number>;
  /** hFE readings at 25 °C of the same supplier's accepted earlier lots of the same part type. */
  history: ArrayLike<number>;
  /** Number of lots the history comes from (shown in the explanation only). */
  historyLots?: number;
  limits: GainGroup;
  settings?: Partial<DriftSettings>;
}

/** Every figure of a comparison. JSON-safe: stored with an alert as it was computed. */
export interface DriftFigures {
  n: number;
  historyN: number;
  historyLots: number | null;
  /** Two-sample Kolmogorov–Smirnov; null when the lot or the history is too small. */
  ks: { d: number; pValue: number; criticalD: number; alpha: number } | null;
  median: {
    lot: number;
    /** null without a usable history. */
    history: number | null;
    /** lot − history, hFE units. */
    shift: number | null;
    /** shift / history median · 100. */
    shiftPct: number | null;
    /** shift in units of the history's interquartile range; null when the IQR is 0. */
    shiftIqr: number | null;
    /** shift in units of the history's standard deviation; null when it is 0. */
    shiftSd: number | null;
  };
  lotMean: number;
  lotSd: number | null;
  historyMean: number | null;
  historySd: number | null;
  /** Sarle's b on the lot; null below minBimodalitySize or for constant readings. */
  bimodality: { b: number; skewness: number; excessKurtosis: number } | null;
  outside: { count: number; share: number; hfeMin: number | null; hfeMax: number | null };
}

export interface DriftFlag {
  check: DriftCheck;
  /** One sentence with the figure and the threshold. */
  message: string;
}

export interface DriftResult {
  figures: DriftFigures;
  settings: DriftSettings;
  /** The checks that exceeded their thresholds. */
  flags: DriftFlag[];
  /** True when at least one check is flagged. */
  alert: boolean;
  /** Checks that could not be made, in words (e.g. history too small). */
  notes: string[];
  /** Plain-language explanation with likely causes and next steps; never a verdict. */
  explanation: string;
  /** Inspections to consider (reference.md §8). */
  suggestedChecks: string[];
}

const pct = (x: number) => `${(x * 100).toFixed(x < 0.1 ? 1 : 0)} %`;
const fmt = (x: number, d = 1) => x.toFixed(d);

/**
 * Compares one lot's hFE distribution with the supplier's accepted history for the part:
 * - two-sample Kolmogorov–Smirnov D and asymptotic p-value (statistics/ksTwoSample, reference.md §7),
 *   flagged when p < settings.ksPValue;
 * - the shift of the median, absolute, in % of the history median (flagged above
 *   settings.medianShiftPct), and in units of the history's IQR and standard deviation;
 * - Sarle's bimodality coefficient b of the lot (statistics/bimodalityCoefficient), flagged above
 *   settings.bimodality (5/9 by default);
 * - the share of readings outside the part's gain group (hFE limits), flagged above
 *   settings.outsideShare when at least settings.minOutsideCount readings are outside.
 * The result carries the figures, the flags and a plain explanation. It never says a lot is
 * counterfeit: the figures are a reason to inspect (reference.md §8), not a finding.
 */
export function compareLotWithHistory(input: DriftInput): DriftResult {
  const settings = resolveDriftSettings(input.settings);
  const lot = Float64Array.from(input.lot);
  const history = Float64Array.from(input.history);
  for (const [name, arr] of [['lot', lot], ['history', history]] as const) {
    for (let i = 0; i < arr.length; i++) {
      if (!Number.isFinite(arr[i])) throw new DriftInputError(name, `${name}[${i}] is not a finite number`);
    }
  }
  if (lot.length === 0) throw new DriftInputError('lot', 'lot needs at least one reading');
  const { hfeMin, hfeMax } = input.limits;

  const notes: string[] = [];
  const flags: DriftFlag[] = [];
  const dl = describe(lot);
  const usable = lot.length >= settings.minLotSize && history.length >= settings.minHistorySize;
  const dh = history.length > 0 ? describe(history) : null;

  let ks: DriftFigures['ks'] = null;
  const median: DriftFigures['median'] = { lot: dl.median, history: null, shift: null, shiftPct: null, shiftIqr: null, shiftSd: null };
  if (usable && dh) {
    const k = ksTwoSample(lot, history);
    const alpha = settings.ksPValue;
    // c(α) = √(−ln(α/2)/2), the asymptotic Kolmogorov quantile; equals 1.628 at α = 0.01 (reference.md §7).
    const c = Math.sqrt(-Math.log(alpha / 2) / 2);
    ks = { d: k.d, pValue: k.pValue, criticalD: c * Math.sqrt((k.n + k.m) / (k.n * k.m)), alpha };
    if (k.pValue < alpha) {
      flags.push({ check: 'ks', message: `The gain distribution differs from the history: Kolmogorov–Smirnov D = ${fmt(k.d, 3)}, p ${k.pValue < 0.0001 ? '< 0.0001' : `= ${fmt(k.pValue, 4)}`} (alert below ${alpha}).` });
    }
    median.history = dh.median;
    median.shift = dl.median - dh.median;
    median.shiftPct = dh.median !== 0 ? (median.shift / dh.median) * 100 : null;
    median.shiftIqr = dh.iqr > 0 ? median.shift / dh.iqr : null;
    median.shiftSd = dh.sd ? median.shift / dh.sd : null;
    if (median.shiftPct !== null && Math.abs(median.shiftPct) > settings.medianShiftPct) {
      const iqrText = median.shiftIqr !== null ? `, ${fmt(Math.abs(median.shiftIqr), 1)} interquartile ranges of the history` : '';
      flags.push({
        check: 'median',
        message: `The median hFE is ${fmt(dl.median)} against ${fmt(dh.median)} in the history: ${median.shiftPct > 0 ? '+' : ''}${fmt(median.shiftPct)} %${iqrText} (alert beyond ±${settings.medianShiftPct} %).`,
      });
    }
  } else if (lot.length < settings.minLotSize) {
    notes.push(`Only ${lot.length} readings in the lot: the comparison with the history needs at least ${settings.minLotSize}.`);
  } else {
    notes.push(`The accepted history holds ${history.length} readings: the comparison needs at least ${settings.minHistorySize}, so only the bimodality and gain-group checks were made.`);
  }

  let bimodality: DriftFigures['bimodality'] = null;
  if (lot.length >= settings.minBimodalitySize && dl.max > dl.min) {
    const b = bimodalityCoefficient(lot);
    bimodality = { b: b.b, skewness: b.skewness, excessKurtosis: b.excessKurtosis };
    if (b.b > settings.bimodality) {
      flags.push({ check: 'bimodal', message: `Sarle's bimodality coefficient is ${fmt(b.b, 3)}, above ${fmt(settings.bimodality, 3)}: the readings suggest more than one group.` });
    }
  } else if (lot.length < settings.minBimodalitySize) {
    notes.push(`The bimodality check needs at least ${settings.minBimodalitySize} readings.`);
  }

  let outsideCount = 0;
  for (let i = 0; i < lot.length; i++) {
    const x = lot[i] as number;
    if ((hfeMin !== null && x < hfeMin) || (hfeMax !== null && x > hfeMax)) outsideCount++;
  }
  const share = outsideCount / lot.length;
  if (share > settings.outsideShare && outsideCount >= settings.minOutsideCount) {
    flags.push({
      check: 'outside',
      message: `${pct(share)} of the readings (${outsideCount} of ${lot.length}) lie outside the part's gain group ${hfeMin ?? 'open'}–${hfeMax ?? 'open'} (alert above ${pct(settings.outsideShare)} and ${settings.minOutsideCount} readings).`,
    });
  }

  const figures: DriftFigures = {
    n: lot.length,
    historyN: history.length,
    historyLots: input.historyLots ?? null,
    ks,
    median,
    lotMean: dl.mean,
    lotSd: dl.sd,
    historyMean: dh?.mean ?? null,
    historySd: dh?.sd ?? null,
    bimodality,
    outside: { count: outsideCount, share, hfeMin, hfeMax },
  };
  const { explanation, suggestedChecks } = explainDrift(figures, flags, notes);
  return { figures, settings, flags, alert: flags.length > 0, notes, explanation, suggestedChecks };
}
