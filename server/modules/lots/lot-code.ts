import type { EntityManager } from 'typeorm';
import { makeLotCode } from '../../../shared/domain/labels/index.ts';

/**
 * Issues the next lot code of the day (UTC calendar day) inside the caller's transaction: the
 * upsert locks that day's counter row until commit, and a rollback gives the number back.
 */
export async function nextLotCode(m: EntityManager, now: Date): Promise<string> {
  const day = now.toISOString().slice(0, 10);
  const rows: { last: number }[] = await m.query(
    `INSERT INTO lot_code_counter (day, last) VALUES ($1, 1)
     ON CONFLICT (day) DO UPDATE SET last = lot_code_counter.last + 1
     RETURNING last`,
    [day],
  );
  return makeLotCode(now, rows[0].last);
}
