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
export { BIN_PALETTE_SIZE, OUTSIDE_BIN_COLOUR, binColour, contrastRatio, relativeLuminance } from './bin-colours.ts';
export type { BinColour } from './bin-colours.ts';
