export type Polarity = 'NPN' | 'PNP';

/** A measured part offered for matching; Vbe normalised to 25 °C (shared/domain/normalise). */
export interface MatchPart {
  readonly id: string | number;
  readonly polarity: Polarity;
  /** Forward current gain, dimensionless, > 0. */
  readonly hfe: number;
  /** Base–emitter voltage in mV at 25 °C (a PNP part may carry a negative sign). */
  readonly vbeMv: number;
}

/**
 * 'same': sets of one polarity (NPN and PNP parts in the input are matched within their own
 * polarity). 'complementary': one NPN with one PNP, comparing hFE and |Vbe|; pairs only.
 */
export type MatchMode = 'same' | 'complementary';

export interface MatchOptions {
  /** hFE tolerance t in %: |h1 − h2| / min(h1, h2) ≤ t/100 for every pair in a set. */
  readonly hfeTolerancePct: number;
  /** Vbe tolerance v in mV: |Vbe1 − Vbe2| ≤ v for every pair in a set. */
  readonly vbeToleranceMv: number;
  readonly setSize: 2 | 4;
  readonly mode: MatchMode;
}

export interface MatchedSet {
  /** Ids in ascending hFE order ('same'); [NPN, PNP] ('complementary'). */
  readonly partIds: (string | number)[];
  /** (max − min)/min of the set's hFE, in % — the largest pairwise spread by the tolerance definition. */
  readonly hfeSpreadPct: number;
  /** max − min of the set's Vbe (|Vbe| when complementary), in mV. */
  readonly vbeSpreadMv: number;
  /** hfeSpreadPct/t + vbeSpreadMv/v, each term at most 1 (setMismatch); dimensionless. */
  readonly mismatch: number;
}

export interface MatchResult {
  /** Sorted by mismatch, best first. */
  readonly sets: MatchedSet[];
  /** Ids of the parts in no set, in input order. */
  readonly unmatched: (string | number)[];
  /** How the sets were found, in words. */
  readonly method: string;
  /** True when both the number of sets and the total mismatch are proven optimal. */
  readonly optimal: boolean;
  /** When not optimal: a proven upper bound on the number of sets. */
  readonly upperBound?: number;
}
