export { BiasInputError } from './errors.ts';
export { DEFAULT_VCE_SAT_V, evaluateDividerBias, validateStage } from './divider-bias.ts';
export type { BiasState, DividerBias, DividerBiasInput, DividerStage } from './divider-bias.ts';
export { biasSpread } from './bias-spread.ts';
export type { BiasSpread, SpreadSummary } from './bias-spread.ts';
