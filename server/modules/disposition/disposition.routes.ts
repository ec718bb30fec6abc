import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { currentUser, requireRole } from '../../http/guards.ts';
import { parseBody } from '../../http/validate.ts';
import { parseLotId } from '../bench/lot-context.ts';
import { ProposeDispositionDto, SignDispositionDto } from './disposition.dto.ts';
import { getDisposition, proposeDisposition, signDisposition } from './disposition.service.ts';
import { renderInspectionReport, reportData } from './inspection-report.ts';

/**
 * Disposition of a lot: the inspector proposes, the quality engineer signs; the inspection report
 * as a PDF. Reads are open to every signed-in role.
 */
export function dispositionRouter(ds: DataSource): Router {
  const r = Router();

  r.get('/lots/:id/disposition', async (req, res) => {
    res.json(await getDisposition(ds, parseLotId(req.params.id)));
  });

  r.post('/lots/:id/disposition', requireRole('inspector'), async (req, res) => {
    const lotId = parseLotId(req.params.id);
    const dto = await parseBody(ProposeDispositionDto, req.body);
    res.json(await proposeDisposition(ds, currentUser(req), lotId, dto));
  });

  r.post('/lots/:id/disposition/sign', requireRole('quality'), async (req, res) => {
    const lotId = parseLotId(req.params.id);
    const dto = await parseBody(SignDispositionDto, req.body);
    res.json(await signDisposition(ds, currentUser(req), lotId, dto));
  });

  r.get('/lots/:id/report.pdf', async (req, res) => {
    const data = await reportData(ds, parseLotId(req.params.id));
    const pdf = await renderInspectionReport(data);
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="${data.plan.lot.code}-inspection-report.pdf"`);
    res.send(pdf);
  });

  return r;
}
