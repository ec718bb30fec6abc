import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { parseBody } from '../../http/validate.ts';
import { BiasEvaluateDto, FitForUseDto } from './bias.dto.ts';
import { biasSources, evaluateBias, fitForUse } from './bias.service.ts';

/**
 * The fit-for-use check: a divider-biased stage evaluated for one transistor, or run against a
 * lot's or part type's measured parts. Pure calculations that change nothing: every signed-in
 * role may call them (the POSTs carry the stage in their body).
 */
export function biasRouter(ds: DataSource): Router {
  const r = Router();

  r.post('/bias/evaluate', async (req, res) => {
    res.json(evaluateBias(await parseBody(BiasEvaluateDto, req.body)));
  });

  r.post('/bias/fit-for-use', async (req, res) => {
    res.json(await fitForUse(ds, await parseBody(FitForUseDto, req.body)));
  });

  r.get('/bias/sources', async (_req, res) => {
    res.json(await biasSources(ds));
  });

  return r;
}
