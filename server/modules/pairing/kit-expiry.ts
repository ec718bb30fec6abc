import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import { recordAudit } from '../audit/audit.service.ts';

/**
 * Gives the parts a kit still holds (reserved, not pulled) back to stock, inside the caller's
 * transaction, which must hold the kit's row lock. Lock order as docs/bins.md: the containers
 * first (in id order), then the positions. Pulled parts stay with the kit. Returns how many
 * parts went back.
 */
export async function releaseKitParts(m: EntityManager, kitId: number): Promise<number> {
  const held = (await m.query(`SELECT container_position_id, container_id FROM kit_part WHERE kit_id = $1 AND pulled_at IS NULL AND released_at IS NULL`, [kitId])) as {
    container_position_id: string;
    container_id: number;
  }[];
  if (held.length === 0) return 0;
  const containers = [...new Set(held.map((h) => h.container_id))].sort((a, b) => a - b);
  await m.query(`SELECT id FROM container WHERE id = ANY($1) ORDER BY id FOR UPDATE`, [containers]);
  const positions = held.map((h) => String(h.container_position_id));
  await m.query(`SELECT id FROM container_position WHERE id = ANY($1) ORDER BY id FOR UPDATE`, [positions]);
  await m.query(`UPDATE container_position SET state = 'in-stock', state_changed_at = now() WHERE id = ANY($1) AND state = 'reserved'`, [positions]);
  await m.query(`UPDATE kit_part SET released_at = now() WHERE kit_id = $1 AND pulled_at IS NULL AND released_at IS NULL`, [kitId]);
  return held.length;
}

/**
 * Ends every reservation whose time has run out: the kit becomes `expired` and its unpulled
 * parts go back to stock, each kit in its own transaction with an audit entry by "system".
 * Called lazily before kits are read, planned, reserved or pulled, and usable as a periodic
 * sweep. A kit another transaction is working on (a pull holds its lock) is skipped: that
 * transaction checks the time itself. Returns the number of kits expired.
 */
export async function releaseExpiredKits(ds: DataSource, now: Date = new Date()): Promise<number> {
  const due = (await ds.query(`SELECT id FROM kit_request WHERE status IN ('reserved','picking') AND reserved_until <= $1 ORDER BY id LIMIT 200`, [now])) as { id: number }[];
  let expired = 0;
  for (const { id } of due) {
    const done = await ds.transaction(async (m) => {
      const rows = (await m.query(
        `SELECT id, code, status, reserved_until FROM kit_request WHERE id = $1 AND status IN ('reserved','picking') AND reserved_until <= $2 FOR UPDATE SKIP LOCKED`,
        [id, now],
      )) as { id: number; code: string; status: string; reserved_until: Date }[];
      const kit = rows[0];
      if (!kit) return false;
      const released = await releaseKitParts(m, kit.id);
      await m.query(`UPDATE kit_request SET status = 'expired', expired_at = now(), reserved_until = NULL, updated_at = now() WHERE id = $1`, [kit.id]);
      await recordAudit(m, {
        actor: null as Pick<SessionUser, 'id' | 'name'> | null,
        action: 'kit.expire',
        entityType: 'kit',
        entityId: kit.id,
        before: { status: kit.status, reservedUntil: new Date(kit.reserved_until).toISOString() },
        after: { status: 'expired', released },
        note: `reservation of ${kit.code} ran out`,
      });
      return true;
    });
    if (done) expired++;
  }
  return expired;
}
