import { describe, it, expect } from 'vitest';
import {
  SamplingInputError,
  advanceSwitching,
  initialSwitchingState,
  recordCorrectiveAction,
  singleSamplingPlan,
  switchingLotResult,
  type SwitchingLotResult,
  type SwitchingOptions,
  type SwitchingState,
  type SwitchingStep,
} from '../../../shared/domain/sampling/index.ts';
import { thrown } from './thrown.ts';

// Rules: ISO 2859-1 clause 9 as summarised in reference.md §1.6 [published]; switching-score
// increments [from memory] per §1.6.

const ACCEPT: SwitchingLotResult = { accepted: true, acceptNumber: 1, defects: 0, wouldAcceptOneStepTighter: false };
const REJECT: SwitchingLotResult = { accepted: false, acceptNumber: 1, defects: 2, wouldAcceptOneStepTighter: false };
const STEADY: SwitchingOptions = { reducedApproved: false, productionSteady: true };
const APPROVED: SwitchingOptions = { reducedApproved: true, productionSteady: true };

/** Feeds lots written as 'A' (accepted) / 'R' (not accepted) and returns every step. */
function run(
  pattern: string,
  start: SwitchingState = initialSwitchingState(),
  options: SwitchingOptions = STEADY,
): SwitchingStep[] {
  const steps: SwitchingStep[] = [];
  let state = start;
  for (const ch of pattern) {
    const step = advanceSwitching(state, ch === 'A' ? ACCEPT : REJECT, options);
    steps.push(step);
    state = step.state;
  }
  return steps;
}

const last = (steps: SwitchingStep[]) => steps[steps.length - 1];
const severities = (steps: SwitchingStep[]) => steps.map((s) => s.state.severity);
const tightened = (): SwitchingState => last(run('RR')).state;

describe('switching: normal → tightened', () => {
  it('starts on normal with an empty history', () => {
    expect(initialSwitchingState()).toEqual({
      severity: 'normal',
      recent: [],
      consecutiveAcceptedTightened: 0,
      rejectedInTightened: 0,
      switchingScore: 0,
    });
  });

  it('2 of the last 5 lots not accepted → tightened on the fifth lot, with the reason', () => {
    const steps = run('RAAAR');
    expect(severities(steps)).toEqual(['normal', 'normal', 'normal', 'normal', 'tightened']);
    expect(last(steps).changed).toBe(true);
    expect(last(steps).reason).toBe('2 of the last 5 lots were not accepted on normal inspection → tightened');
  });

  it('2 lots not accepted in a row → tightened after 2 lots', () => {
    const steps = run('RR');
    expect(last(steps).state.severity).toBe('tightened');
    expect(last(steps).reason).toBe('2 of the last 2 lots were not accepted on normal inspection → tightened');
  });

  it('2 lots not accepted six lots apart stay on normal (outside any window of 5)', () => {
    const steps = run('RAAAAR');
    expect(severities(steps).every((s) => s === 'normal')).toBe(true);
    expect(steps.every((s) => !s.changed)).toBe(true);
  });
});

describe('switching: tightened → normal / discontinued', () => {
  it('5 consecutive accepted lots on tightened → normal', () => {
    const steps = run('AAAAA', tightened());
    expect(severities(steps)).toEqual(['tightened', 'tightened', 'tightened', 'tightened', 'normal']);
    expect(last(steps).reason).toBe('5 consecutive lots accepted on tightened inspection → normal');
    expect(last(steps).state.recent).toEqual([]);
  });

  it('a lot not accepted restarts the count of consecutive accepted lots', () => {
    const steps = run('AAAARAAAA', tightened());
    expect(last(steps).state).toMatchObject({ severity: 'tightened', consecutiveAcceptedTightened: 4 });
    expect(advanceSwitching(last(steps).state, ACCEPT, STEADY).state.severity).toBe('normal');
  });

  it('the 5th lot not accepted since tightened began (not in a row) → discontinued', () => {
    const steps = run('RARARARAR', tightened());
    expect(severities(steps).slice(0, -1).every((s) => s === 'tightened')).toBe(true);
    expect(last(steps).state.severity).toBe('discontinued');
    expect(last(steps).reason).toMatch(/^5 lots not accepted since tightened inspection began → acceptance discontinued/);
  });

  it('4 lots not accepted on tightened do not discontinue', () => {
    expect(last(run('RRRR', tightened())).state).toMatchObject({ severity: 'tightened', rejectedInTightened: 4 });
  });
});

describe('switching: discontinued and corrective action', () => {
  const discontinued = () => last(run('RRRRR', tightened())).state;

  it('a further lot while discontinued is refused naming state', () => {
    const error = thrown(() => advanceSwitching(discontinued(), ACCEPT, STEADY));
    expect(error).toBeInstanceOf(SamplingInputError);
    expect(error).toMatchObject({ field: 'state' });
  });

  it("the supplier's corrective action resumes on tightened with fresh counters", () => {
    const step = recordCorrectiveAction(discontinued());
    expect(step.changed).toBe(true);
    expect(step.state).toEqual({ ...initialSwitchingState(), severity: 'tightened' });
    expect(step.reason).toMatch(/→ tightened$/);
  });

  it('a corrective action while on normal changes nothing', () => {
    const step = recordCorrectiveAction(initialSwitchingState());
    expect(step.changed).toBe(false);
    expect(step.state.severity).toBe('normal');
  });
});

describe('switching: normal → reduced by switching score', () => {
  it('15 accepted lots with Ac 0 or 1 (+2 each) reach score 30 → reduced when approved and steady', () => {
    const steps = run('A'.repeat(15), initialSwitchingState(), APPROVED);
    expect(steps[13].state).toMatchObject({ severity: 'normal', switchingScore: 28 });
    expect(last(steps).state.severity).toBe('reduced');
    expect(last(steps).changed).toBe(true);
    expect(last(steps).reason).toMatch(/switching score 30 ≥ 30/);
  });

  it('lots with Ac ≥ 2 that would pass one AQL step tighter add 3: 10 lots → reduced', () => {
    const lot: SwitchingLotResult = { accepted: true, acceptNumber: 2, defects: 1, wouldAcceptOneStepTighter: true };
    let state = initialSwitchingState();
    const scores: number[] = [];
    for (let i = 0; i < 10; i += 1) {
      const step = advanceSwitching(state, lot, APPROVED);
      state = step.state;
      scores.push(step.state.switchingScore);
    }
    expect(scores.slice(0, 9)).toEqual([3, 6, 9, 12, 15, 18, 21, 24, 27]);
    expect(state.severity).toBe('reduced');
  });

  it('an accepted lot with Ac ≥ 2 that would fail one step tighter resets the score to 0', () => {
    const start = last(run('AAAA')).state;
    expect(start.switchingScore).toBe(8);
    const lot: SwitchingLotResult = { accepted: true, acceptNumber: 2, defects: 2, wouldAcceptOneStepTighter: false };
    expect(advanceSwitching(start, lot, STEADY).state.switchingScore).toBe(0);
  });

  it('a lot not accepted resets the score to 0', () => {
    expect(last(run('AAAAR')).state.switchingScore).toBe(0);
  });

  it('score 30 without approval stays on normal and says why', () => {
    const steps = run('A'.repeat(15), initialSwitchingState(), STEADY);
    expect(last(steps).state).toMatchObject({ severity: 'normal', switchingScore: 30 });
    expect(last(steps).changed).toBe(false);
    expect(last(steps).reason).toMatch(/not approved/);
  });

  it('score 30 with approval but unsteady production stays on normal', () => {
    const steps = run('A'.repeat(15), initialSwitchingState(), { reducedApproved: true, productionSteady: false });
    expect(last(steps).state.severity).toBe('normal');
    expect(last(steps).reason).toMatch(/production is not steady/);
  });
});

describe('switching: reduced → normal', () => {
  const reduced = () => last(run('A'.repeat(15), initialSwitchingState(), APPROVED)).state;

  it('an accepted lot on reduced stays on reduced', () => {
    const step = advanceSwitching(reduced(), ACCEPT, APPROVED);
    expect(step.state.severity).toBe('reduced');
    expect(step.changed).toBe(false);
  });

  it('a lot not accepted → normal', () => {
    const step = advanceSwitching(reduced(), REJECT, APPROVED);
    expect(step.state).toEqual(initialSwitchingState());
    expect(step.reason).toBe('lot not accepted on reduced inspection → normal');
  });

  it('a lot accepted with Ac < d < Re (gap accept) → normal', () => {
    const lot: SwitchingLotResult = {
      accepted: true,
      acceptNumber: 1,
      defects: 2,
      wouldAcceptOneStepTighter: false,
      reducedGapAccept: true,
    };
    const step = advanceSwitching(reduced(), lot, APPROVED);
    expect(step.state.severity).toBe('normal');
    expect(step.reason).toMatch(/Ac < d < Re/);
  });

  it('irregular production → normal', () => {
    const step = advanceSwitching(reduced(), ACCEPT, { reducedApproved: true, productionSteady: false });
    expect(step.state.severity).toBe('normal');
  });

  it('another stated reason → normal, quoting it', () => {
    const step = advanceSwitching(reduced(), ACCEPT, { ...APPROVED, otherReasonForNormal: 'customer complaint' });
    expect(step.reason).toBe('customer complaint → normal');
  });
});

describe('switchingLotResult', () => {
  it('reduced plan J at AQL 1.0 (Ac 1, Re 3) with d = 2 → accepted with a gap', () => {
    // [derived] reference.md §1.3/§1.5: J, 1.0 reduced → n 32, 1/3.
    const plan = singleSamplingPlan({ lotSize: 1_000, level: 'II', aql: 1.0, severity: 'reduced' });
    expect(switchingLotResult(plan, 1.0, 2)).toMatchObject({ accepted: true, reducedGapAccept: true, acceptNumber: 1 });
  });

  it('normal plan J at AQL 1.0 (Ac 2) with d = 1 would pass one step tighter (0.65: Ac 1, §1.3)', () => {
    const plan = singleSamplingPlan({ lotSize: 1_000, level: 'II', aql: 1.0, severity: 'normal' });
    expect(switchingLotResult(plan, 1.0, 1)).toEqual({
      accepted: true,
      acceptNumber: 2,
      defects: 1,
      wouldAcceptOneStepTighter: true,
      reducedGapAccept: false,
    });
  });

  it('a negative acceptance number in a lot result is refused naming acceptNumber', () => {
    expect(thrown(() => advanceSwitching(initialSwitchingState(), { ...ACCEPT, acceptNumber: -1 }, STEADY))).toMatchObject({
      field: 'acceptNumber',
    });
  });
});
