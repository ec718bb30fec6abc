import { describe, it, expect } from 'vitest';
import {
  AQL_VALUES,
  NORMAL_TABLE,
  REDUCED_TABLE,
  SAMPLE_SIZES,
  SamplingInputError,
  TIGHTENED_TABLE,
  masterTablePlan,
  oneStepTighterAcceptNumber,
  type CodeLetter,
  type MasterTable,
} from '../../../shared/domain/sampling/index.ts';
import { thrown } from './thrown.ts';

// reference.md §1.2 [published]: single-sampling sample sizes per code letter.
const LETTERS = 'A B C D E F G H J K L M N P Q R S'.split(' ') as CodeLetter[];
const SAMPLE_SIZE_ROWS = {
  normal: [2, 3, 5, 8, 13, 20, 32, 50, 80, 125, 200, 315, 500, 800, 1250, 2000],
  tightened: [2, 3, 5, 8, 13, 20, 32, 50, 80, 125, 200, 315, 500, 800, 1250, 2000, 3150],
  reduced: [2, 2, 2, 3, 5, 8, 13, 20, 32, 50, 80, 125, 200, 315, 500, 800],
} as const;

describe('SAMPLE_SIZES (ISO 2859-1, reference.md §1.2)', () => {
  it.each(Object.entries(SAMPLE_SIZE_ROWS))('%s sample sizes match the published row', (severity, sizes) => {
    const expected = Object.fromEntries(sizes.map((n, i) => [LETTERS[i], n]));
    expect(SAMPLE_SIZES[severity as keyof typeof SAMPLE_SIZE_ROWS]).toEqual(expected);
  });
});

// ISO 2859-1 Table 2-B as resolved in reference.md §1.4 [published; resolved after arrows].
// Row "A,B" of the reference is written out as rows A and B.
const TABLE_2B_RESOLVED = `
A | 315:0/1 | 200:0/1 | 125:0/1 | 80:0/1 | 50:0/1 | 32:0/1 | 20:0/1 | 13:0/1 | 8:0/1 | 5:0/1 | 3:0/1
B | 315:0/1 | 200:0/1 | 125:0/1 | 80:0/1 | 50:0/1 | 32:0/1 | 20:0/1 | 13:0/1 | 8:0/1 | 5:0/1 | 3:0/1
C | 315:0/1 | 200:0/1 | 125:0/1 | 80:0/1 | 50:0/1 | 32:0/1 | 20:0/1 | 13:0/1 | 8:0/1 | 5:0/1 | 13:1/2
D | 315:0/1 | 200:0/1 | 125:0/1 | 80:0/1 | 50:0/1 | 32:0/1 | 20:0/1 | 13:0/1 | 8:0/1 | 20:1/2 | 13:1/2
E | 315:0/1 | 200:0/1 | 125:0/1 | 80:0/1 | 50:0/1 | 32:0/1 | 20:0/1 | 13:0/1 | 32:1/2 | 20:1/2 | 13:1/2
F | 315:0/1 | 200:0/1 | 125:0/1 | 80:0/1 | 50:0/1 | 32:0/1 | 20:0/1 | 50:1/2 | 32:1/2 | 20:1/2 | 20:2/3
G | 315:0/1 | 200:0/1 | 125:0/1 | 80:0/1 | 50:0/1 | 32:0/1 | 80:1/2 | 50:1/2 | 32:1/2 | 32:2/3 | 32:3/4
H | 315:0/1 | 200:0/1 | 125:0/1 | 80:0/1 | 50:0/1 | 125:1/2 | 80:1/2 | 50:1/2 | 50:2/3 | 50:3/4 | 50:5/6
J | 315:0/1 | 200:0/1 | 125:0/1 | 80:0/1 | 200:1/2 | 125:1/2 | 80:1/2 | 80:2/3 | 80:3/4 | 80:5/6 | 80:8/9
K | 315:0/1 | 200:0/1 | 125:0/1 | 315:1/2 | 200:1/2 | 125:1/2 | 125:2/3 | 125:3/4 | 125:5/6 | 125:8/9 | 125:12/13
L | 315:0/1 | 200:0/1 | 500:1/2 | 315:1/2 | 200:1/2 | 200:2/3 | 200:3/4 | 200:5/6 | 200:8/9 | 200:12/13 | 200:18/19
M | 315:0/1 | 800:1/2 | 500:1/2 | 315:1/2 | 315:2/3 | 315:3/4 | 315:5/6 | 315:8/9 | 315:12/13 | 315:18/19 | 200:18/19
N | 1250:1/2 | 800:1/2 | 500:1/2 | 500:2/3 | 500:3/4 | 500:5/6 | 500:8/9 | 500:12/13 | 500:18/19 | 315:18/19 | 200:18/19
P | 1250:1/2 | 800:1/2 | 800:2/3 | 800:3/4 | 800:5/6 | 800:8/9 | 800:12/13 | 800:18/19 | 500:18/19 | 315:18/19 | 200:18/19
Q | 1250:1/2 | 1250:2/3 | 1250:3/4 | 1250:5/6 | 1250:8/9 | 1250:12/13 | 1250:18/19 | 800:18/19 | 500:18/19 | 315:18/19 | 200:18/19
R | 2000:2/3 | 2000:3/4 | 2000:5/6 | 2000:8/9 | 2000:12/13 | 2000:18/19 | 1250:18/19 | 800:18/19 | 500:18/19 | 315:18/19 | 200:18/19
`;

const tightenedCases = TABLE_2B_RESOLVED.trim()
  .split('\n')
  .flatMap((line) => {
    const [letter, ...cells] = line.split('|').map((c) => c.trim());
    return cells.map((cell, column) => {
      const [n, acRe] = cell.split(':');
      const [ac, re] = acRe.split('/');
      return {
        letter: letter as CodeLetter,
        aql: AQL_VALUES[column],
        sampleSize: Number(n),
        accept: Number(ac),
        reject: Number(re),
      };
    });
  });

describe('ISO 2859-1 Table 2-B as resolved in reference.md §1.4', () => {
  it('covers every letter A–R and every supported AQL', () => {
    expect(tightenedCases).toHaveLength(16 * AQL_VALUES.length);
  });

  it.each(tightenedCases)(
    'tightened, letter $letter, AQL $aql: n $sampleSize, Ac $accept, Re $reject',
    ({ letter, aql, sampleSize, accept, reject }) => {
      const plan = masterTablePlan('tightened', letter, aql);
      expect({ sampleSize: plan.sampleSize, accept: plan.accept, reject: plan.reject }).toEqual({
        sampleSize,
        accept,
        reject,
      });
      expect(SAMPLE_SIZES.tightened[plan.planLetter]).toBe(sampleSize);
    },
  );
});

function planCells(t: MasterTable) {
  return t.rows.flatMap((row) =>
    row.cells.flatMap((cell, column) => (cell.kind === 'plan' ? [{ letter: row.letter, column, ...cell }] : [])),
  );
}

describe('master table structure', () => {
  // reference.md §1.3 [published]: Ac series 0,1,2,3,5,7,10,14,21, Re = Ac + 1; the 0/1 cell moves one
  // AQL step per letter (A at 6.5 … L at 0.065).
  it('normal: every plan is Ac/Ac+1 from the published Ac series', () => {
    for (const cell of planCells(NORMAL_TABLE)) {
      expect([0, 1, 2, 3, 5, 7, 10, 14, 21]).toContain(cell.accept);
      expect(cell.reject).toBe(cell.accept + 1);
    }
  });

  it('normal: the 0/1 cell moves one AQL step tighter per letter from A at 6.5 to L at 0.065', () => {
    const zeroCells = planCells(NORMAL_TABLE).filter((c) => c.accept === 0);
    expect(zeroCells.map((c) => [c.letter, AQL_VALUES[c.column]])).toEqual(
      'A B C D E F G H J K L'.split(' ').map((l, i) => [l, AQL_VALUES[AQL_VALUES.length - 1 - i]]),
    );
  });

  // reference.md §1.4 [published]: tightened Ac series 0,1,2,3,5,8,12,18 with Re = Ac + 1.
  it('tightened: every plan is Ac/Ac+1 from the published Ac series', () => {
    for (const cell of planCells(TIGHTENED_TABLE)) {
      expect([0, 1, 2, 3, 5, 8, 12, 18]).toContain(cell.accept);
      expect(cell.reject).toBe(cell.accept + 1);
    }
  });

  // reference.md §1.5 [published series] with §1.2 reduced sample sizes; the cell-by-cell
  // correspondence (k-th normal Ac/Re ↔ k-th reduced Ac/Re, same arrows) is [derived], and matches
  // ANSI/ASQ Z1.4 Table II-C [from memory].
  it('reduced: same arrows as normal, Ac/Re mapped onto the Z1.4 gap series', () => {
    const normalSeries = ['0/1', '1/2', '2/3', '3/4', '5/6', '7/8', '10/11', '14/15', '21/22'];
    const reducedSeries = ['0/1', '0/2', '1/3', '1/4', '2/5', '3/6', '5/8', '7/10', '10/13'];
    const show = (cell: (typeof NORMAL_TABLE.rows)[number]['cells'][number]) =>
      cell.kind === 'plan' ? `${cell.accept}/${cell.reject}` : cell.kind;
    expect(REDUCED_TABLE.rows.map((r) => r.letter)).toEqual(NORMAL_TABLE.rows.map((r) => r.letter));
    NORMAL_TABLE.rows.forEach((row, i) => {
      const mapped = row.cells.map((c) => {
        const shown = show(c);
        const k = normalSeries.indexOf(shown);
        return k >= 0 ? reducedSeries[k] : shown;
      });
      expect(REDUCED_TABLE.rows[i].cells.map(show)).toEqual(mapped);
    });
  });

  it('reduced: letter K at AQL 1.0 uses n 50 with Ac 1, Re 4', () => {
    // [derived] from §1.3 (K, 1.0 → 3/4) and §1.5 (3/4 ↔ 1/4), §1.2 (K reduced n 50).
    expect(masterTablePlan('reduced', 'K', 1.0)).toEqual({ planLetter: 'K', sampleSize: 50, accept: 1, reject: 4 });
  });

  it('every letter of every table reaches a plan for every supported AQL', () => {
    for (const t of [NORMAL_TABLE, TIGHTENED_TABLE, REDUCED_TABLE]) {
      for (const row of t.rows.filter((r) => r.letter !== 'S')) {
        for (const aql of AQL_VALUES) {
          expect(masterTablePlan(t.severity, row.letter, aql).accept).toBeGreaterThanOrEqual(0);
        }
      }
    }
  });

  it('letter S on normal inspection is refused naming codeLetter', () => {
    expect(thrown(() => masterTablePlan('normal', 'S', 1.0))).toMatchObject({
      name: 'SamplingInputError',
      field: 'codeLetter',
    });
    expect(thrown(() => masterTablePlan('normal', 'S', 1.0))).toBeInstanceOf(SamplingInputError);
  });
});

describe('oneStepTighterAcceptNumber (Table 2-A, same row, next tighter AQL)', () => {
  it.each([
    // reference.md §1.3 [published]: J at 1.0 is 2/3 and at 0.65 is 1/2.
    { letter: 'J', aql: 1.0, expected: 1 },
    // K at 6.5 is 14/15, at 4.0 10/11.
    { letter: 'K', aql: 6.5, expected: 10 },
    // F at 4.0 is 2/3, at 2.5 1/2.
    { letter: 'F', aql: 4.0, expected: 1 },
    // R at 0.065 is 3/4; at 0.040 2/3 [derived from the diagonal structure of §1.3].
    { letter: 'R', aql: 0.065, expected: 2 },
    // H at 1.5 is 2/3; one step tighter, 1.0, is 1/2.
    { letter: 'H', aql: 1.5, expected: 1 },
  ] as const)('letter $letter at AQL $aql → Ac $expected', ({ letter, aql, expected }) => {
    expect(oneStepTighterAcceptNumber(letter, aql)).toBe(expected);
  });

  it('returns null when the tighter cell is an arrow (E at 1.5 is ↑)', () => {
    // reference.md §1.3: E row, 1.5 column is ↑.
    expect(oneStepTighterAcceptNumber('E', 2.5)).toBeNull();
  });
});
