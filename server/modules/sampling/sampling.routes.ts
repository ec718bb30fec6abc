import { Router, type Request } from 'express';
import type { DataSource } from 'typeorm';
import type { SamplingPlanResponse } from '../../../shared/api/sampling.ts';
import { SamplingInputError, singleSamplingPlan, type InspectionLevel, type Severity } from '../../../shared/domain/sampling/index.ts';
import { AppError } from '../../http/app-error.ts';
import { currentUser, requireRole } from '../../http/guards.ts';
import { parseBody } from '../../http/validate.ts';
import { parseLotId } from '../bench/lot-context.ts';
import { getLotPlan } from './lot-plan.service.ts';
import { CorrectiveActionDto, SwitchingSettingsDto } from './switching.dto.ts';
import { getSwitching, recordSupplierCorrectiveAction, updateSwitchingSettings } from './switching.service.ts';

function requiredNumber(req: Request, name: string): number {
  const raw = req.query[name];
  if (typeof raw !== 'string' || raw.trim() === '') {
    throw AppError.badRequest(`The query parameter ${name} is missing.`, [{ field: name, message: `${name} is required` }]);
  }
  const value = Number(raw);
  if (!Number.isFinite(value)) {
    throw AppError.badRequest(`The query parameter ${name} must be a number.`, [{ field: name, message: `${name} must be a number` }]);
  }
  return value;
}

function planFromQuery(req: Request): SamplingPlanResponse {
  const lotSize = requiredNumber(req, 'lotSize');
  const aql = requiredNumber(req, 'aql');
  const level = typeof req.query.level === 'string' ? req.query.level : 'II';
  const severity = typeof req.query.severity === 'string' ? req.query.severity : 'normal';
  try {
    const p = singleSamplingPlan({ lotSize, level: level as InspectionLevel, aql, severity: severity as Severity });
    return {
      codeLetter: p.codeLetter,
      sampleSize: p.sampleSize,
      accept: p.accept,
      reject: p.reject,
      planLetter: p.planLetter,
      hundredPercent: p.hundredPercent,
      severity: severity as Severity,
      lotSize,
      level,
      aql,
      source: p.source,
    };
  } catch (e) {
    if (e instanceof SamplingInputError) throw AppError.badRequest(`Check ${e.field}: ${e.message}.`, [{ field: e.field, message: e.message }]);
    throw e;
  }
}

function parseId(raw: unknown, field: string): number {
  const id = Number(raw);
  if (!Number.isSafeInteger(id) || id < 1) throw AppError.badRequest(`${field} must be a positive whole number.`, [{ field, message: 'invalid id' }]);
  return id;
}

/**
 * Sampling: the ISO 2859-1 plan calculator, the plan of a lot, and the switching state per
 * supplier and part type. Reads are open to every signed-in role; changes to the switching
 * state are the quality engineer's.
 */
export function samplingRouter(ds: DataSource): Router {
  const r = Router();

  r.get('/sampling/plan', (req, res) => {
    res.json(planFromQuery(req));
  });

  r.get('/lots/:id/plan', async (req, res) => {
    res.json(await getLotPlan(ds, parseLotId(req.params.id)));
  });

  r.get('/switching/:supplierId/:partTypeId', async (req, res) => {
    res.json(await getSwitching(ds, parseId(req.params.supplierId, 'supplierId'), parseId(req.params.partTypeId, 'partTypeId')));
  });

  r.post('/switching/:supplierId/:partTypeId', requireRole('quality'), async (req, res) => {
    const supplierId = parseId(req.params.supplierId, 'supplierId');
    const partTypeId = parseId(req.params.partTypeId, 'partTypeId');
    const dto = await parseBody(CorrectiveActionDto, req.body);
    res.json(await recordSupplierCorrectiveAction(ds, currentUser(req), supplierId, partTypeId, dto.note.trim()));
  });

  r.patch('/switching/:supplierId/:partTypeId', requireRole('quality'), async (req, res) => {
    const supplierId = parseId(req.params.supplierId, 'supplierId');
    const partTypeId = parseId(req.params.partTypeId, 'partTypeId');
    const dto = await parseBody(SwitchingSettingsDto, req.body);
    if (dto.reducedApproved === undefined && dto.productionSteady === undefined) {
      throw AppError.badRequest('Nothing to change: send reducedApproved or productionSteady.');
    }
    res.json(await updateSwitchingSettings(ds, currentUser(req), supplierId, partTypeId, dto));
  });

  return r;
}
