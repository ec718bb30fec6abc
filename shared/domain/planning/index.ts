export { PlanningInputError } from './errors.ts';
export { mulberry32, standardNormal } from './random.ts';
export { orderPlanSteps, planOrderQuantity, silvermanBandwidth, simulatedLot } from './order-quantity.ts';
export type { MatchTolerance, OrderPlanInput, OrderPlanProgress, OrderPlanResult, PlanPart, SetMatcher } from './order-quantity.ts';
