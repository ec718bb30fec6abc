import type { EntityManager } from 'typeorm';
import { LabelFormatError, makeContainerCode } from '../../../shared/domain/labels/index.ts';
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
    // The code format has four digits per day (C-YYYYMMDD-NNNN): past 9 999 containers in one
    // day, refuse clearly (the caller's transaction rolls back) instead of failing with a 500.
    if (e instanceof LabelFormatError && e.field === 'sequence') {
      throw AppError.conflict(`Today's container numbers are used up (${last.toLocaleString('en')} containers needed, 9,999 per day); nothing was placed. Continue tomorrow or use larger containers.`, [
        { field: 'containers', message: 'no container numbers left for today' },
      ]);
    }
    throw e;
  }
}
