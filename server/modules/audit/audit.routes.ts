import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { requireRole } from '../../http/guards.ts';
import { parsePaging } from '../../http/paging.ts';
import { listAudit } from './audit.service.ts';

export function auditRouter(ds: DataSource): Router {
  const r = Router();
  r.get('/', requireRole('quality'), async (req, res) => {
    const { page, pageSize } = parsePaging(req.query);
    const entityType = typeof req.query.entityType === 'string' ? req.query.entityType : undefined;
    const entityId = typeof req.query.entityId === 'string' ? req.query.entityId : undefined;
    res.json(await listAudit(ds, { entityType, entityId, page, pageSize }));
  });
  return r;
}
