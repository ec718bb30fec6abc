import type { CodeLetter } from './code-letters.ts';
import { SamplingInputError } from './errors.ts';

/** AQL values (percent nonconforming) supported, in the column order of the master tables. */
export const AQL_VALUES = [0.065, 0.1, 0.15, 0.25, 0.4, 0.65, 1.0, 1.5, 2.5, 4.0, 6.5] as const;
export type Aql = (typeof AQL_VALUES)[number];

export const SEVERITIES = ['normal', 'tightened', 'reduced'] as const;
/** Inspection severity of ISO 2859-1 clause 9. */
export type Severity = (typeof SEVERITIES)[number];

/** One cell of a master table: a plan (Ac/Re), an arrow, or a blank the arrows never reach. */
export type MasterCell =
  | { readonly kind: 'plan'; readonly accept: number; readonly reject: number }
  | { readonly kind: 'down' }
  | { readonly kind: 'up' }
  | { readonly kind: 'blank' };

export interface MasterTableRow {
  readonly letter: CodeLetter;
  /** Sample size n (parts) of this row. */
  readonly sampleSize: number;
  /** One cell per AQL_VALUES entry. */
  readonly cells: readonly MasterCell[];
}

export interface MasterTable {
  readonly severity: Severity;
  readonly source: string;
  readonly rows: readonly MasterTableRow[];
}

/** A master-table plan after following the arrows. */
export interface ResolvedPlan {
  /** Row whose plan is used (differs from the code letter when an arrow was followed). */
  readonly planLetter: CodeLetter;
  readonly sampleSize: number;
  readonly accept: number;
  readonly reject: number;
}

// Cells are written as printed: "Ac/Re", ↓ (use the first plan below), ↑ (use the first plan
// above), — (blank).
function parseRow(letter: CodeLetter, sampleSize: number, text: string): MasterTableRow {
  const cells = text.trim().split(/\s+/).map((token): MasterCell => {
    if (token === '↓') return { kind: 'down' };
    if (token === '↑') return { kind: 'up' };
    if (token === '—') return { kind: 'blank' };
    const match = /^(\d+)\/(\d+)$/.exec(token);
    if (!match) throw new Error(`master table row ${letter}: bad cell "${token}"`);
    return { kind: 'plan', accept: Number(match[1]), reject: Number(match[2]) };
  });
  if (cells.length !== AQL_VALUES.length) {
    throw new Error(`master table row ${letter}: ${cells.length} cells, expected ${AQL_VALUES.length}`);
  }
  return { letter, sampleSize, cells };
}

function table(
  severity: Severity,
  source: string,
  rows: readonly (readonly [CodeLetter, number, string])[],
): MasterTable {
  return { severity, source, rows: rows.map(([l, n, text]) => parseRow(l, n, text)) };
}

/**
 * ISO 2859-1 Table 2-A, single sampling, normal inspection (= ANSI/ASQ Z1.4 Table II-A),
 * columns 0.065…6.5 % (reference.md §1.3).
 */
export const NORMAL_TABLE: MasterTable = table(
  'normal',
  'ISO 2859-1 Table 2-A (single sampling, normal inspection)',
  [
    //          0.065 0.10  0.15  0.25  0.40  0.65  1.0   1.5   2.5   4.0   6.5
    ['A', 2, '    ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓    0/1'],
    ['B', 3, '    ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓    0/1    ↑ '],
    ['C', 5, '    ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓    0/1    ↑     ↓ '],
    ['D', 8, '    ↓     ↓     ↓     ↓     ↓     ↓     ↓    0/1    ↑     ↓    1/2'],
    ['E', 13, '   ↓     ↓     ↓     ↓     ↓     ↓    0/1    ↑     ↓    1/2   2/3'],
    ['F', 20, '   ↓     ↓     ↓     ↓     ↓    0/1    ↑     ↓    1/2   2/3   3/4'],
    ['G', 32, '   ↓     ↓     ↓     ↓    0/1    ↑     ↓    1/2   2/3   3/4   5/6'],
    ['H', 50, '   ↓     ↓     ↓    0/1    ↑     ↓    1/2   2/3   3/4   5/6   7/8'],
    ['J', 80, '   ↓     ↓    0/1    ↑     ↓    1/2   2/3   3/4   5/6   7/8  10/11'],
    ['K', 125, '  ↓    0/1    ↑     ↓    1/2   2/3   3/4   5/6   7/8  10/11 14/15'],
    ['L', 200, ' 0/1    ↑     ↓    1/2   2/3   3/4   5/6   7/8  10/11 14/15 21/22'],
    ['M', 315, '  ↑     ↓    1/2   2/3   3/4   5/6   7/8  10/11 14/15 21/22   ↑  '],
    ['N', 500, '  ↓    1/2   2/3   3/4   5/6   7/8  10/11 14/15 21/22   ↑     ↑  '],
    ['P', 800, ' 1/2   2/3   3/4   5/6   7/8  10/11 14/15 21/22   ↑     ↑     ↑  '],
    ['Q', 1250, '2/3   3/4   5/6   7/8  10/11 14/15 21/22   ↑     ↑     ↑     ↑  '],
    ['R', 2000, '3/4   5/6   7/8  10/11 14/15 21/22   ↑     ↑     ↑     ↑     ↑  '],
  ],
);

/**
 * ISO 2859-1 Table 2-B, single sampling, tightened inspection (= ANSI/ASQ Z1.4 Table II-B),
 * columns 0.065…6.5 %. Ac series 0,1,2,3,5,8,12,18; in each column the 0/1 cell sits one letter
 * lower than in Table 2-A and is followed by two ↓ cells, then 1/2 (reference.md §1.4). Resolves to
 * exactly the table printed in reference.md §1.4. Row S (n = 3150) carries a plan only in AQL
 * columns below 0.065 [from memory]; no arrow in the supported columns reaches it, so it is blank.
 */
export const TIGHTENED_TABLE: MasterTable = table(
  'tightened',
  'ISO 2859-1 Table 2-B (single sampling, tightened inspection)',
  [
    //          0.065 0.10  0.15  0.25  0.40  0.65  1.0   1.5   2.5   4.0   6.5
    ['A', 2, '    ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓ '],
    ['B', 3, '    ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓    0/1'],
    ['C', 5, '    ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓    0/1    ↓ '],
    ['D', 8, '    ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓    0/1    ↓     ↓ '],
    ['E', 13, '   ↓     ↓     ↓     ↓     ↓     ↓     ↓    0/1    ↓     ↓    1/2'],
    ['F', 20, '   ↓     ↓     ↓     ↓     ↓     ↓    0/1    ↓     ↓    1/2   2/3'],
    ['G', 32, '   ↓     ↓     ↓     ↓     ↓    0/1    ↓     ↓    1/2   2/3   3/4'],
    ['H', 50, '   ↓     ↓     ↓     ↓    0/1    ↓     ↓    1/2   2/3   3/4   5/6'],
    ['J', 80, '   ↓     ↓     ↓    0/1    ↓     ↓    1/2   2/3   3/4   5/6   8/9'],
    ['K', 125, '  ↓     ↓    0/1    ↓     ↓    1/2   2/3   3/4   5/6   8/9  12/13'],
    ['L', 200, '  ↓    0/1    ↓     ↓    1/2   2/3   3/4   5/6   8/9  12/13 18/19'],
    ['M', 315, ' 0/1    ↓     ↓    1/2   2/3   3/4   5/6   8/9  12/13 18/19   ↑  '],
    ['N', 500, '  ↓     ↓    1/2   2/3   3/4   5/6   8/9  12/13 18/19   ↑     ↑  '],
    ['P', 800, '  ↓    1/2   2/3   3/4   5/6   8/9  12/13 18/19   ↑     ↑     ↑  '],
    ['Q', 1250, '1/2   2/3   3/4   5/6   8/9  12/13 18/19   ↑     ↑     ↑     ↑  '],
    ['R', 2000, '2/3   3/4   5/6   8/9  12/13 18/19   ↑     ↑     ↑     ↑     ↑  '],
    ['S', 3150, ' —     —     —     —     —     —     —     —     —     —     —  '],
  ],
);

/**
 * Reduced inspection, single sampling, in the ANSI/ASQ Z1.4 (MIL-STD-105E) Table II-C convention:
 * the arrows sit where Table 2-A has them, each row uses the reduced sample size of its letter,
 * and the normal Ac/Re 0/1, 1/2, 2/3, 3/4, 5/6, 7/8, 10/11, 14/15, 21/22 become
 * 0/1, 0/2, 1/3, 1/4, 2/5, 3/6, 5/8, 7/10, 10/13 (reference.md §1.2, §1.5). A result with
 * Ac < d < Re accepts the lot but reinstates normal inspection. ISO 2859-1:1999 may have redesigned
 * reduced plans without the gap [from memory, unverified]; this table is labelled Z1.4.
 */
export const REDUCED_TABLE: MasterTable = table(
  'reduced',
  'ANSI/ASQ Z1.4 Table II-C convention (single sampling, reduced inspection, Ac/Re with a gap)',
  [
    //          0.065 0.10  0.15  0.25  0.40  0.65  1.0   1.5   2.5   4.0   6.5
    ['A', 2, '    ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓    0/1'],
    ['B', 2, '    ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓    0/1    ↑ '],
    ['C', 2, '    ↓     ↓     ↓     ↓     ↓     ↓     ↓     ↓    0/1    ↑     ↓ '],
    ['D', 3, '    ↓     ↓     ↓     ↓     ↓     ↓     ↓    0/1    ↑     ↓    0/2'],
    ['E', 5, '    ↓     ↓     ↓     ↓     ↓     ↓    0/1    ↑     ↓    0/2   1/3'],
    ['F', 8, '    ↓     ↓     ↓     ↓     ↓    0/1    ↑     ↓    0/2   1/3   1/4'],
    ['G', 13, '   ↓     ↓     ↓     ↓    0/1    ↑     ↓    0/2   1/3   1/4   2/5'],
    ['H', 20, '   ↓     ↓     ↓    0/1    ↑     ↓    0/2   1/3   1/4   2/5   3/6'],
    ['J', 32, '   ↓     ↓    0/1    ↑     ↓    0/2   1/3   1/4   2/5   3/6   5/8'],
    ['K', 50, '   ↓    0/1    ↑     ↓    0/2   1/3   1/4   2/5   3/6   5/8   7/10'],
    ['L', 80, '  0/1    ↑     ↓    0/2   1/3   1/4   2/5   3/6   5/8   7/10 10/13'],
    ['M', 125, '  ↑     ↓    0/2   1/3   1/4   2/5   3/6   5/8   7/10 10/13   ↑  '],
    ['N', 200, '  ↓    0/2   1/3   1/4   2/5   3/6   5/8   7/10 10/13   ↑     ↑  '],
    ['P', 315, ' 0/2   1/3   1/4   2/5   3/6   5/8   7/10 10/13   ↑     ↑     ↑  '],
    ['Q', 500, ' 1/3   1/4   2/5   3/6   5/8   7/10 10/13   ↑     ↑     ↑     ↑  '],
    ['R', 800, ' 1/4   2/5   3/6   5/8   7/10 10/13   ↑     ↑     ↑     ↑     ↑  '],
  ],
);

/** The three single-sampling master tables by severity. */
export const MASTER_TABLES: Readonly<Record<Severity, MasterTable>> = {
  normal: NORMAL_TABLE,
  tightened: TIGHTENED_TABLE,
  reduced: REDUCED_TABLE,
};

/**
 * Sample size n (parts) per code letter and severity, single sampling (ISO 2859-1 Tables 2-A,
 * 2-B; reduced per the Z1.4 convention; reference.md §1.2). Letter S exists only for tightened.
 */
export const SAMPLE_SIZES: Readonly<Record<Severity, Readonly<Partial<Record<CodeLetter, number>>>>> = {
  normal: sampleSizesOf(NORMAL_TABLE),
  tightened: sampleSizesOf(TIGHTENED_TABLE),
  reduced: sampleSizesOf(REDUCED_TABLE),
};

function sampleSizesOf(t: MasterTable): Partial<Record<CodeLetter, number>> {
  return Object.fromEntries(t.rows.map((r) => [r.letter, r.sampleSize]));
}

/** Throws SamplingInputError('aql') unless `aql` is one of AQL_VALUES; returns its column index. */
export function aqlColumn(aql: number): number {
  const column = AQL_VALUES.indexOf(aql as Aql);
  if (column < 0) {
    throw new SamplingInputError(
      'aql',
      `AQL must be one of ${AQL_VALUES.join(', ')} % (got ${String(aql)})`,
    );
  }
  return column;
}

/** Throws SamplingInputError('severity') unless `severity` is normal, tightened or reduced. */
export function assertSeverity(severity: unknown): asserts severity is Severity {
  if (!(SEVERITIES as readonly unknown[]).includes(severity)) {
    throw new SamplingInputError(
      'severity',
      `severity must be one of ${SEVERITIES.join(', ')} (got ${String(severity)})`,
    );
  }
}

/**
 * The single-sampling plan for a code letter and AQL (%) at a severity, following ↓/↑ to the first
 * plan below/above in the same AQL column, as the master tables instruct (ISO 2859-1 clause 10,
 * Tables 2-A/2-B; Z1.4 Table II-C for reduced). Sample size in parts.
 */
export function masterTablePlan(severity: Severity, letter: CodeLetter, aql: number): ResolvedPlan {
  assertSeverity(severity);
  const column = aqlColumn(aql);
  const rows = MASTER_TABLES[severity].rows;
  let index = rows.findIndex((r) => r.letter === letter);
  if (index < 0) {
    throw new SamplingInputError('codeLetter', `code letter ${String(letter)} has no ${severity} plan`);
  }
  const start = rows[index].cells[column];
  const step = start.kind === 'down' ? 1 : start.kind === 'up' ? -1 : 0;
  for (;;) {
    const row = rows[index];
    const cell = row.cells[column];
    if (cell.kind === 'plan') {
      return { planLetter: row.letter, sampleSize: row.sampleSize, accept: cell.accept, reject: cell.reject };
    }
    index += step;
    const expected = step > 0 ? 'down' : 'up';
    // An arrow must lead through cells of the same arrow to a plan; anything else is a table error.
    if (step === 0 || index < 0 || index >= rows.length || !['plan', expected].includes(rows[index].cells[column].kind)) {
      throw new Error(`${severity} master table: no plan reachable from ${letter} at AQL ${aql}`);
    }
  }
}

/**
 * Acceptance number of Table 2-A one AQL step tighter than `aql`, in the same row (same sample),
 * or null when that cell is an arrow. Used by the ISO 2859-1:1999 switching score. For 0.065 the
 * tighter column is 0.040, which is outside AQL_VALUES; its two plan cells reachable here (rows Q
 * and R) are derived from the diagonal structure of Table 2-A (reference.md §1.3).
 */
export function oneStepTighterAcceptNumber(planLetter: CodeLetter, aql: number): number | null {
  const column = aqlColumn(aql);
  if (column === 0) return ACCEPT_AT_0_040[planLetter] ?? null;
  const row = NORMAL_TABLE.rows.find((r) => r.letter === planLetter);
  const cell = row?.cells[column - 1];
  return cell?.kind === 'plan' ? cell.accept : null;
}

// Table 2-A, AQL 0.040 column, the plan cells of rows Q and R (M 0/1, N ↑, P ↓, Q 1/2, R 2/3)
// [derived: the pattern of each column moves one letter down per AQL step tighter].
const ACCEPT_AT_0_040: Partial<Record<CodeLetter, number>> = { Q: 1, R: 2 };
