import { assertFiniteSample } from './errors.ts';

export interface IndividualsLimits {
  /** Number of points (e.g. lot means). */
  n: number;
  /** Centre line x̄, the mean of the points. */
  centre: number;
  /** Average moving range MR̄ = mean of |xᵢ − xᵢ₋₁|. */
  mrBar: number;
  /** x̄ + 2.66·MR̄. */
  ucl: number;
  /** x̄ − 2.66·MR̄. */
  lcl: number;
  /** Upper limit of the moving-range chart, 3.267·MR̄ (its lower limit is 0). */
  mrUcl: number;
  /** Indexes of points above ucl or below lcl. */
  outside: number[];
}

/** 3/d₂ with d₂ = 1.128 for moving ranges of two points. */
export const INDIVIDUALS_FACTOR = 2.66;
/** D₄ for subgroups of two. */
export const MOVING_RANGE_D4 = 3.267;

/**
 * Individuals / moving-range control chart limits across points taken in time order, e.g. each
 * lot's mean hFE for one supplier and part: centre x̄, UCL = x̄ + 2.66·MR̄, LCL = x̄ − 2.66·MR̄,
 * moving-range UCL = 3.267·MR̄ (NIST/SEMATECH e-Handbook of Statistical Methods §6.3.2,
 * individuals control charts). Units are those of the input. Needs at least two points.
 */
export function xbarIndividualsLimits(means: ArrayLike<number>): IndividualsLimits {
  assertFiniteSample(means, 'means', 2);
  const n = means.length;
  let sum = 0;
  let mrSum = 0;
  for (let i = 0; i < n; i++) {
    const x = means[i] as number;
    sum += x;
    if (i > 0) mrSum += Math.abs(x - (means[i - 1] as number));
  }
  const centre = sum / n;
  const mrBar = mrSum / (n - 1);
  const ucl = centre + INDIVIDUALS_FACTOR * mrBar;
  const lcl = centre - INDIVIDUALS_FACTOR * mrBar;
  const outside: number[] = [];
  for (let i = 0; i < n; i++) {
    const x = means[i] as number;
    if (x > ucl || x < lcl) outside.push(i);
  }
  return { n, centre, mrBar, ucl, lcl, mrUcl: MOVING_RANGE_D4 * mrBar, outside };
}
