export { NormaliseInputError } from './errors.ts';
export {
  BOLTZMANN_J_PER_K,
  ELEMENTARY_CHARGE_C,
  ZERO_CELSIUS_K,
  thermalVoltage,
  thermalVoltageMv,
  mirrorCurrentRatio,
} from './thermal-voltage.ts';
export {
  REFERENCE_TEMP_C,
  DEFAULT_VBE_COEFF_MV_PER_C,
  normaliseVbeMv,
  vbeAtTemperatureMv,
  normaliseHfe,
  hfeAtTemperature,
} from './temperature.ts';
