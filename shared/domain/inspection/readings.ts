export type VoltageUnit = 'mV' | 'V';
export type CurrentUnit = 'nA' | 'uA';

export interface RawReading {
  hfe: number;
  vbe: number;
  vbeUnit: VoltageUnit;
  vceSat?: number | null;
  vceSatUnit?: VoltageUnit;
  leakage?: number | null;
  leakageUnit?: CurrentUnit;
}

/** A reading in the stored units: hFE dimensionless, voltages in mV, leakage in nA. */
export interface Reading {
  hfe: number;
  vbeMv: number;
  vceSatMv: number | null;
  leakageNa: number | null;
}

export interface ReadingError {
  field: 'hfe' | 'vbe' | 'vceSat' | 'leakage';
  message: string;
}

/** Plausible ranges of a small-signal or power BJT reading; outside them the unit is most likely wrong. */
export const READING_BOUNDS = {
  hfe: { min: 1, max: 100_000 },
  /** Vbe(on) of silicon is about 0.58–0.70 V at small currents (reference.md §4); power parts at high IC read higher. */
  vbeMv: { min: 100, max: 2_000 },
  vceSatMv: { min: 0, max: 10_000 },
  leakageNa: { min: 0, max: 1e9 },
} as const;

const toMv = (v: number, unit: VoltageUnit) => (unit === 'V' ? v * 1000 : v);
const toNa = (v: number, unit: CurrentUnit) => (unit === 'uA' ? v * 1000 : v);

/**
 * Converts a reading to mV and nA and checks it is a plausible measurement: hFE 1…100 000,
 * Vbe 100…2000 mV (a Vbe of 0.65 "mV" means the unit is V), VCE(sat) 0…10 V, leakage ≥ 0.
 * Vbe is a magnitude: PNP readings are entered without the sign. Product rule.
 */
export function checkReading(r: RawReading): { reading: Reading | null; errors: ReadingError[] } {
  const errors: ReadingError[] = [];
  const { hfe } = r;
  if (!Number.isFinite(hfe)) errors.push({ field: 'hfe', message: 'hFE must be a number' });
  else if (hfe < READING_BOUNDS.hfe.min || hfe > READING_BOUNDS.hfe.max) {
    errors.push({ field: 'hfe', message: `hFE ${hfe} is outside the plausible ${READING_BOUNDS.hfe.min}–${READING_BOUNDS.hfe.max}` });
  }
  let vbeMv = NaN;
  if (!Number.isFinite(r.vbe)) errors.push({ field: 'vbe', message: 'Vbe must be a number' });
  else if (r.vbe < 0) errors.push({ field: 'vbe', message: 'Vbe is a magnitude: enter PNP readings without the minus sign' });
  else {
    vbeMv = toMv(r.vbe, r.vbeUnit);
    if (vbeMv < READING_BOUNDS.vbeMv.min || vbeMv > READING_BOUNDS.vbeMv.max) {
      const hint = r.vbeUnit === 'mV' && r.vbe < 5 ? '; the value looks like volts: choose V' : r.vbeUnit === 'V' && r.vbe >= 100 ? '; the value looks like millivolts: choose mV' : '';
      errors.push({ field: 'vbe', message: `Vbe ${r.vbe} ${r.vbeUnit} is outside the plausible ${READING_BOUNDS.vbeMv.min}–${READING_BOUNDS.vbeMv.max} mV${hint}` });
    }
  }
  let vceSatMv: number | null = null;
  if (r.vceSat !== undefined && r.vceSat !== null) {
    if (!Number.isFinite(r.vceSat) || r.vceSat < 0) errors.push({ field: 'vceSat', message: 'VCE(sat) must be a number ≥ 0' });
    else {
      vceSatMv = toMv(r.vceSat, r.vceSatUnit ?? 'mV');
      if (vceSatMv > READING_BOUNDS.vceSatMv.max) errors.push({ field: 'vceSat', message: `VCE(sat) ${r.vceSat} ${r.vceSatUnit ?? 'mV'} is above ${READING_BOUNDS.vceSatMv.max} mV` });
    }
  }
  let leakageNa: number | null = null;
  if (r.leakage !== undefined && r.leakage !== null) {
    if (!Number.isFinite(r.leakage) || r.leakage < 0) errors.push({ field: 'leakage', message: 'leakage must be a number ≥ 0' });
    else leakageNa = toNa(r.leakage, r.leakageUnit ?? 'nA');
  }
  if (errors.length) return { reading: null, errors };
  return { reading: { hfe, vbeMv, vceSatMv, leakageNa }, errors };
}
