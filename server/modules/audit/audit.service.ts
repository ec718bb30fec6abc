import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { AuditRow, Page } from '../../../shared/api/users.ts';
import { AuditEntry } from './audit-entry.entity.ts';

export interface AuditInput {
  actor: Pick<SessionUser, 'id' | 'name'> | null;
  action: string;
  entityType: string;
  entityId: string | number;
  before?: object | null;
  after?: object | null;
  note?: string | null;
}

/**
 * Appends to the audit trail. Call it with the EntityManager of the transaction that makes the
 * change, so the change and its record land together or not at all.
 */
export async function recordAudit(manager: EntityManager, input: AuditInput): Promise<void> {
  const entry = manager.create(AuditEntry, {
    actorId: input.actor?.id ?? null,
    actorName: input.actor?.name ?? 'system',
    action: input.action,
    entityType: input.entityType,
    entityId: String(input.entityId),
    before: (input.before ?? null) as never,
    after: (input.after ?? null) as never,
    note: input.note ?? null,
  });
  await manager.insert(AuditEntry, entry as never);
}

export interface AuditQuery {
  entityType?: string;
  entityId?: string;
  page: number;
  pageSize: number;
}

export async function listAudit(ds: DataSource, q: AuditQuery): Promise<Page<AuditRow>> {
  const qb = ds.getRepository(AuditEntry).createQueryBuilder('a').orderBy('a.id', 'DESC');
  if (q.entityType) qb.andWhere('a.entity_type = :t', { t: q.entityType });
  if (q.entityId) qb.andWhere('a.entity_id = :i', { i: q.entityId });
  const [rows, total] = await qb.skip((q.page - 1) * q.pageSize).take(q.pageSize).getManyAndCount();
  return {
    items: rows.map((r) => ({
      id: r.id,
      at: r.at.toISOString(),
      actorName: r.actorName,
      action: r.action,
      entityType: r.entityType,
      entityId: r.entityId,
      before: r.before,
      after: r.after,
      note: r.note,
    })),
    total,
    page: q.page,
    pageSize: q.pageSize,
  };
}
