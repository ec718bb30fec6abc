export { SCREEN_AFTER_SIGNING_ACTION, benchWorkFor, modeAllowed, type BenchWork } from './bench-work.ts';
export { describeFlag, limitFlags, type LimitFlag, type PartLimits } from './limits.ts';
export { planForLot, type LotPlanInput, type LotPlanResult, type SamplingMethod } from './lot-plan.ts';
export { recommend, type RecommendationInput, type RecommendationResult, type RecommendedDecision } from './recommend.ts';
export { READING_BOUNDS, checkReading, type CurrentUnit, type RawReading, type Reading, type ReadingError, type VoltageUnit } from './readings.ts';
