import { describe, it, expect } from 'vitest';
import {
  INSPECTION_LEVELS,
  SamplingInputError,
  codeLetter,
  type CodeLetter,
  type InspectionLevel,
} from '../../../shared/domain/sampling/index.ts';
import { thrown } from './thrown.ts';

// ISO 2859-1 Table 1 [published], reference.md §1.1; letters in the order S-1, S-2, S-3, S-4, I, II, III.
// Each row is checked at both ends of its lot-size range.
const TABLE_1_SAMPLE: readonly (readonly [number, number, string])[] = [
  [2, 8, 'A A A A A A B'],
  [9, 15, 'A A A A A B C'],
  [26, 50, 'A B B C C D E'],
  [91, 150, 'B B C D D F G'],
  [151, 280, 'B C D E E G H'],
  [501, 1_200, 'C C E F G J K'],
  [3_201, 10_000, 'C D F G J L M'],
  [10_001, 35_000, 'C D F H K M N'],
  [150_001, 500_000, 'D E G J M P Q'],
  [500_001, 1_000_000_000, 'D E H K N Q R'],
];

const cases = TABLE_1_SAMPLE.flatMap(([low, high, letters]) =>
  letters.split(' ').flatMap((letter, i) =>
    [low, high].map((lotSize) => ({ lotSize, level: INSPECTION_LEVELS[i], letter: letter as CodeLetter })),
  ),
);

describe('codeLetter (ISO 2859-1 Table 1)', () => {
  it.each(cases)('lot of $lotSize at level $level gets code letter $letter', ({ lotSize, level, letter }) => {
    expect(codeLetter(lotSize, level)).toBe(letter);
  });

  it.each([1, 0, -5, 2.5, Number.NaN, Number.POSITIVE_INFINITY])(
    'a lot size of %s is refused naming lotSize',
    (lotSize) => {
      const error = thrown(() => codeLetter(lotSize, 'II'));
      expect(error).toBeInstanceOf(SamplingInputError);
      expect(error).toMatchObject({ field: 'lotSize' });
    },
  );

  it('an unknown inspection level is refused naming level', () => {
    const error = thrown(() => codeLetter(100, 'IV' as InspectionLevel));
    expect(error).toBeInstanceOf(SamplingInputError);
    expect(error).toMatchObject({ field: 'level' });
  });
});
