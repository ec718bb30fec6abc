import { mirrorCurrentRatio } from '../normalise/index.ts';
import { MatchingInputError } from './errors.ts';

export interface MismatchInCircuit {
  /** IC1/IC2 of a current mirror built from the set: exp(ΔVbe/VT), dimensionless, ≥ 1. */
  readonly mirrorCurrentRatio: number;
  /** (mirrorCurrentRatio − 1) · 100, in %. */
  readonly mirrorCurrentErrorPct: number;
  /** Input offset voltage of a differential pair at equal collector currents: ΔVbe, in mV. */
  readonly inputOffsetMv: number;
  /** hFE of the smaller over the larger, dimensionless, ≤ 1 (datasheets: hFE1/hFE2 ≥ 0.9). */
  readonly hfeRatio: number;
}

/**
 * What a set's mismatch means in a circuit (reference.md §5): mirror current ratio exp(ΔVbe/VT)
 * at tempC (default 25 °C, VT from the exact SI k and q), differential-pair input offset = ΔVbe
 * at equal currents, and the hFE ratio smaller/larger = 1/(1 + spread/100), the form matched-pair
 * datasheets use (reference.md §4). For a set of four the spreads are those of its extremes, so
 * the figures are for its worst pair. 1 mV gives a 3.97 % mirror error at 25 °C.
 */
export function describeMismatch(
  set: { readonly hfeSpreadPct: number; readonly vbeSpreadMv: number },
  tempC = 25,
): MismatchInCircuit {
  const { hfeSpreadPct, vbeSpreadMv } = set;
  if (!(Number.isFinite(hfeSpreadPct) && hfeSpreadPct >= 0)) {
    throw new MatchingInputError('hfeSpreadPct', 'hfeSpreadPct must be a finite number ≥ 0');
  }
  if (!(Number.isFinite(vbeSpreadMv) && vbeSpreadMv >= 0)) {
    throw new MatchingInputError('vbeSpreadMv', 'vbeSpreadMv must be a finite number ≥ 0');
  }
  const ratio = mirrorCurrentRatio(vbeSpreadMv, tempC);
  return {
    mirrorCurrentRatio: ratio,
    mirrorCurrentErrorPct: (ratio - 1) * 100,
    inputOffsetMv: vbeSpreadMv,
    hfeRatio: 1 / (1 + hfeSpreadPct / 100),
  };
}
