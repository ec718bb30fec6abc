export { MatchingInputError } from './errors.ts';
export {
  HFE_RATIO_SLACK,
  VBE_SLACK_MV,
  hfeSpreadPct,
  hfeWithinTolerance,
  vbeWithinTolerance,
  setMismatch,
} from './tolerance.ts';
export { matchSets } from './match-sets.ts';
export { describeMismatch } from './describe-mismatch.ts';
export type { MismatchInCircuit } from './describe-mismatch.ts';
export { EXACT_QUAD_COMPONENT } from './quads.ts';
export { maxWeightMatching, solveMaxWeightMatching } from './blossom.ts';
export type { BlossomGraph, BlossomOptions, BlossomSolution, BlossomStart, LazyEdges } from './blossom.ts';
export type { MatchMode, MatchOptions, MatchPart, MatchResult, MatchedSet, Polarity } from './types.ts';
