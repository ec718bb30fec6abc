import { SamplingInputError } from './errors.ts';

/** Inspection levels of ISO 2859-1: special S-1…S-4 and general I, II, III. */
export const INSPECTION_LEVELS = ['S-1', 'S-2', 'S-3', 'S-4', 'I', 'II', 'III'] as const;
export type InspectionLevel = (typeof INSPECTION_LEVELS)[number];

/** Sample-size code letters of ISO 2859-1 (no I, no O); S exists only for tightened inspection. */
export const CODE_LETTERS = [
  'A', 'B', 'C', 'D', 'E', 'F', 'G', 'H', 'J', 'K', 'L', 'M', 'N', 'P', 'Q', 'R', 'S',
] as const;
export type CodeLetter = (typeof CODE_LETTERS)[number];

interface Table1Row {
  /** Largest lot size of the row (inclusive); the row starts one above the previous row's bound. */
  readonly upTo: number;
  /** Letters in the order of INSPECTION_LEVELS. */
  readonly letters: readonly CodeLetter[];
}

// ISO 2859-1 Table 1 (= ANSI/ASQ Z1.4 Table I), reference.md §1.1. The special levels are not a
// fixed offset from level II, so every column is stored.
const TABLE_1: readonly Table1Row[] = [
  { upTo: 8, letters: ['A', 'A', 'A', 'A', 'A', 'A', 'B'] },
  { upTo: 15, letters: ['A', 'A', 'A', 'A', 'A', 'B', 'C'] },
  { upTo: 25, letters: ['A', 'A', 'B', 'B', 'B', 'C', 'D'] },
  { upTo: 50, letters: ['A', 'B', 'B', 'C', 'C', 'D', 'E'] },
  { upTo: 90, letters: ['B', 'B', 'C', 'C', 'C', 'E', 'F'] },
  { upTo: 150, letters: ['B', 'B', 'C', 'D', 'D', 'F', 'G'] },
  { upTo: 280, letters: ['B', 'C', 'D', 'E', 'E', 'G', 'H'] },
  { upTo: 500, letters: ['B', 'C', 'D', 'E', 'F', 'H', 'J'] },
  { upTo: 1_200, letters: ['C', 'C', 'E', 'F', 'G', 'J', 'K'] },
  { upTo: 3_200, letters: ['C', 'D', 'E', 'G', 'H', 'K', 'L'] },
  { upTo: 10_000, letters: ['C', 'D', 'F', 'G', 'J', 'L', 'M'] },
  { upTo: 35_000, letters: ['C', 'D', 'F', 'H', 'K', 'M', 'N'] },
  { upTo: 150_000, letters: ['D', 'E', 'G', 'J', 'L', 'N', 'P'] },
  { upTo: 500_000, letters: ['D', 'E', 'G', 'J', 'M', 'P', 'Q'] },
  { upTo: Number.POSITIVE_INFINITY, letters: ['D', 'E', 'H', 'K', 'N', 'Q', 'R'] },
];

/** Smallest lot size covered by ISO 2859-1 Table 1. */
export const MIN_LOT_SIZE = 2;

/** Throws SamplingInputError('lotSize') unless the lot size is a whole number ≥ 2. */
export function assertLotSize(lotSize: number): void {
  if (!Number.isSafeInteger(lotSize) || lotSize < MIN_LOT_SIZE) {
    throw new SamplingInputError(
      'lotSize',
      `lot size must be a whole number of at least ${MIN_LOT_SIZE} (got ${String(lotSize)}); ` +
        'a lot of one part is simply inspected 100 %',
    );
  }
}

/** Throws SamplingInputError('level') unless `level` is one of INSPECTION_LEVELS. */
export function assertInspectionLevel(level: unknown): asserts level is InspectionLevel {
  if (!(INSPECTION_LEVELS as readonly unknown[]).includes(level)) {
    throw new SamplingInputError(
      'level',
      `inspection level must be one of ${INSPECTION_LEVELS.join(', ')} (got ${String(level)})`,
    );
  }
}

/**
 * Sample-size code letter for a lot size (parts, whole number ≥ 2) and inspection level.
 * Source: ISO 2859-1 Table 1 (same as ANSI/ASQ Z1.4 Table I), reference.md §1.1.
 * A lot of 1 is rejected as input (Table 1 starts at 2): the caller inspects it 100 %.
 */
export function codeLetter(lotSize: number, level: InspectionLevel): CodeLetter {
  assertLotSize(lotSize);
  assertInspectionLevel(level);
  const column = INSPECTION_LEVELS.indexOf(level);
  const row = TABLE_1.find((r) => lotSize <= r.upTo);
  // The last row is unbounded, so a row is always found for a valid lot size.
  return (row ?? TABLE_1[TABLE_1.length - 1]).letters[column];
}
