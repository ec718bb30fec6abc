import { Router } from 'express';
import { buyerOrQuality } from './guard.ts';
import type { DataSource } from 'typeorm';
import { SCORECARD_SORTS } from '../../../shared/api/supplier-quality.ts';
import { parsePaging } from '../../http/paging.ts';
import { parseIdParam, queryChoice, queryText } from '../../http/route-params.ts';
import { parsePeriod } from './period.ts';
import { listScorecards, scorecardsCsv, supplierScorecard } from './scorecards.service.ts';

/** Scorecards: read-only figures per supplier and supplier × part type over a period. */
export function scorecardsRouter(ds: DataSource): Router {
  const r = Router();

  r.get('/scorecards', buyerOrQuality, async (req, res) => {
    const { page, pageSize } = parsePaging(req.query);
    res.json(
      await listScorecards(ds, {
        period: parsePeriod(req.query),
        page,
        pageSize,
        search: queryText(req.query.search, 'search'),
        sort: queryChoice(req.query.sort, 'sort', SCORECARD_SORTS),
        dir: queryChoice(req.query.dir, 'dir', ['asc', 'desc'] as const),
      }),
    );
  });

  r.get('/scorecards.csv', buyerOrQuality, async (req, res) => {
    const period = parsePeriod(req.query);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="supplier-scorecards-${period.from}-to-${period.to}.csv"`);
    res.setHeader('Cache-Control', 'private, no-store');
    res.send(await scorecardsCsv(ds, period));
  });

  r.get('/scorecards/:supplierId', buyerOrQuality, async (req, res) => {
    res.json(await supplierScorecard(ds, parseIdParam(req.params.supplierId, 'supplierId'), parsePeriod(req.query)));
  });

  return r;
}
