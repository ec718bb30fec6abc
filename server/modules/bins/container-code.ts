import type { EntityManager } from 'typeorm';
import { LabelFormatError, makeContainerCode, MAX_OWN_CODE_SEQUENCE } from '../../../shared/domain/labels/index.ts';
import { AppError } from '../../http/app-error.ts';

/**
 * Issues the next container code of the day (UTC calendar day) inside the caller's transaction,
 * like the lot codes: the upsert locks that day's counter row until commit, and a rollback gives
 * the number back, so codes stay unique and gap-free.
 */
export async function nextContainerCodes(m: EntityManager, now: Date, count: number): Promise<string[]> {
  if (count < 1) return [];
  const day = now.toISOString().slice(0, 10);
  const rows: { last: number }[] = await m.query(
    `INSERT INTO container_code_counter (day, last) VALUES ($1, $2)
     ON CONFLICT (day) DO UPDATE SET last = container_code_counter.last + $2
     RETURNING last`,
    [day, count],
  );
  const last = rows[0].last;
  try {
    return Array.from({ length: count }, (_, i) => makeContainerCode(now, last - count + 1 + i));
  } catch (e) {
    // The sequence grows from four to six digits (C-YYYYMMDD-0001 … C-YYYYMMDD-999999): past
    // 999 999 containers in one day, refuse clearly (the caller's transaction rolls back and
    // gives the numbers back) instead of failing with a 500.
    if (e instanceof LabelFormatError && e.field === 'sequence') {
      throw AppError.conflict(
        `Today's container numbers are used up (${last.toLocaleString('en')} containers needed, ${MAX_OWN_CODE_SEQUENCE.toLocaleString('en')} per day); nothing was placed. Continue tomorrow or use larger containers.`,
        [{ field: 'containers', message: 'no container numbers left for today' }],
      );
    }
    throw e;
  }
}

/**
 * SQL expression that sorts container codes in issue order (`column` holds the code): the
 * sequence padded to six digits, so C-20261201-9999 comes before C-20261201-10000. Same key as
 * `ownCodeSortKey` in shared/domain/labels.
 */
export function containerCodeOrderSql(column: string): string {
  const seq = `substr(${column}, 12)`;
  // greatest(): lpad cuts longer text, and a code not of our form must keep all its characters.
  return `(left(${column}, 11) || lpad(${seq}, greatest(6, length(${seq})), '0'))`;
}
