/** Bad input to a statistics function; `field` names the offending argument. */
export class StatisticsInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'StatisticsInputError';
    this.field = field;
  }
}

/** Throws unless `values` is non-empty (or at least `minCount` long) and every entry is finite. */
export function assertFiniteSample(values: ArrayLike<number>, field: string, minCount = 1): void {
  if (values.length < minCount) {
    throw new StatisticsInputError(
      field,
      minCount === 1 ? `${field} must not be empty` : `${field} needs at least ${minCount} values`,
    );
  }
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) {
      throw new StatisticsInputError(field, `${field}[${i}] is not a finite number`);
    }
  }
}

/** True when every entry is ≥ the one before it (one linear pass). */
export function isAscending(values: ArrayLike<number>): boolean {
  for (let i = 1; i < values.length; i++) if ((values[i] as number) < (values[i - 1] as number)) return false;
  return true;
}

/**
 * Ascending copy as a Float64Array (typed-array sort is numeric and fast). An input that is
 * already ascending is only copied, so a caller that sorts a large sample once can hand the same
 * sorted array to several statistics without paying for the sort again.
 */
export function sortedCopy(values: ArrayLike<number>): Float64Array {
  const sorted = Float64Array.from(values);
  if (!isAscending(sorted)) sorted.sort();
  return sorted;
}
