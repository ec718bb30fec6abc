export { SamplingInputError } from './errors.ts';
export {
  CODE_LETTERS,
  INSPECTION_LEVELS,
  MIN_LOT_SIZE,
  codeLetter,
  type CodeLetter,
  type InspectionLevel,
} from './code-letters.ts';
export {
  AQL_VALUES,
  MASTER_TABLES,
  NORMAL_TABLE,
  REDUCED_TABLE,
  SAMPLE_SIZES,
  SEVERITIES,
  TIGHTENED_TABLE,
  masterTablePlan,
  oneStepTighterAcceptNumber,
  type Aql,
  type MasterCell,
  type MasterTable,
  type MasterTableRow,
  type ResolvedPlan,
  type Severity,
} from './master-tables.ts';
export {
  judgeAttributeLot,
  singleSamplingPlan,
  wouldAcceptOneStepTighter,
  type AttributeLotJudgement,
  type SingleSamplingInput,
  type SingleSamplingPlan,
} from './single-sampling.ts';
export {
  ZERO_ACCEPTANCE_SOURCE,
  probabilityOfAcceptance,
  zeroAcceptancePlan,
  zeroAcceptanceSampleSize,
  type ZeroAcceptanceInput,
} from './zero-acceptance.ts';
export {
  S_METHOD_K_AQLS,
  S_METHOD_K_SOURCE,
  S_METHOD_K_TABLE,
  Z19_LETTERS,
  Z19_SAMPLE_SIZES,
  sMethodDecision,
  sMethodK,
  type SMethodConstant,
  type SMethodDecision,
  type SMethodInput,
  type Z19Letter,
} from './s-method.ts';
export {
  SWITCHING_RULES,
  advanceSwitching,
  initialSwitchingState,
  recordCorrectiveAction,
  switchingLotResult,
  type LotOutcome,
  type SwitchingLotResult,
  type SwitchingOptions,
  type SwitchingSeverity,
  type SwitchingState,
  type SwitchingStep,
} from './switching.ts';
export {
  SAMPLING_METHODS,
  SAMPLING_METHOD_LABELS,
  aqlsForMethod,
  isSamplingMethod,
  type SamplingMethod,
} from './methods.ts';
