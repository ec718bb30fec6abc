import type { MismatchMeaning } from '../../../shared/api/pairing.ts';
import { describeMismatch } from '../../../shared/domain/matching/index.ts';
import { thermalVoltageMv } from '../../../shared/domain/normalise/index.ts';

/** VT = kT/q at 25 °C in mV (reference.md §5: 25.693 mV), the temperature the readings are referred to. */
const VT_25_MV = thermalVoltageMv(25);

/** What a matched set's mismatch means in a circuit (shared/domain/matching describeMismatch, at 25 °C). */
export function meaningOfSet(set: { hfeSpreadPct: number; vbeSpreadMv: number }): MismatchMeaning {
  const d = describeMismatch(set);
  return { mirrorRatio: d.mirrorCurrentRatio, mirrorErrorPct: d.mirrorCurrentErrorPct, offsetMv: d.inputOffsetMv, hfeRatio: d.hfeRatio, vtMv: VT_25_MV };
}

/** The meaning rebuilt from the three figures stored with a kit set. */
export function meaningFromStored(s: { mirrorRatio: number; offsetMv: number; hfeRatio: number }): MismatchMeaning {
  return { mirrorRatio: s.mirrorRatio, mirrorErrorPct: (s.mirrorRatio - 1) * 100, offsetMv: s.offsetMv, hfeRatio: s.hfeRatio, vtMv: VT_25_MV };
}
