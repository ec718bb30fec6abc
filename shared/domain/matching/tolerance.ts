/**
 * Slack added to the hFE ratio test so that a decimal reading exactly at the limit counts as inside
 * (binary floating point cannot hold 200.2 or 210.21 exactly). 1e-12 of the ratio is far below any
 * instrument's resolution.
 */
export const HFE_RATIO_SLACK = 1e-12;
/** Slack in mV added to the Vbe test for the same reason (1e-9 mV = 1 pV). */
export const VBE_SLACK_MV = 1e-9;

/**
 * hFE spread of two readings in percent, by the definition shown to the user:
 * |h1 − h2| / min(h1, h2) · 100. Dimensionless (%). Both readings must be positive.
 */
export function hfeSpreadPct(h1: number, h2: number): number {
  return (Math.abs(h1 - h2) / Math.min(h1, h2)) * 100;
}

/**
 * True when two hFE readings are within tPct percent by the definition
 * |h1 − h2| / min(h1, h2) ≤ tPct / 100 (the smaller reading is the reference, so the test is
 * symmetric). Matched-pair datasheets state the same thing as hFE1/hFE2 ≥ 1/(1 + t) (reference.md §4).
 * Every tolerance test in the matching code goes through this function.
 */
export function hfeWithinTolerance(h1: number, h2: number, tPct: number): boolean {
  return Math.abs(h1 - h2) / Math.min(h1, h2) <= tPct / 100 + HFE_RATIO_SLACK;
}

/** True when two Vbe readings (mV) differ by at most vMv millivolts: |Vbe1 − Vbe2| ≤ v. */
export function vbeWithinTolerance(v1Mv: number, v2Mv: number, vMv: number): boolean {
  return Math.abs(v1Mv - v2Mv) <= vMv + VBE_SLACK_MV;
}

/**
 * Dimensionless mismatch of a set: hfeSpreadPct / t + vbeSpreadMv / v, each term clamped to
 * [0, 1], so a set at the edge of both tolerances scores 2 and the two tolerances weigh equally.
 * A zero tolerance admits only equal readings, and its term is then 0.
 * hfeSpreadPct = (max − min)/min · 100 over the set, vbeSpreadMv = max − min over the set — for a
 * set of four these are the largest of its six pairwise spreads.
 */
export function setMismatch(hfeSpread: number, vbeSpreadMv: number, tPct: number, vMv: number): number {
  return term(hfeSpread, tPct) + term(vbeSpreadMv, vMv);
}

function term(spread: number, tolerance: number): number {
  if (tolerance <= 0) return 0;
  return Math.min(1, Math.max(0, spread / tolerance));
}
