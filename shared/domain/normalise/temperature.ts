import { NormaliseInputError, assertFinite } from './errors.ts';

/** The reference temperature datasheet limits are given at (TA = 25 °C). */
export const REFERENCE_TEMP_C = 25;

/** Vbe temperature coefficient of a silicon junction at constant IC, mV/°C (reference.md §5; common practice). */
export const DEFAULT_VBE_COEFF_MV_PER_C = -2.0;

/**
 * Vbe referred to 25 °C from a reading at ambientC: Vbe₂₅ = Vbe_T − coeff·(T − 25), in mV.
 * coeffMvPerC is the part's temperature coefficient at constant IC (default −2.0 mV/°C,
 * reference.md §5 — a rule of thumb; use the part's own value where known). The raw reading is kept by the caller.
 */
export function normaliseVbeMv(vbeMv: number, ambientC: number, coeffMvPerC = DEFAULT_VBE_COEFF_MV_PER_C): number {
  assertFinite(vbeMv, 'vbeMv');
  assertFinite(ambientC, 'ambientC');
  assertFinite(coeffMvPerC, 'coeffMvPerC');
  return vbeMv - coeffMvPerC * (ambientC - REFERENCE_TEMP_C);
}

/** Inverse of normaliseVbeMv: the Vbe in mV expected at tempC for a 25 °C value. */
export function vbeAtTemperatureMv(vbe25Mv: number, tempC: number, coeffMvPerC = DEFAULT_VBE_COEFF_MV_PER_C): number {
  assertFinite(vbe25Mv, 'vbe25Mv');
  assertFinite(tempC, 'tempC');
  assertFinite(coeffMvPerC, 'coeffMvPerC');
  return vbe25Mv + coeffMvPerC * (tempC - REFERENCE_TEMP_C);
}

function hfeFactor(tempC: number, pctPerC: number, tempField: string): number {
  assertFinite(tempC, tempField);
  assertFinite(pctPerC, 'pctPerC');
  const factor = 1 + (pctPerC / 100) * (tempC - REFERENCE_TEMP_C);
  if (!(factor > 0)) {
    throw new NormaliseInputError('pctPerC', 'pctPerC and the temperature give a non-positive gain factor');
  }
  return factor;
}

/**
 * hFE referred to 25 °C from a reading at ambientC: hFE₂₅ = hFE_T / (1 + pct/100·(T − 25)),
 * with pctPerC the part's linear gain coefficient in %/°C (about 0.5–0.7 %/°C near room
 * temperature for small-signal silicon, reference.md §5, from memory — use the part's value).
 * Dimensionless.
 */
export function normaliseHfe(hfe: number, ambientC: number, pctPerC: number): number {
  assertFinite(hfe, 'hfe');
  return hfe / hfeFactor(ambientC, pctPerC, 'ambientC');
}

/** Inverse of normaliseHfe: the hFE expected at tempC for a 25 °C value. */
export function hfeAtTemperature(hfe25: number, tempC: number, pctPerC: number): number {
  assertFinite(hfe25, 'hfe25');
  return hfe25 * hfeFactor(tempC, pctPerC, 'tempC');
}
