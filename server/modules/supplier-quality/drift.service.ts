import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { AlertStatus, DriftAlertRow, NcrStatus } from '../../../shared/api/supplier-quality.ts';
import type { Page } from '../../../shared/api/page.ts';
import { compareLotWithHistory, type DriftResult } from '../../../shared/domain/drift/index.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { DriftAlert, DriftCheck } from './drift-alert.entity.ts';
import { FINAL_STATUSES, SAMPLE_READINGS_SQL } from './lot-readings.ts';

interface LotRow {
  id: number;
  code: string;
  supplier_id: number;
  part_type_id: number;
  status: string;
  received_at: Date;
  hfe_min: number | null;
  hfe_max: number | null;
}

/**
 * The drift check of a disposed lot: its sample hFE against the same supplier's accepted earlier
 * lots of the part (received no later than this lot, this lot excluded, and leaving out lots that
 * raised an alert themselves — an accepted mixed lot must not become the reference), with the
 * default thresholds of shared/domain/drift. Raises a drift alert when a check is flagged.
 *
 * Call it inside the transaction that disposes the lot. Idempotent: the drift_check row marks the
 * lot as done (insert … on conflict do nothing), so a second call, or the lazy sweep of
 * sweepDriftChecks running at the same time, changes nothing. A lot without readings, or not yet
 * disposed, is skipped (and not marked while not disposed).
 */
export async function onLotDisposed(manager: EntityManager, lotId: number): Promise<{ alertId: number | null } | null> {
  const [lot] = (await manager.query(
    `SELECT l.id, l.code, l.supplier_id, l.part_type_id, l.status, l.received_at, pt.hfe_min, pt.hfe_max
       FROM lot l JOIN part_type pt ON pt.id = l.part_type_id WHERE l.id = $1`,
    [lotId],
  )) as LotRow[];
  if (!lot || !(FINAL_STATUSES as readonly string[]).includes(lot.status)) return null;
  if (await manager.existsBy(DriftCheck, { lotId })) return null;

  const own = (await manager.query(`SELECT r.hfe_25 FROM (${SAMPLE_READINGS_SQL} AND m.lot_id = $1) r`, [lotId])) as { hfe_25: number }[];
  const history = (await manager.query(
    `SELECT r.hfe_25, r.lot_id FROM (${SAMPLE_READINGS_SQL}) r
       JOIN lot h ON h.id = r.lot_id
      WHERE h.supplier_id = $1 AND h.part_type_id = $2 AND h.status = 'accepted' AND h.id <> $3 AND h.received_at <= $4
        AND NOT EXISTS (SELECT 1 FROM drift_alert a WHERE a.lot_id = h.id)`,
    [lot.supplier_id, lot.part_type_id, lotId, lot.received_at],
  )) as { hfe_25: number; lot_id: number }[];

  let result: DriftResult | null = null;
  if (own.length > 0) {
    try {
      result = compareLotWithHistory({
        lot: own.map((r) => Number(r.hfe_25)),
        history: history.map((r) => Number(r.hfe_25)),
        historyLots: new Set(history.map((r) => r.lot_id)).size,
        limits: { hfeMin: lot.hfe_min, hfeMax: lot.hfe_max },
      });
    } catch (e) {
      // Never let the check block the disposition it follows: leave the lot unmarked, the lazy
      // sweep tries again and the error is in the log.
      console.error(`[binwright] drift check of lot ${lotId} failed`, e);
      return null;
    }
  }
  const inserted = (await manager.query(
    `INSERT INTO drift_check (lot_id, alert, result) VALUES ($1, $2, $3) ON CONFLICT (lot_id) DO NOTHING RETURNING lot_id`,
    [lotId, result?.alert ?? false, JSON.stringify(result ?? { skipped: 'the lot has no sample readings' })],
  )) as unknown[];
  if (inserted.length === 0 || !result?.alert) return { alertId: null };
  const alert = await manager.save(
    manager.create(DriftAlert, {
      lotId,
      supplierId: lot.supplier_id,
      partTypeId: lot.part_type_id,
      figures: result.figures,
      flags: result.flags,
      explanation: result.explanation,
      suggestedChecks: result.suggestedChecks,
      status: 'open',
    }),
  );
  await recordAudit(manager, {
    actor: null,
    action: 'drift-alert.raise',
    entityType: 'drift-alert',
    entityId: alert.id,
    after: { lotId, lotCode: lot.code, flags: result.flags.map((f) => f.check) },
    note: result.flags.map((f) => f.message).join(' ').slice(0, 500),
  });
  return { alertId: alert.id };
}

/**
 * Makes the drift check of disposed lots that have none yet (lots disposed before the hook
 * existed, demo data, or a check that failed): each in its own transaction, at most `limit` per
 * call, oldest first. Run before alerts are listed, so the list never misses a lot.
 */
export async function sweepDriftChecks(ds: DataSource, limit = 200): Promise<number> {
  const pending = (await ds.query(
    `SELECT l.id FROM lot l LEFT JOIN drift_check c ON c.lot_id = l.id
      WHERE l.status = ANY($1) AND c.lot_id IS NULL ORDER BY l.received_at, l.id LIMIT $2`,
    [[...FINAL_STATUSES], limit],
  )) as { id: number }[];
  for (const { id } of pending) await ds.transaction((m) => onLotDisposed(m, id));
  return pending.length;
}

interface AlertQueryRow {
  id: number;
  status: AlertStatus;
  figures: DriftAlertRow['figures'];
  flags: DriftAlertRow['flags'];
  explanation: string;
  suggested_checks: string[];
  raised_at: Date;
  acknowledged_at: Date | null;
  acknowledge_note: string | null;
  ack_name: string | null;
  lot_id: number;
  lot_code: string;
  lot_status: string;
  date_code: string | null;
  received_at: Date;
  supplier_id: number;
  supplier_code: string;
  supplier_name: string;
  part_type_id: number;
  part_number: string;
  ncrs: { id: number; code: string; status: NcrStatus }[] | null;
}

const ALERT_SELECT = `
  SELECT a.id, a.status, a.figures, a.flags, a.explanation, a.suggested_checks, a.raised_at, a.acknowledged_at, a.acknowledge_note,
         u.name AS ack_name, l.id AS lot_id, l.code AS lot_code, l.status AS lot_status, l.date_code, l.received_at,
         s.id AS supplier_id, s.code AS supplier_code, s.name AS supplier_name, pt.id AS part_type_id, pt.part_number,
         (SELECT json_agg(json_build_object('id', n.id, 'code', n.code, 'status', n.status) ORDER BY n.id)
            FROM ncr n WHERE n.alert_id = a.id OR n.lot_id = a.lot_id) AS ncrs
    FROM drift_alert a
    JOIN lot l ON l.id = a.lot_id
    JOIN supplier s ON s.id = a.supplier_id
    JOIN part_type pt ON pt.id = a.part_type_id
    LEFT JOIN app_user u ON u.id = a.acknowledged_by`;

function toAlertRow(r: AlertQueryRow): DriftAlertRow {
  return {
    id: r.id,
    lot: { id: r.lot_id, code: r.lot_code, status: r.lot_status, dateCode: r.date_code, receivedAt: new Date(r.received_at).toISOString() },
    supplier: { id: r.supplier_id, code: r.supplier_code, name: r.supplier_name },
    partType: { id: r.part_type_id, partNumber: r.part_number },
    figures: r.figures,
    flags: r.flags,
    explanation: r.explanation,
    suggestedChecks: r.suggested_checks,
    status: r.status,
    raisedAt: new Date(r.raised_at).toISOString(),
    acknowledged: r.acknowledged_at ? { by: r.ack_name ?? '', at: new Date(r.acknowledged_at).toISOString(), note: r.acknowledge_note ?? '' } : null,
    ncrs: r.ncrs ?? [],
  };
}

export interface AlertQuery {
  page: number;
  pageSize: number;
  status?: AlertStatus;
  supplierId?: number;
}

/** Drift alerts, newest first; the lazy sweep runs first so every disposed lot has been checked. */
export async function listAlerts(ds: DataSource, q: AlertQuery): Promise<Page<DriftAlertRow>> {
  await sweepDriftChecks(ds);
  const where: string[] = [];
  const params: unknown[] = [];
  if (q.status) {
    params.push(q.status);
    where.push(`a.status = $${params.length}`);
  }
  if (q.supplierId) {
    params.push(q.supplierId);
    where.push(`a.supplier_id = $${params.length}`);
  }
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [{ total }] = (await ds.query(`SELECT count(*)::int AS total FROM drift_alert a ${whereSql}`, params)) as { total: number }[];
  const rows = (await ds.query(`${ALERT_SELECT} ${whereSql} ORDER BY a.raised_at DESC, a.id DESC LIMIT $${params.length + 1} OFFSET $${params.length + 2}`, [
    ...params,
    q.pageSize,
    (q.page - 1) * q.pageSize,
  ])) as AlertQueryRow[];
  return { items: rows.map(toAlertRow), total, page: q.page, pageSize: q.pageSize };
}

export async function getAlert(m: DataSource | EntityManager, id: number): Promise<DriftAlertRow> {
  const [row] = (await m.query(`${ALERT_SELECT} WHERE a.id = $1`, [id])) as AlertQueryRow[];
  if (!row) throw AppError.notFound(`Drift alert ${id}`);
  return toAlertRow(row);
}

/** A buyer or quality engineer acknowledges an alert with a note (what was checked, what follows). */
export async function acknowledgeAlert(ds: DataSource, actor: SessionUser, id: number, note: string): Promise<DriftAlertRow> {
  return ds.transaction(async (m) => {
    const alert = await m.findOne(DriftAlert, { where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!alert) throw AppError.notFound(`Drift alert ${id}`);
    if (alert.status === 'acknowledged') throw AppError.conflict(`Drift alert ${id} is already acknowledged.`);
    alert.status = 'acknowledged';
    alert.acknowledgedBy = actor.id;
    alert.acknowledgedAt = new Date();
    alert.acknowledgeNote = note;
    await m.save(alert);
    await recordAudit(m, {
      actor,
      action: 'drift-alert.acknowledge',
      entityType: 'drift-alert',
      entityId: id,
      before: { status: 'open' },
      after: { status: 'acknowledged' },
      note: note.slice(0, 500),
    });
    return getAlert(m, id);
  });
}
