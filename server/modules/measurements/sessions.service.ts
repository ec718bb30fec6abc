import { IsNull, type DataSource, type EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { SessionRow, SessionsResponse, StartSessionRequest } from '../../../shared/api/measurements.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { assertMeasurable, loadLotContext } from '../bench/lot-context.ts';
import { Lot } from '../lots/lot.entity.ts';
import { User } from '../users/user.entity.ts';
import { MeasurementSession } from './measurement-session.entity.ts';
import { assertScreenable } from '../bins/screening.service.ts';

export function toSessionRow(s: MeasurementSession, operatorName: string): SessionRow {
  return {
    id: s.id,
    lotId: s.lotId,
    instrument: s.instrument,
    ambientC: s.ambientC,
    mode: s.mode,
    operatorId: s.operatorId,
    operatorName,
    startedAt: s.startedAt.toISOString(),
    closedAt: s.closedAt ? s.closedAt.toISOString() : null,
  };
}

export async function listSessions(ds: DataSource, lotId: number): Promise<SessionsResponse> {
  await loadLotContext(ds.manager, lotId);
  const sessions = await ds.getRepository(MeasurementSession).find({ where: { lotId }, relations: { operator: true }, order: { id: 'DESC' } });
  const [agg] = (await ds.query(
    'SELECT count(*)::int AS n, coalesce(max(position), 0)::int AS top FROM measurement WHERE lot_id = $1 AND NOT superseded',
    [lotId],
  )) as { n: number; top: number }[];
  return { sessions: sessions.map((s) => toSessionRow(s, s.operator?.name ?? '')), measured: agg.n, nextPosition: agg.top + 1 };
}

/** Moves a lot from received to inspecting when the bench first works on it. */
export async function markInspecting(m: EntityManager, actor: SessionUser, lot: Lot): Promise<void> {
  if (lot.status !== 'received') return;
  await m.update(Lot, { id: lot.id }, { status: 'inspecting', updatedAt: new Date() });
  await recordAudit(m, { actor, action: 'lot.status', entityType: 'lot', entityId: lot.id, before: { status: 'received' }, after: { status: 'inspecting' } });
  lot.status = 'inspecting';
}

/**
 * Starts a measurement session on a lot. The operator's earlier open session on the same lot is
 * closed: one bench, one session at a time.
 */
export async function startSession(ds: DataSource, actor: SessionUser, lotId: number, input: StartSessionRequest): Promise<SessionRow> {
  return ds.transaction(async (m) => {
    const { lot } = await loadLotContext(m, lotId, true);
    // After a signed MRB "100 % screen" disposition only screening sessions start (lot-context).
    await assertMeasurable(m, lot, input.mode);
    if (input.mode === 'screen') await assertScreenable(m, lot);
    await m.update(MeasurementSession, { lotId, operatorId: actor.id, closedAt: IsNull() }, { closedAt: new Date() });
    const saved = await m.save(
      m.create(MeasurementSession, { lotId, instrument: input.instrument.trim(), ambientC: input.ambientC, mode: input.mode, operatorId: actor.id, closedAt: null }),
    );
    await markInspecting(m, actor, lot);
    await recordAudit(m, {
      actor,
      action: 'session.start',
      entityType: 'lot',
      entityId: lotId,
      after: { sessionId: saved.id, instrument: saved.instrument, ambientC: saved.ambientC, mode: saved.mode },
    });
    return toSessionRow(saved, actor.name);
  });
}

export async function closeSession(ds: DataSource, actor: SessionUser, lotId: number, sessionId: number): Promise<SessionRow> {
  return ds.transaction(async (m) => {
    const session = await m.findOne(MeasurementSession, { where: { id: sessionId, lotId }, lock: { mode: 'pessimistic_write' } });
    if (!session) throw AppError.notFound(`Session ${sessionId} of lot ${lotId}`);
    if (session.closedAt) throw AppError.conflict('This session is already closed.');
    session.closedAt = new Date();
    await m.save(session);
    await recordAudit(m, { actor, action: 'session.close', entityType: 'lot', entityId: lotId, after: { sessionId } });
    const op = await m.findOneBy(User, { id: session.operatorId });
    return toSessionRow(session, op?.name ?? '');
  });
}

/** The session a reading is recorded in: it must belong to the lot and be open. */
export async function openSessionOf(m: EntityManager, lotId: number, sessionId: number): Promise<MeasurementSession> {
  const session = await m.findOneBy(MeasurementSession, { id: sessionId, lotId });
  if (!session) {
    throw AppError.unprocessable('The session does not belong to this lot.', [{ field: 'sessionId', message: `session ${sessionId} is not a session of lot ${lotId}` }]);
  }
  if (session.closedAt) {
    throw AppError.conflict('The session is closed: start a new session to record more readings.', [{ field: 'sessionId', message: 'session closed' }]);
  }
  return session;
}
