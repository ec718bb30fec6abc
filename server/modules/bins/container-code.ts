import type { EntityManager } from 'typeorm';
import { makeContainerCode } from '../../../shared/domain/labels/index.ts';

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
  return Array.from({ length: count }, (_, i) => makeContainerCode(now, last - count + 1 + i));
}
