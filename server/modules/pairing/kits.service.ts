import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { CancelKitRequest, CreateKitRequest, KitDetail, KitStatus, PullKitPartRequest, PullKitPartResponse } from '../../../shared/api/pairing.ts';
import { CONTAINER_CODE_FORMAT, parseOwnCode } from '../../../shared/domain/labels/index.ts';
import { KittingInputError, checkPull, pullProgress, reservationEnd, reservationExpired } from '../../../shared/domain/kitting/index.ts';
import { adjustQuantity, statusAfter, type ContainerStatus } from '../../../shared/domain/screening/index.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { insertMovement } from '../bins/containers.service.ts';
import { nextKitCode } from './kit-code.ts';
import { releaseExpiredKits, releaseKitParts } from './kit-expiry.ts';
import { loadStock, planKit, resolveKitRequest } from './kit-plan.service.ts';
import { loadKitDetail, loadKitParts } from './kit-view.ts';

/** How long a reservation waits for another one working on the same stock before it gives up. */
const LOCK_TIMEOUT = '20s';

const pgCode = (e: unknown): string | undefined => {
  const x = e as { code?: string; driverError?: { code?: string } };
  return x?.code ?? x?.driverError?.code;
};

/**
 * Reserves a kit: re-plans from the stock as it is now and marks the planned positions reserved,
 * all in one transaction. The in-stock positions of the part type(s) are locked first (FOR
 * UPDATE in id order), so two assemblers reserving at the same moment run one after the other,
 * and the second plans from what the first left; the partial unique index on kit_part backs it
 * up. A kit is reserved whole or refused (409 naming setsWanted). A deadlock with another stock
 * change (PostgreSQL aborts one side) is retried.
 */
export async function reserveKit(ds: DataSource, actor: SessionUser, req: CreateKitRequest): Promise<KitDetail> {
  await releaseExpiredKits(ds);
  let until: Date;
  try {
    until = reservationEnd(new Date(), req.holdMinutes);
  } catch (e) {
    if (e instanceof KittingInputError) throw AppError.badRequest(`Check ${e.field}: ${e.message}.`, [{ field: e.field, message: e.message }]);
    throw e;
  }
  for (let attempt = 1; ; attempt++) {
    try {
      return await ds.transaction((m) => reserveInTransaction(m, actor, req, until));
    } catch (e) {
      const code = pgCode(e);
      if ((code === '40P01' || code === '40001') && attempt < 3) continue;
      if (code === '55P03') throw AppError.conflict('The stock is busy with another reservation. Try again in a moment.');
      throw e;
    }
  }
}

async function reserveInTransaction(m: EntityManager, actor: SessionUser, req: CreateKitRequest, until: Date): Promise<KitDetail> {
  await m.query(`SET LOCAL lock_timeout = '${LOCK_TIMEOUT}'`);
  const r = await resolveKitRequest(m, req);
  const stock = await loadStock(
    m,
    r.partTypes.map((p) => p.id),
    true,
  );
  const plan = planKit(r, stock);
  if (plan.setsPossible < r.setsWanted) {
    throw AppError.conflict(
      plan.setsPossible === 0
        ? `The stock on hand makes no ${r.setSize === 2 ? 'pair' : 'quad'} within ${r.hfeTolerancePct} % hFE and ${r.vbeToleranceMv} mV Vbe. Nothing was reserved.`
        : `The stock on hand makes only ${plan.setsPossible} of the ${r.setsWanted} sets wanted at these tolerances. Nothing was reserved; ask for ${plan.setsPossible} or widen the tolerances.`,
      [{ field: 'setsWanted', message: `at most ${plan.setsPossible} ${plan.setsPossible === 1 ? 'set' : 'sets'} can be made now` }],
    );
  }
  const now = new Date();
  const code = await nextKitCode(m, now);
  const [{ id }] = (await m.query(
    `INSERT INTO kit_request (code, mode, part_type_id, complement_part_type_id, set_size, sets_wanted, hfe_tolerance_pct, vbe_tolerance_mv, status, reserved_until, note, created_by)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, 'reserved', $9, $10, $11) RETURNING id`,
    [
      code,
      r.mode,
      r.partTypes[0]?.id,
      r.partTypes[1]?.id ?? null,
      r.setSize,
      r.setsWanted,
      r.hfeTolerancePct,
      r.vbeToleranceMv,
      until,
      req.note?.trim() || null,
      actor.id,
    ],
  )) as { id: number }[];
  const byPosition = new Map(stock.map((p) => [p.positionId, p]));
  const positionIds: string[] = [];
  for (const c of plan.chosen) {
    const s = c.set;
    const [{ id: setId }] = (await m.query(
      `INSERT INTO kit_set (kit_id, set_index, hfe_spread_pct, vbe_spread_mv, mismatch, mirror_ratio, offset_mv, hfe_ratio) VALUES ($1, $2, $3, $4, $5, $6, $7, $8) RETURNING id`,
      [id, s.index, s.hfeSpreadPct, s.vbeSpreadMv, s.mismatch, s.meaning.mirrorRatio, s.meaning.offsetMv, s.meaning.hfeRatio],
    )) as { id: number }[];
    const ps = c.positionIds.map((pid) => byPosition.get(pid)!);
    await m.query(
      `INSERT INTO kit_part (kit_id, kit_set_id, container_position_id, container_id, position, measurement_id, lot_id)
       SELECT $1, $2, t.cp, t.c, t.pos, t.me, t.lot FROM unnest($3::bigint[], $4::int[], $5::int[], $6::bigint[], $7::int[]) AS t(cp, c, pos, me, lot)`,
      [id, setId, ps.map((p) => p.positionId), ps.map((p) => p.containerId), ps.map((p) => p.position), ps.map((p) => p.measurementId), ps.map((p) => p.lotId)],
    );
    positionIds.push(...c.positionIds);
  }
  const [{ n: updated }] = (await m.query(
    `WITH u AS (UPDATE container_position SET state = 'reserved', state_changed_at = now() WHERE id = ANY($1::bigint[]) AND state = 'in-stock' RETURNING id) SELECT count(*)::int AS n FROM u`,
    [positionIds],
  )) as { n: number }[];
  // Cannot happen while the rows are locked; a guard against a future code path that forgets the lock.
  if (updated !== positionIds.length) throw new Error(`reserve ${code}: ${positionIds.length} positions planned, ${updated} reserved`);
  await recordAudit(m, {
    actor,
    action: 'kit.reserve',
    entityType: 'kit',
    entityId: id,
    after: {
      code,
      mode: r.mode,
      partTypes: r.partTypes.map((p) => p.partNumber),
      setSize: r.setSize,
      setsWanted: r.setsWanted,
      hfeTolerancePct: r.hfeTolerancePct,
      vbeToleranceMv: r.vbeToleranceMv,
      reservedUntil: until.toISOString(),
      parts: plan.pickList.map((p) => `${p.containerCode}/${p.position}`),
    },
  });
  return loadKitDetail(m, id);
}

interface LockedKit {
  id: number;
  code: string;
  status: KitStatus;
  reserved_until: Date | null;
}

async function lockKit(m: EntityManager, id: number): Promise<LockedKit> {
  const rows = (await m.query(`SELECT id, code, status, reserved_until FROM kit_request WHERE id = $1 FOR UPDATE`, [id])) as LockedKit[];
  if (!rows[0]) throw AppError.notFound(`Kit ${id}`);
  return rows[0];
}

function refuseClosed(k: LockedKit, doing: string): void {
  if (k.status === 'reserved' || k.status === 'picking') return;
  const why: Record<string, string> = {
    pulled: 'is complete: every part is pulled',
    cancelled: 'was cancelled',
    expired: 'expired: its reservation ran out and its parts went back to stock. Plan a new kit',
    planned: 'is only planned, not reserved',
  };
  throw AppError.conflict(`Kit ${k.code} ${why[k.status] ?? `is ${k.status}`}; it cannot be ${doing}.`);
}

/**
 * Cancels a reserved kit or one being picked: its unpulled parts go back to stock; parts already
 * pulled stay recorded with the kit (they are in the assembler's hands).
 */
export async function cancelKit(ds: DataSource, actor: SessionUser, id: number, input: CancelKitRequest): Promise<KitDetail> {
  await releaseExpiredKits(ds);
  return ds.transaction(async (m) => {
    const k = await lockKit(m, id);
    refuseClosed(k, 'cancelled');
    const released = await releaseKitParts(m, k.id);
    await m.query(`UPDATE kit_request SET status = 'cancelled', cancelled_at = now(), cancelled_by = $2, reserved_until = NULL, updated_at = now() WHERE id = $1`, [k.id, actor.id]);
    const reason = input.reason?.trim() || null;
    await recordAudit(m, {
      actor,
      action: 'kit.cancel',
      entityType: 'kit',
      entityId: k.id,
      before: { status: k.status },
      after: { status: 'cancelled', released },
      note: reason,
    });
    return loadKitDetail(m, k.id);
  });
}

/**
 * Pulls one part of a kit, confirmed by scanning its container (and position): the part leaves
 * stock (position `pulled`, container count −1, a `pull` movement naming the kit) and stays linked
 * to the kit, its lot and supplier lot. Lock order: the kit, then the container, then the position
 * (docs/bins.md). A scan that names no part of the kit is refused with 422, a part already
 * pulled with 409; both say what the kit needs instead.
 */
export async function pullKitPart(ds: DataSource, actor: SessionUser, id: number, input: PullKitPartRequest): Promise<PullKitPartResponse> {
  await releaseExpiredKits(ds);
  const own = parseOwnCode(input.containerCode);
  if (!own || own.kind !== 'container') {
    throw AppError.unprocessable(`"${input.containerCode.slice(0, 40)}" is not a container code (${CONTAINER_CODE_FORMAT}). Scan the container's label.`, [
      { field: 'containerCode', message: 'not a container code' },
    ]);
  }
  return ds.transaction(async (m) => {
    const k = await lockKit(m, id);
    refuseClosed(k, 'pulled from');
    if (reservationExpired(k.reserved_until, new Date())) {
      throw AppError.conflict(`The reservation of kit ${k.code} ran out at ${new Date(k.reserved_until as Date).toISOString()}; its parts go back to stock. Plan a new kit.`);
    }
    const parts = (await loadKitParts(m, k.id)).filter((p) => p.releasedAt === null);
    const check = checkPull(parts, own.code, input.position);
    if (!check.ok) {
      const detail = check.reason === 'already-pulled' && check.part?.pulledByName ? `${check.message.replace(/\.$/, '')} by ${check.part.pulledByName}.` : check.message;
      const err = { field: check.field, message: check.reason };
      throw check.reason === 'already-pulled' ? AppError.conflict(detail, [err]) : AppError.unprocessable(detail, [err]);
    }
    const part = check.part;
    const [c] = (await m.query(`SELECT id, code, capacity, quantity, status FROM container WHERE id = $1 FOR UPDATE`, [part.containerId])) as {
      id: number;
      code: string;
      capacity: number;
      quantity: number;
      status: ContainerStatus;
    }[];
    const [held] = (await m.query(
      `SELECT kp.id, kp.container_position_id, cp.state FROM kit_part kp JOIN container_position cp ON cp.id = kp.container_position_id
        WHERE kp.kit_id = $1 AND kp.container_id = $2 AND kp.position = $3 AND kp.released_at IS NULL AND kp.pulled_at IS NULL
        FOR UPDATE OF kp, cp`,
      [k.id, c.id, part.position],
    )) as { id: string; container_position_id: string; state: string }[];
    if (!held || held.state !== 'reserved') {
      throw AppError.conflict(`Position ${part.position} of ${c.code} is no longer reserved for kit ${k.code} (${held?.state ?? 'gone'}). Ask at the Bins desk.`);
    }
    const r = adjustQuantity(c, -1);
    if (!r.ok) throw AppError.conflict(`Container ${c.code}: ${r.message}.`);
    const status = statusAfter(c.status, r.quantity, c.capacity);
    await m.query(`UPDATE container_position SET state = 'pulled', state_changed_at = now() WHERE id = $1`, [held.container_position_id]);
    await m.query(`UPDATE container SET quantity = $2, status = $3, version = version + 1, updated_at = now() WHERE id = $1`, [c.id, r.quantity, status]);
    await insertMovement(m, c.id, actor, { kind: 'pull', delta: -1, after: r.quantity, positions: [part.position], measurementId: part.measurementId, reason: `Kit ${k.code}` });
    await m.query(`UPDATE kit_part SET pulled_at = now(), pulled_by = $2 WHERE id = $1`, [held.id, actor.id]);
    const after = parts.map((p) => (p === part ? { ...p, pulledAt: new Date().toISOString() } : p));
    const progress = pullProgress(after);
    const nextStatus: KitStatus = progress.complete ? 'pulled' : 'picking';
    await m.query(
      `UPDATE kit_request SET status = $2::varchar, updated_at = now(), completed_at = CASE WHEN $2::varchar = 'pulled' THEN now() ELSE completed_at END,
              reserved_until = CASE WHEN $2::varchar = 'pulled' THEN NULL ELSE reserved_until END WHERE id = $1`,
      [k.id, nextStatus],
    );
    await recordAudit(m, {
      actor,
      action: progress.complete ? 'kit.pull-complete' : 'kit.pull',
      entityType: 'kit',
      entityId: k.id,
      before: { status: k.status },
      after: { status: nextStatus, containerCode: c.code, position: part.position, measurementId: part.measurementId, lotId: part.lotId, progress: progress.text },
    });
    const kit = await loadKitDetail(m, k.id);
    const pulled = kit.pickList.find((p) => p.containerId === c.id && p.position === part.position && p.measurementId === part.measurementId) ?? part;
    return { kit, pulled, progress: progress.text };
  });
}

/** GET /api/kits/:id, after releasing expired reservations. */
export async function getKit(ds: DataSource, id: number): Promise<KitDetail> {
  await releaseExpiredKits(ds);
  return loadKitDetail(ds.manager, id);
}
