import {
  SamplingInputError,
  Z19_SAMPLE_SIZES,
  S_METHOD_K_TABLE,
  sMethodK,
  singleSamplingPlan,
  zeroAcceptancePlan,
  type InspectionLevel,
  type Severity,
} from '../sampling/index.ts';

export type SamplingMethod = 'attribute' | 'zero-acceptance' | 'variables';

export interface LotPlanInput {
  method: SamplingMethod;
  lotSize: number;
  level: string;
  /** % nonconforming. */
  aql: number;
  severity: Severity;
  /** hFE limits; the s-method needs at least one. */
  hfeMin: number | null;
  hfeMax: number | null;
}

export interface LotPlanResult {
  method: SamplingMethod;
  severity: Severity;
  sampleSize: number;
  accept: number | null;
  reject: number | null;
  codeLetter: string | null;
  planLetter: string | null;
  k: number | null;
  hundredPercent: boolean;
  source: string;
  notes: string[];
}

/**
 * Z1.9 letters whose k is stored (S_METHOD_K_TABLE), largest sample first. The lot-size → letter
 * table of Z1.9 (Table A-2) is not stored, so the variables plan takes the largest of these whose
 * sample fits in the lot (reference.md §2 says that table must come from the standard).
 */
const VARIABLES_LETTERS = (Object.keys(S_METHOD_K_TABLE) as (keyof typeof S_METHOD_K_TABLE)[]).sort(
  (a, b) => Z19_SAMPLE_SIZES[b] - Z19_SAMPLE_SIZES[a],
);

/**
 * The plan a lot is inspected by, from the part type's sampling method:
 * - attribute: ISO 2859-1 single sampling at the severity (singleSamplingPlan);
 * - zero-acceptance: Ac 0 / Re 1 with the sample size of the ISO 2859-1 plan at the severity
 *   (zeroAcceptancePlan at normal; the same construction at tightened or reduced);
 * - variables: ANSI/ASQ Z1.9 s-method on hFE with a stored k (normal inspection only).
 * Throws SamplingInputError naming the input that has no plan. Product rule.
 */
export function planForLot(input: LotPlanInput): LotPlanResult {
  const { method, lotSize, aql, severity } = input;
  const level = input.level as InspectionLevel;
  if (method === 'attribute') {
    const p = singleSamplingPlan({ lotSize, level, aql, severity });
    return { method, severity, sampleSize: p.sampleSize, accept: p.accept, reject: p.reject, codeLetter: p.codeLetter, planLetter: p.planLetter, k: null, hundredPercent: p.hundredPercent, source: p.source, notes: [] };
  }
  if (method === 'zero-acceptance') {
    const base = severity === 'normal' ? zeroAcceptancePlan({ lotSize, level, aql }) : { ...singleSamplingPlan({ lotSize, level, aql, severity }), accept: 0, reject: 1 };
    const notes = ['Zero acceptance: one nonconforming part in the sample rejects the lot.'];
    if (severity !== 'normal') notes.push(`Sample size taken from the ISO 2859-1 ${severity} plan with Ac 0 / Re 1 (Binwright simplification).`);
    return {
      method,
      severity,
      sampleSize: base.sampleSize,
      accept: 0,
      reject: 1,
      codeLetter: base.codeLetter,
      planLetter: base.planLetter,
      k: null,
      hundredPercent: base.hundredPercent,
      source: severity === 'normal' ? base.source : `${base.source}; Ac 0 / Re 1 (c = 0)`,
      notes,
    };
  }
  if (input.hfeMin === null && input.hfeMax === null) {
    throw new SamplingInputError('hfeMin', 'the s-method needs an hFE limit on at least one side; the part type has none');
  }
  const letter = VARIABLES_LETTERS.find((l) => Z19_SAMPLE_SIZES[l] <= lotSize);
  if (!letter) {
    throw new SamplingInputError('lotSize', `the lot of ${lotSize} is smaller than the smallest stored s-method sample (${Math.min(...VARIABLES_LETTERS.map((l) => Z19_SAMPLE_SIZES[l]))}); use attribute sampling`);
  }
  const constant = sMethodK(letter, aql);
  const notes = [
    `Z1.9 Table A-2 (lot size → letter) is not stored: Binwright uses letter ${letter} (n = ${constant.n}), the largest letter with a stored k that fits the lot. Confirm against the standard.`,
    'The k values are recalled, not copied from the standard (each within 0.006 of values recomputed from its M table).',
  ];
  if (input.hfeMin !== null && input.hfeMax !== null) {
    notes.push('Both hFE limits are checked against the same k (separate control of each limit).');
  }
  if (severity !== 'normal') {
    notes.push(`Only normal-inspection k values are stored: the ${severity} severity of the switching state is NOT reflected in k. Decide with care.`);
  }
  return {
    method,
    severity,
    sampleSize: constant.n,
    accept: null,
    reject: null,
    codeLetter: letter,
    planLetter: letter,
    k: constant.k,
    hundredPercent: constant.n >= lotSize,
    source: constant.source,
    notes,
  };
}
