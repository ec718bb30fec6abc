import { NormaliseInputError, assertFinite } from './errors.ts';

/** Boltzmann constant k in J/K, exact since the 2019 SI redefinition. */
export const BOLTZMANN_J_PER_K = 1.380649e-23;
/** Elementary charge q in C, exact since the 2019 SI redefinition. */
export const ELEMENTARY_CHARGE_C = 1.602176634e-19;
/** 0 °C in kelvin. */
export const ZERO_CELSIUS_K = 273.15;

function kelvin(tempC: number): number {
  assertFinite(tempC, 'tempC');
  const t = tempC + ZERO_CELSIUS_K;
  if (!(t > 0)) throw new NormaliseInputError('tempC', 'tempC must be above absolute zero');
  return t;
}

/** Thermal voltage V_T = kT/q in volts at tempC (°C), from the exact SI k and q (reference.md §5). */
export function thermalVoltage(tempC: number): number {
  return (BOLTZMANN_J_PER_K * kelvin(tempC)) / ELEMENTARY_CHARGE_C;
}

/** Thermal voltage V_T = kT/q in millivolts at tempC (°C); 25.693 mV at 25 °C (reference.md §5). */
export function thermalVoltageMv(tempC: number): number {
  return thermalVoltage(tempC) * 1000;
}

/**
 * Collector-current ratio IC1/IC2 = exp(ΔVbe/V_T) of two transistors with equal saturation
 * currents whose base-emitter voltages differ by deltaVbeMv (mV) at tempC (°C, default 25) —
 * what a Vbe mismatch does to a current mirror (Ebers–Moll; reference.md §5: 1 mV → 3.97 % at 25 °C).
 * Dimensionless; 1 means a perfect match.
 */
export function mirrorCurrentRatio(deltaVbeMv: number, tempC = 25): number {
  assertFinite(deltaVbeMv, 'deltaVbeMv');
  return Math.exp(deltaVbeMv / thermalVoltageMv(tempC));
}
