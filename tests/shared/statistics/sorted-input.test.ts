import { describe as suite, expect, it } from 'vitest';
import { andersonDarling, describe, histogram } from '../../../shared/domain/statistics/index.ts';
import { isAscending, sortedCopy } from '../../../shared/domain/statistics/errors.ts';

const shuffled = [5, 1, 4, 2, 3, 9, 7, 8, 6, 10];
const ascending = [...shuffled].sort((a, b) => a - b);

suite('already-sorted input (a caller sorts a large sample once)', () => {
  it('isAscending tells sorted from unsorted', () => {
    expect(isAscending(ascending)).toBe(true);
    expect(isAscending(shuffled)).toBe(false);
    expect(isAscending([])).toBe(true);
  });

  it('sortedCopy sorts unsorted input and copies sorted input, never touching the original', () => {
    const input = Float64Array.from(shuffled);
    expect([...sortedCopy(input)]).toEqual(ascending);
    expect([...input]).toEqual(shuffled);
    const sorted = Float64Array.from(ascending);
    const copy = sortedCopy(sorted);
    expect(copy).not.toBe(sorted);
    expect([...copy]).toEqual(ascending);
  });

  it('describe, histogram and Anderson–Darling give the same answers for sorted and unsorted input', () => {
    expect(describe(ascending)).toEqual(describe(shuffled));
    expect(histogram(ascending, { rule: 'sturges' })).toEqual(histogram(shuffled, { rule: 'sturges' }));
    expect(andersonDarling(ascending)).toEqual(andersonDarling(shuffled));
  });
});
