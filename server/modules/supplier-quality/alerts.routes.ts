import { Router } from 'express';
import { buyerOrQuality } from './guard.ts';
import type { DataSource } from 'typeorm';
import { ALERT_STATUSES } from '../../../shared/api/supplier-quality.ts';
import { currentUser } from '../../http/guards.ts';
import { parsePaging } from '../../http/paging.ts';
import { parseIdParam, queryChoice } from '../../http/route-params.ts';
import { parseBody } from '../../http/validate.ts';
import { acknowledgeAlert, getAlert, listAlerts, sweepDriftChecks } from './drift.service.ts';
import { AcknowledgeAlertDto } from './supplier-quality.dto.ts';

export function alertsRouter(ds: DataSource): Router {
  const r = Router();

  r.get('/drift-alerts', buyerOrQuality, async (req, res) => {
    const { page, pageSize } = parsePaging(req.query, 10);
    const supplierId = req.query.supplierId === undefined || req.query.supplierId === '' ? undefined : parseIdParam(req.query.supplierId, 'supplierId');
    res.json(await listAlerts(ds, { page, pageSize, status: queryChoice(req.query.status, 'status', ALERT_STATUSES), supplierId }));
  });

  r.get('/drift-alerts/:id', buyerOrQuality, async (req, res) => {
    await sweepDriftChecks(ds);
    res.json(await getAlert(ds, parseIdParam(req.params.id)));
  });

  r.post('/drift-alerts/:id/acknowledge', buyerOrQuality, async (req, res) => {
    const id = parseIdParam(req.params.id);
    const dto = await parseBody(AcknowledgeAlertDto, req.body);
    res.json(await acknowledgeAlert(ds, currentUser(req), id, dto.note));
  });

  return r;
}
