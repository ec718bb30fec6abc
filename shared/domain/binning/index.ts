export { BinningInputError } from './errors.ts';
export { validateBinScheme } from './validate-scheme.ts';
export { assignBin, binCounts } from './assign.ts';
export type {
  GainBin,
  GainBinScheme,
  PartHfeLimits,
  BinSchemeError,
  BinSchemeValidation,
  PartMeasurement,
  BinCounts,
} from './types.ts';
