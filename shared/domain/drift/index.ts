export { DriftInputError } from './errors.ts';
export { DEFAULT_DRIFT_SETTINGS, resolveDriftSettings } from './settings.ts';
export type { DriftSettings } from './settings.ts';
export { compareLotWithHistory } from './compare.ts';
export type { DriftCheck, DriftFigures, DriftFlag, DriftInput, DriftResult, GainGroup } from './compare.ts';
export { explainDrift, SUGGESTED_CHECKS } from './explain.ts';
export { c4, xbarSConstants, xbarSChart } from './control-charts.ts';
export type { Subgroup, SubgroupLimits, XbarSChart } from './control-charts.ts';
