import { SamplingInputError } from './errors.ts';
import type { Severity } from './master-tables.ts';
import { judgeAttributeLot, wouldAcceptOneStepTighter, type SingleSamplingPlan } from './single-sampling.ts';

/** Where a supplier/part stands in the switching scheme (ISO 2859-1 clause 9). */
export type SwitchingSeverity = Severity | 'discontinued';

export type LotOutcome = 'accepted' | 'rejected';

/** Serializable switching state, kept per supplier and part. */
export interface SwitchingState {
  readonly severity: SwitchingSeverity;
  /** Outcomes of the latest lots (at most 5, oldest first) on original normal inspection since normal began. */
  readonly recent: readonly LotOutcome[];
  /** Lots accepted in a row on the current spell of tightened inspection. */
  readonly consecutiveAcceptedTightened: number;
  /** Lots not accepted in total since the current spell of tightened inspection began. */
  readonly rejectedInTightened: number;
  /** ISO 2859-1:1999 switching score, kept on normal inspection. */
  readonly switchingScore: number;
}

export interface SwitchingLotResult {
  /** The lot was accepted on original inspection. */
  readonly accepted: boolean;
  /** Ac of the plan used. */
  readonly acceptNumber: number;
  /** Nonconforming parts found in the sample. */
  readonly defects: number;
  /** The lot would also have been accepted with the AQL one step tighter (see wouldAcceptOneStepTighter). */
  readonly wouldAcceptOneStepTighter: boolean;
  /** On reduced inspection: accepted with Ac < d < Re (Z1.4 convention). */
  readonly reducedGapAccept?: boolean;
}

/**
 * Builds the switching input for d nonconforming parts found with an attribute plan at an AQL (%):
 * accept/gap from the plan's Ac/Re, and the one-step-tighter check of the switching score.
 */
export function switchingLotResult(plan: SingleSamplingPlan, aql: number, defects: number): SwitchingLotResult {
  const judgement = judgeAttributeLot(plan, defects);
  return {
    accepted: judgement.accepted,
    acceptNumber: plan.accept,
    defects,
    wouldAcceptOneStepTighter: judgement.accepted && wouldAcceptOneStepTighter(plan, aql, defects),
    reducedGapAccept: judgement.gapAccept,
  };
}

export interface SwitchingOptions {
  /** The responsible authority approves reduced inspection. */
  readonly reducedApproved: boolean;
  /** Production is at a steady rate. */
  readonly productionSteady: boolean;
  /** Any other condition that warrants returning from reduced to normal, in words. */
  readonly otherReasonForNormal?: string;
}

export interface SwitchingStep {
  readonly state: SwitchingState;
  /** The severity changed with this step. */
  readonly changed: boolean;
  /** Human-readable reason for the resulting severity. */
  readonly reason: string;
}

/** Numbers of the switching rules (ISO 2859-1 clause 9, reference.md §1.6). */
export const SWITCHING_RULES = {
  /** Window of consecutive normal lots for the normal → tightened rule. */
  normalWindow: 5,
  /** Lots not accepted within the window that trigger tightened. */
  rejectedForTightened: 2,
  /** Consecutive accepted lots on tightened that restore normal. */
  acceptedToLeaveTightened: 5,
  /** Cumulative lots not accepted on tightened that discontinue acceptance. */
  rejectedToDiscontinue: 5,
  /** Switching score at which reduced may begin. */
  reducedScore: 30,
} as const;

function fresh(severity: SwitchingSeverity): SwitchingState {
  return { severity, recent: [], consecutiveAcceptedTightened: 0, rejectedInTightened: 0, switchingScore: 0 };
}

/** Inspection starts on normal with an empty history (ISO 2859-1 9.2). */
export function initialSwitchingState(): SwitchingState {
  return fresh('normal');
}

function assertLotResult(lot: SwitchingLotResult): void {
  if (typeof lot.accepted !== 'boolean') {
    throw new SamplingInputError('accepted', 'accepted must be true or false');
  }
  if (!Number.isSafeInteger(lot.acceptNumber) || lot.acceptNumber < 0) {
    throw new SamplingInputError('acceptNumber', `acceptance number must be a whole number ≥ 0 (got ${String(lot.acceptNumber)})`);
  }
  if (!Number.isSafeInteger(lot.defects) || lot.defects < 0) {
    throw new SamplingInputError('defects', `nonconforming count must be a whole number ≥ 0 (got ${String(lot.defects)})`);
  }
}

// Switching score, ISO 2859-1:1999 9.3.3.2 [from memory]: with Ac ≥ 2, +3 when the lot would also
// have been accepted one AQL step tighter, else reset to 0; with Ac 0 or 1, +2 when the lot is
// accepted, else reset to 0.
function nextScore(score: number, lot: SwitchingLotResult): number {
  if (lot.acceptNumber >= 2) return lot.accepted && lot.wouldAcceptOneStepTighter ? score + 3 : 0;
  return lot.accepted ? score + 2 : 0;
}

function step(state: SwitchingState, reason: string, changedFrom: SwitchingSeverity): SwitchingStep {
  return { state, changed: state.severity !== changedFrom, reason };
}

/**
 * Applies one lot's original-inspection result to the switching state (ISO 2859-1 clause 9,
 * reference.md §1.6) and returns the new state, whether the severity changed and why:
 * - normal → tightened when 2 of the last 5 (or fewer) consecutive lots are not accepted;
 * - normal → reduced when the switching score reaches 30, production is steady and reduced
 *   inspection is approved (score rules from memory, see nextScore);
 * - tightened → normal after 5 consecutive accepted lots;
 * - tightened → discontinued when the cumulative number of lots not accepted since tightened began
 *   reaches 5 (our reading of §1.6 "5 lots … not accepted", as ISO 2859-1 9.4 words it: cumulative
 *   in the sequence of consecutive lots on original tightened inspection, not necessarily in a row);
 * - reduced → normal when a lot is not accepted, is accepted with Ac < d < Re, production is not
 *   steady, or another reason is given.
 * Throws SamplingInputError('state') while acceptance is discontinued: record the corrective action
 * first.
 */
export function advanceSwitching(
  state: SwitchingState,
  lot: SwitchingLotResult,
  options: SwitchingOptions,
): SwitchingStep {
  assertLotResult(lot);
  const from = state.severity;
  switch (from) {
    case 'normal':
      return advanceNormal(state, lot, options);
    case 'tightened':
      return advanceTightened(state, lot);
    case 'reduced':
      return advanceReduced(state, lot, options);
    case 'discontinued':
      throw new SamplingInputError(
        'state',
        "acceptance is discontinued: record the supplier's corrective action before inspecting further lots",
      );
    default:
      throw new SamplingInputError('state', `unknown severity ${String(from)}`);
  }
}

function advanceNormal(state: SwitchingState, lot: SwitchingLotResult, options: SwitchingOptions): SwitchingStep {
  const { normalWindow, rejectedForTightened, reducedScore } = SWITCHING_RULES;
  const recent = [...state.recent, lot.accepted ? 'accepted' : 'rejected'].slice(-normalWindow) as LotOutcome[];
  const rejected = recent.filter((o) => o === 'rejected').length;
  if (rejected >= rejectedForTightened) {
    return step(
      fresh('tightened'),
      `${rejected} of the last ${recent.length} lots were not accepted on normal inspection → tightened`,
      'normal',
    );
  }
  const switchingScore = nextScore(state.switchingScore, lot);
  const outcome = lot.accepted ? 'accepted' : 'not accepted';
  if (switchingScore >= reducedScore) {
    if (options.productionSteady && options.reducedApproved) {
      return step(
        fresh('reduced'),
        `switching score ${switchingScore} ≥ ${reducedScore}, production steady and reduced inspection approved → reduced`,
        'normal',
      );
    }
    const missing = [
      ...(options.productionSteady ? [] : ['production is not steady']),
      ...(options.reducedApproved ? [] : ['reduced inspection is not approved']),
    ].join(' and ');
    return step(
      { ...state, recent, switchingScore },
      `lot ${outcome}; switching score ${switchingScore} ≥ ${reducedScore} but ${missing} → stay on normal`,
      'normal',
    );
  }
  return step(
    { ...state, recent, switchingScore },
    `lot ${outcome}; ${rejected} of the last ${recent.length} lots not accepted, switching score ${switchingScore} → stay on normal`,
    'normal',
  );
}

function advanceTightened(state: SwitchingState, lot: SwitchingLotResult): SwitchingStep {
  const { acceptedToLeaveTightened, rejectedToDiscontinue } = SWITCHING_RULES;
  if (lot.accepted) {
    const consecutive = state.consecutiveAcceptedTightened + 1;
    if (consecutive >= acceptedToLeaveTightened) {
      return step(fresh('normal'), `${consecutive} consecutive lots accepted on tightened inspection → normal`, 'tightened');
    }
    return step(
      { ...state, consecutiveAcceptedTightened: consecutive },
      `lot accepted; ${consecutive} of ${acceptedToLeaveTightened} consecutive accepted lots needed to return to normal → stay on tightened`,
      'tightened',
    );
  }
  const rejected = state.rejectedInTightened + 1;
  if (rejected >= rejectedToDiscontinue) {
    return step(
      fresh('discontinued'),
      `${rejected} lots not accepted since tightened inspection began → acceptance discontinued until the supplier's corrective action`,
      'tightened',
    );
  }
  return step(
    { ...state, consecutiveAcceptedTightened: 0, rejectedInTightened: rejected },
    `lot not accepted; ${rejected} of ${rejectedToDiscontinue} lots not accepted on tightened before discontinuation → stay on tightened`,
    'tightened',
  );
}

function advanceReduced(state: SwitchingState, lot: SwitchingLotResult, options: SwitchingOptions): SwitchingStep {
  const toNormal = (why: string): SwitchingStep => step(fresh('normal'), `${why} → normal`, 'reduced');
  if (!lot.accepted) return toNormal('lot not accepted on reduced inspection');
  if (lot.reducedGapAccept === true) {
    return toNormal('lot accepted with Ac < d < Re on reduced inspection (Z1.4 convention)');
  }
  if (!options.productionSteady) return toNormal('production is irregular or delayed');
  if (options.otherReasonForNormal) return toNormal(options.otherReasonForNormal);
  return step(state, 'lot accepted on reduced inspection → stay on reduced', 'reduced');
}

/**
 * Records the supplier's corrective action: discontinued acceptance resumes on tightened
 * inspection (ISO 2859-1 9.4). In any other severity nothing changes.
 */
export function recordCorrectiveAction(state: SwitchingState): SwitchingStep {
  if (state.severity !== 'discontinued') {
    return step(state, `corrective action recorded; acceptance is not discontinued, stay on ${state.severity}`, state.severity);
  }
  return step(fresh('tightened'), "supplier's corrective action recorded → tightened", 'discontinued');
}
