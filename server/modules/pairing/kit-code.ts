import type { EntityManager } from 'typeorm';
import { makeKitCode } from '../../../shared/domain/kitting/index.ts';

/**
 * Issues the next kit code of the day (UTC) inside the caller's transaction, like the container
 * codes: the upsert locks the day's counter row until commit and a rollback gives the number back.
 */
export async function nextKitCode(m: EntityManager, now: Date): Promise<string> {
  const day = now.toISOString().slice(0, 10);
  const rows: { last: number }[] = await m.query(
    `INSERT INTO kit_code_counter (day, last) VALUES ($1, 1)
     ON CONFLICT (day) DO UPDATE SET last = kit_code_counter.last + 1
     RETURNING last`,
    [day],
  );
  return makeKitCode(now, rows[0].last);
}
