import { BIMODALITY_THRESHOLD } from '../statistics/index.ts';
import { DriftInputError } from './errors.ts';

/**
 * When a lot's gain distribution raises an alert. Every threshold is a setting; the defaults are
 * the product's, chosen as follows:
 * - ksPValue 0.01: two-sample Kolmogorov–Smirnov p-value below 1 % (a deliberately strict level,
 *   since every disposed lot is tested and false alarms cost inspections);
 * - medianShiftPct 10: the lot median differs from the history median by more than 10 %;
 * - bimodality 5/9: Sarle's b above the value of a uniform distribution (reference.md §7);
 * - outsideShare 0.01 and minOutsideCount 2: more than 1 % of the readings, and at least two,
 *   outside the part's gain group (hFE limits) — a single part outside is what the sampling plan
 *   itself judges;
 * - minLotSize 8 / minHistorySize 30: below these the comparison with the history is not made
 *   (the asymptotic KS p-value is rough for a few dozen parts or fewer);
 * - minBimodalitySize 20: b is too noisy on smaller samples to flag anything.
 */
export interface DriftSettings {
  ksPValue: number;
  medianShiftPct: number;
  bimodality: number;
  /** Fraction 0–1, not percent. */
  outsideShare: number;
  minOutsideCount: number;
  minLotSize: number;
  minHistorySize: number;
  minBimodalitySize: number;
}

export const DEFAULT_DRIFT_SETTINGS: Readonly<DriftSettings> = Object.freeze({
  ksPValue: 0.01,
  medianShiftPct: 10,
  bimodality: BIMODALITY_THRESHOLD,
  outsideShare: 0.01,
  minOutsideCount: 2,
  minLotSize: 8,
  minHistorySize: 30,
  minBimodalitySize: 20,
});

/** Defaults overlaid with the given settings; throws DriftInputError naming a bad one. */
export function resolveDriftSettings(partial: Partial<DriftSettings> = {}): DriftSettings {
  const s = { ...DEFAULT_DRIFT_SETTINGS, ...partial };
  const check = (field: keyof DriftSettings, ok: boolean, message: string) => {
    if (!ok) throw new DriftInputError(`settings.${field}`, message);
  };
  check('ksPValue', s.ksPValue > 0 && s.ksPValue < 1, 'ksPValue must lie between 0 and 1');
  check('medianShiftPct', s.medianShiftPct > 0 && Number.isFinite(s.medianShiftPct), 'medianShiftPct must be a positive percentage');
  check('bimodality', s.bimodality > 0 && s.bimodality < 1, 'bimodality must lie between 0 and 1');
  check('outsideShare', s.outsideShare >= 0 && s.outsideShare < 1, 'outsideShare is a fraction from 0 to below 1');
  check('minOutsideCount', Number.isInteger(s.minOutsideCount) && s.minOutsideCount >= 1, 'minOutsideCount must be a whole number ≥ 1');
  for (const k of ['minLotSize', 'minHistorySize', 'minBimodalitySize'] as const) {
    check(k, Number.isInteger(s[k]) && s[k] >= 4, `${k} must be a whole number ≥ 4`);
  }
  return s;
}
