import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { CorrectMeasurementRequest, MeasurementRow, MeasurementSort, RecordMeasurementRequest } from '../../../shared/api/measurements.ts';
import type { Page } from '../../../shared/api/users.ts';
import { checkReading, limitFlags, type RawReading, type Reading } from '../../../shared/domain/inspection/index.ts';
import { normaliseHfe, normaliseVbeMv } from '../../../shared/domain/normalise/index.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { assertMeasurable, loadLotContext } from '../bench/lot-context.ts';
import type { PartType } from '../catalog/part-type.entity.ts';
import { Lot } from '../lots/lot.entity.ts';
import { Measurement } from './measurement.entity.ts';
import { MeasurementSession } from './measurement-session.entity.ts';
import { markInspecting, openSessionOf } from './sessions.service.ts';
import { placeRecordedReading } from '../bins/screening.service.ts';

/** Converts and checks a reading; 422 naming each bad field. */
export function readingOrThrow(raw: RawReading): Reading {
  const { reading, errors } = checkReading(raw);
  if (!reading) throw AppError.unprocessable(`Check ${errors.map((e) => e.field).join(', ')}.`, errors);
  return reading;
}

/** hFE and Vbe referred to 25 °C with the part type's coefficients (shared/domain/normalise). */
export function normalise(reading: Reading, ambientC: number, part: Pick<PartType, 'hfeTcPctPerC' | 'vbeTcMvPerC'>): { hfe25: number; vbeMv25: number } {
  return {
    hfe25: normaliseHfe(reading.hfe, ambientC, part.hfeTcPctPerC),
    vbeMv25: normaliseVbeMv(reading.vbeMv, ambientC, part.vbeTcMvPerC),
  };
}

export interface RowExtras {
  ambient_c: number;
  creator_name: string;
}

/** The stored fields of a reading that its API row shows. */
export type StoredReading = Pick<
  Measurement,
  'id' | 'sessionId' | 'position' | 'hfe' | 'vbeMv' | 'vceSatMv' | 'leakageNa' | 'hfe25' | 'vbeMv25' | 'source' | 'supersedesId' | 'superseded' | 'correctionReason' | 'createdAt'
>;

export function toRow(m: StoredReading, extras: RowExtras, part: Pick<PartType, 'hfeMin' | 'hfeMax' | 'vbeMinMv' | 'vbeMaxMv'>): MeasurementRow {
  return {
    id: String(m.id),
    sessionId: m.sessionId,
    position: m.position,
    hfe: m.hfe,
    vbeMv: m.vbeMv,
    vceSatMv: m.vceSatMv,
    leakageNa: m.leakageNa,
    hfe25: m.hfe25,
    vbeMv25: m.vbeMv25,
    ambientC: extras.ambient_c,
    source: m.source,
    supersedesId: m.supersedesId === null ? null : String(m.supersedesId),
    superseded: m.superseded,
    correctionReason: m.correctionReason,
    createdByName: extras.creator_name,
    createdAt: new Date(m.createdAt).toISOString(),
    flags: limitFlags(part, m.hfe25, m.vbeMv25),
  };
}

function readingRow(
  m: EntityManager,
  actor: SessionUser,
  session: MeasurementSession,
  part: PartType,
  position: number,
  reading: Reading,
  extra: { supersedesId?: string; correctionReason?: string } = {},
): Measurement {
  const { hfe25, vbeMv25 } = normalise(reading, session.ambientC, part);
  return m.create(Measurement, {
    lotId: session.lotId,
    sessionId: session.id,
    position,
    hfe: reading.hfe,
    vbeMv: reading.vbeMv,
    vceSatMv: reading.vceSatMv,
    leakageNa: reading.leakageNa,
    hfe25,
    vbeMv25,
    source: 'grid',
    sourceRow: null,
    supersedesId: extra.supersedesId ?? null,
    superseded: false,
    correctionReason: extra.correctionReason ?? null,
    createdBy: actor.id,
  });
}

async function insertReading(
  m: EntityManager,
  actor: SessionUser,
  session: MeasurementSession,
  part: PartType,
  position: number,
  reading: Reading,
  extra: { supersedesId?: string; correctionReason?: string } = {},
): Promise<Measurement> {
  return m.save(readingRow(m, actor, session, part, position, reading, extra));
}

/**
 * Inserts a new reading unless its position already has a current one; then answers null.
 * ON CONFLICT DO NOTHING (the unique index measurement_current_position_key decides), so a
 * repeated scan is neither a failed statement nor an aborted transaction.
 */
async function insertIfPositionFree(
  m: EntityManager,
  actor: SessionUser,
  session: MeasurementSession,
  part: PartType,
  position: number,
  reading: Reading,
): Promise<Measurement | null> {
  const row = readingRow(m, actor, session, part, position, reading);
  const res = await m.createQueryBuilder().insert().into(Measurement).values(row).orIgnore().returning(['id', 'created_at']).execute();
  const inserted = (res.raw as { id: string; created_at: Date }[])[0];
  if (!inserted) return null;
  return Object.assign(row, { id: String(inserted.id), createdAt: inserted.created_at });
}

/**
 * The session, the lot and its part type a grid reading is recorded against, in two queries.
 * A sampling reading takes a shared lock on the lot, so several benches record on one lot at
 * once, while a disposition being proposed or signed (it locks the lot exclusively) waits for
 * them and stops later readings. A screening reading (it hands out container positions) and a
 * reading on a lot still "received" (it moves the lot to inspecting) take the exclusive lock, so
 * no two transactions ever try to upgrade a shared lock. A repeated position is refused by the
 * unique index on current readings (see insertIfPositionFree), not by a lock.
 */
async function lockForRecording(m: EntityManager, lotId: number, sessionId: number): Promise<{ lot: Lot; partType: PartType; session: MeasurementSession }> {
  // A query builder, not findOne with relations: that would add TypeORM's DISTINCT-ids query.
  const session = await m
    .createQueryBuilder(MeasurementSession, 's')
    .innerJoin('s.lot', 'sl')
    .addSelect('sl.status')
    .where('s.id = :sessionId AND s.lot_id = :lotId', { sessionId, lotId })
    .getOne();
  if (!session) {
    // The rare refusals keep their order: unknown lot 404, closed lot 409, foreign session 422.
    const { lot } = await loadLotContext(m, lotId);
    await assertMeasurable(m, lot, null);
    await openSessionOf(m, lotId, sessionId);
    throw AppError.notFound(`Session ${sessionId} of lot ${lotId}`);
  }
  const exclusive = session.mode === 'screen' || session.lot?.status === 'received';
  const lot = await m
    .createQueryBuilder(Lot, 'l')
    .innerJoinAndSelect('l.partType', 'p')
    .where('l.id = :lotId', { lotId })
    .setLock(exclusive ? 'pessimistic_write' : 'pessimistic_read', undefined, ['l'])
    .getOne();
  if (!lot?.partType) throw AppError.notFound(`Lot ${lotId}`);
  await assertMeasurable(m, lot, session.mode);
  if (session.closedAt) {
    throw AppError.conflict('The session is closed: start a new session to record more readings.', [{ field: 'sessionId', message: 'session closed' }]);
  }
  return { lot, partType: lot.partType, session };
}

/** 409 naming `position`: the position has a current reading (its id when known). */
export function positionTaken(position: number, existingId: string | null): AppError {
  return AppError.conflict(`Position ${position} already has a reading${existingId ? ` (#${existingId})` : ''}; record a correction to change it.`, [
    { field: 'position', message: `position ${position} already measured` },
  ]);
}

/**
 * Records one part's reading from the entry grid, in a transaction of its own (the route
 * records through ReadingBatcher, which comes here for every reading it does not write itself). A position that already has a current reading
 * answers 409 naming `position`: change a reading only through a correction.
 */
export async function recordMeasurement(ds: DataSource, actor: SessionUser, lotId: number, input: RecordMeasurementRequest): Promise<MeasurementRow> {
  const reading = readingOrThrow(input);
  return ds.transaction(async (m) => {
    const { lot, partType, session } = await lockForRecording(m, lotId, input.sessionId);
    if (input.position > lot.quantity) {
      throw AppError.unprocessable(`Position ${input.position} is beyond the lot of ${lot.quantity} parts.`, [{ field: 'position', message: `position must be 1–${lot.quantity}` }]);
    }
    const saved = await insertIfPositionFree(m, actor, session, partType, input.position, reading);
    if (!saved) {
      const existing = await m.findOneBy(Measurement, { lotId, position: input.position, superseded: false });
      throw positionTaken(input.position, existing?.id ?? null);
    }
    // Bins: in a screening session the part gets its bin, container and position in this transaction.
    await placeRecordedReading(m, actor, session, saved);
    await markInspecting(m, actor, lot);
    return toRow(saved, { ambient_c: session.ambientC, creator_name: actor.name }, partType);
  });
}

/**
 * A correction: the old reading stays, marked superseded, and a new reading names it. Both in
 * one transaction with the audit entry.
 */
export async function correctMeasurement(
  ds: DataSource,
  actor: SessionUser,
  lotId: number,
  measurementId: string,
  input: CorrectMeasurementRequest,
): Promise<MeasurementRow> {
  const reading = readingOrThrow(input);
  return ds.transaction(async (m) => {
    const { lot, partType } = await loadLotContext(m, lotId, true);
    await assertMeasurable(m, lot, null);
    const session = await openSessionOf(m, lotId, input.sessionId);
    const work = await assertMeasurable(m, lot, session.mode);
    const old = await m.findOneBy(Measurement, { id: measurementId, lotId });
    if (!old) throw AppError.notFound(`Measurement ${measurementId} of lot ${lotId}`);
    if (old.superseded) throw AppError.conflict(`Measurement ${measurementId} is already superseded; correct the current reading of position ${old.position}.`);
    if (work === 'screen-only') {
      // Screening after a signed "100 % screen" disposition: the sample it rests on stays as signed.
      const from = await m.findOneBy(MeasurementSession, { id: old.sessionId });
      if (from?.mode !== 'screen') {
        throw AppError.conflict(`The reading of position ${old.position} belongs to the sample the signed disposition of lot ${lot.code} rests on; it cannot be corrected now.`, [
          { field: 'measurementId', message: 'a sample reading of a signed lot' },
        ]);
      }
    }
    await m.update(Measurement, { id: old.id }, { superseded: true });
    const saved = await insertReading(m, actor, session, partType, old.position, reading, { supersedesId: old.id, correctionReason: input.reason.trim() });
    // Bins: a corrected screened part keeps its place or moves to its new bin, in this transaction.
    await placeRecordedReading(m, actor, session, saved);
    await recordAudit(m, {
      actor,
      action: 'measurement.correct',
      entityType: 'lot',
      entityId: lotId,
      before: { measurementId: old.id, position: old.position, hfe: old.hfe, vbeMv: old.vbeMv, vceSatMv: old.vceSatMv, leakageNa: old.leakageNa },
      after: { measurementId: saved.id, position: saved.position, hfe: saved.hfe, vbeMv: saved.vbeMv, vceSatMv: saved.vceSatMv, leakageNa: saved.leakageNa },
      note: input.reason.trim().slice(0, 500),
    });
    return toRow(saved, { ambient_c: session.ambientC, creator_name: actor.name }, partType);
  });
}

const SORT_SQL: Record<MeasurementSort, string> = {
  position: 'm.position',
  hfe25: 'm.hfe_25',
  vbeMv25: 'm.vbe_mv_25',
  createdAt: 'm.created_at',
};

export interface MeasurementQuery {
  page: number;
  pageSize: number;
  sort: MeasurementSort;
  dir: 'asc' | 'desc';
  /** Include superseded readings (the full history). */
  history: boolean;
  /** Only readings outside a limit. */
  flagged: boolean;
}

interface RawRow {
  id: string;
  session_id: number;
  position: number;
  hfe: number;
  vbe_mv: number;
  vce_sat_mv: number | null;
  leakage_na: number | null;
  hfe_25: number;
  vbe_mv_25: number;
  source: 'grid' | 'import';
  supersedes_id: string | null;
  superseded: boolean;
  correction_reason: string | null;
  created_at: Date;
  ambient_c: number;
  creator_name: string;
}

/** SQL condition (on alias m) for readings outside the part's limits at 25 °C; params appended. */
export function outsideLimitsSql(part: PartType, params: unknown[]): string {
  const terms: string[] = [];
  const add = (sql: string, v: number | null) => {
    if (v === null) return;
    params.push(v);
    terms.push(sql.replace('?', `$${params.length}`));
  };
  add('m.hfe_25 < ?', part.hfeMin);
  add('m.hfe_25 > ?', part.hfeMax);
  add('m.vbe_mv_25 < ?', part.vbeMinMv);
  add('m.vbe_mv_25 > ?', part.vbeMaxMv);
  return terms.length ? `(${terms.join(' OR ')})` : 'false';
}

/** A page of a lot's readings, sorted and filtered on the server. */
export async function listMeasurements(ds: DataSource, lotId: number, q: MeasurementQuery): Promise<Page<MeasurementRow>> {
  const { partType } = await loadLotContext(ds.manager, lotId);
  const params: unknown[] = [lotId];
  const where = ['m.lot_id = $1'];
  if (!q.history) where.push('NOT m.superseded');
  if (q.flagged) where.push(outsideLimitsSql(partType, params));
  const whereSql = where.join(' AND ');
  const [{ total }] = (await ds.query(`SELECT count(*)::int AS total FROM measurement m WHERE ${whereSql}`, params)) as { total: number }[];
  params.push(q.pageSize, (q.page - 1) * q.pageSize);
  const rows = (await ds.query(
    `SELECT m.id, m.session_id, m.position, m.hfe, m.vbe_mv, m.vce_sat_mv, m.leakage_na, m.hfe_25, m.vbe_mv_25,
            m.source, m.supersedes_id, m.superseded, m.correction_reason, m.created_at, s.ambient_c, u.name AS creator_name
       FROM measurement m
       JOIN measurement_session s ON s.id = m.session_id
       JOIN app_user u ON u.id = m.created_by
      WHERE ${whereSql}
      ORDER BY ${SORT_SQL[q.sort]} ${q.dir === 'desc' ? 'DESC' : 'ASC'}, m.id ASC
      LIMIT $${params.length - 1} OFFSET $${params.length}`,
    params,
  )) as RawRow[];
  return {
    items: rows.map((r) =>
      toRow(
        {
          id: r.id,
          sessionId: r.session_id,
          position: r.position,
          hfe: r.hfe,
          vbeMv: r.vbe_mv,
          vceSatMv: r.vce_sat_mv,
          leakageNa: r.leakage_na,
          hfe25: r.hfe_25,
          vbeMv25: r.vbe_mv_25,
          source: r.source,
          supersedesId: r.supersedes_id,
          superseded: r.superseded,
          correctionReason: r.correction_reason,
          createdAt: r.created_at,
        } as Measurement,
        r,
        partType,
      ),
    ),
    total,
    page: q.page,
    pageSize: q.pageSize,
  };
}
