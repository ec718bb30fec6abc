import { SamplingInputError } from './errors.ts';

/**
 * ANSI/ASQ Z1.9 sample-size code letters (they differ from ISO 2859-1's; Z1.9 uses I and has no A).
 * The lot-size → letter table (Z1.9 Table A-2) must be taken from the standard itself.
 */
export const Z19_LETTERS = ['B', 'C', 'D', 'E', 'F', 'G', 'H', 'I', 'J', 'K', 'L', 'M', 'N', 'P'] as const;
export type Z19Letter = (typeof Z19_LETTERS)[number];

/** Z1.9 s-method sample sizes n (parts) per code letter [published], reference.md §2. */
export const Z19_SAMPLE_SIZES: Readonly<Record<Z19Letter, number>> = {
  B: 3, C: 4, D: 5, E: 7, F: 10, G: 15, H: 20, I: 25, J: 35, K: 50, L: 75, M: 100, N: 150, P: 200,
};

/** AQL columns (%) of S_METHOD_K_TABLE. */
export const S_METHOD_K_AQLS = [0.65, 1.0, 1.5, 2.5, 4.0, 6.5] as const;

export const S_METHOD_K_SOURCE =
  'ANSI/ASQ Z1.9 Table B-1, normal inspection, s-method, single specification limit — ' +
  'from memory (reference.md §2), each within 0.006 of values recomputed from the published M table; ' +
  'confirm against the standard before relying on it';

/** Acceptability constants k, Z1.9 Table B-1 (normal), letters D, E, F only [from memory]. */
export const S_METHOD_K_TABLE: Readonly<Record<'D' | 'E' | 'F', readonly number[]>> = {
  //   0.65  1.0   1.5   2.5   4.0   6.5
  D: [1.65, 1.53, 1.4, 1.24, 1.07, 0.874],
  E: [1.75, 1.62, 1.5, 1.33, 1.15, 0.955],
  F: [1.84, 1.72, 1.58, 1.41, 1.23, 1.03],
};

export interface SMethodConstant {
  /** Acceptability constant (dimensionless). */
  readonly k: number;
  /** Sample size (parts) of the Z1.9 letter. */
  readonly n: number;
  readonly source: string;
}

/**
 * Acceptability constant k and sample size n for a Z1.9 code letter and AQL (%), s-method, normal
 * inspection, single limit. Only the letters and AQLs of S_METHOD_K_TABLE are known; anything else
 * throws SamplingInputError ('letter' or 'aql').
 */
export function sMethodK(letter: string, aql: number): SMethodConstant {
  if (!Object.hasOwn(S_METHOD_K_TABLE, letter)) {
    throw new SamplingInputError(
      'letter',
      `no s-method k is stored for Z1.9 letter ${letter}; known: ${Object.keys(S_METHOD_K_TABLE).join(', ')}`,
    );
  }
  const column = S_METHOD_K_AQLS.indexOf(aql as (typeof S_METHOD_K_AQLS)[number]);
  if (column < 0) {
    throw new SamplingInputError('aql', `no s-method k is stored for AQL ${aql} %; known: ${S_METHOD_K_AQLS.join(', ')}`);
  }
  const key = letter as keyof typeof S_METHOD_K_TABLE;
  return { k: S_METHOD_K_TABLE[key][column], n: Z19_SAMPLE_SIZES[key], source: S_METHOD_K_SOURCE };
}

export interface SMethodInput {
  /** Measured values of the sampled parts (e.g. hFE), in the unit of the limits. */
  readonly values: readonly number[];
  /** Lower specification limit L, same unit. */
  readonly lower?: number;
  /** Upper specification limit U, same unit. */
  readonly upper?: number;
  /** Acceptability constant k. */
  readonly k: number;
}

export interface SMethodDecision {
  readonly n: number;
  readonly mean: number;
  /** Sample standard deviation s, n − 1 divisor. */
  readonly sd: number;
  /** Q_L = (x̄ − L)/s, present when a lower limit is given. */
  readonly qL?: number;
  /** Q_U = (U − x̄)/s, present when an upper limit is given. */
  readonly qU?: number;
  readonly accept: boolean;
  /** One line per limit saying how its Q compares with k. */
  readonly reasons: readonly string[];
}

/** (distance)/s, with s = 0 giving ±∞ (or 0 when the mean sits on the limit). */
function quality(distance: number, sd: number): number {
  if (sd > 0) return distance / sd;
  return distance === 0 ? 0 : distance > 0 ? Number.POSITIVE_INFINITY : Number.NEGATIVE_INFINITY;
}

function fmt(x: number): string {
  return Number.isFinite(x) ? x.toFixed(3) : x > 0 ? '∞' : '−∞';
}

/**
 * Variables acceptance by the s-method (ISO 3951-1 / ANSI/ASQ Z1.9, reference.md §2):
 * Q_L = (x̄ − L)/s, Q_U = (U − x̄)/s with s using the n − 1 divisor; the lot is accepted when every
 * given limit has Q ≥ k. With both limits this checks each limit against the same k (separate
 * control of each limit); the combined double-limit procedure of the standards is not implemented.
 */
export function sMethodDecision(input: SMethodInput): SMethodDecision {
  const { values, lower, upper, k } = input;
  if (!Array.isArray(values) || values.length < 2 || !values.every((v) => Number.isFinite(v))) {
    throw new SamplingInputError('values', 'need at least 2 finite measured values');
  }
  if (lower === undefined && upper === undefined) {
    throw new SamplingInputError('lower', 'give a lower limit, an upper limit, or both');
  }
  if (lower !== undefined && !Number.isFinite(lower)) {
    throw new SamplingInputError('lower', `lower limit must be a finite number (got ${String(lower)})`);
  }
  if (upper !== undefined && !Number.isFinite(upper)) {
    throw new SamplingInputError('upper', `upper limit must be a finite number (got ${String(upper)})`);
  }
  if (lower !== undefined && upper !== undefined && lower >= upper) {
    throw new SamplingInputError('upper', 'upper limit must be above the lower limit');
  }
  if (!Number.isFinite(k) || k <= 0) {
    throw new SamplingInputError('k', `k must be a positive number (got ${String(k)})`);
  }

  const n = values.length;
  const mean = values.reduce((a, v) => a + v, 0) / n;
  const sd = Math.sqrt(values.reduce((a, v) => a + (v - mean) ** 2, 0) / (n - 1));
  const reasons: string[] = [];
  let accept = true;

  let qL: number | undefined;
  if (lower !== undefined) {
    qL = quality(mean - lower, sd);
    const ok = qL >= k;
    accept &&= ok;
    reasons.push(`Q_L = ${fmt(qL)} ${ok ? '≥' : '<'} k = ${k}: lower limit ${ok ? 'met' : 'not met'}`);
  }
  let qU: number | undefined;
  if (upper !== undefined) {
    qU = quality(upper - mean, sd);
    const ok = qU >= k;
    accept &&= ok;
    reasons.push(`Q_U = ${fmt(qU)} ${ok ? '≥' : '<'} k = ${k}: upper limit ${ok ? 'met' : 'not met'}`);
  }
  if (sd === 0) reasons.push('all values are equal (s = 0)');

  return {
    n,
    mean,
    sd,
    ...(qL !== undefined ? { qL } : {}),
    ...(qU !== undefined ? { qU } : {}),
    accept,
    reasons,
  };
}
