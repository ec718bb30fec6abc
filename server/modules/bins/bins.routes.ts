import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { CONTAINER_SORTS, CONTAINER_STATUSES, type ContainerSort } from '../../../shared/api/bins.ts';
import { AppError } from '../../http/app-error.ts';
import { currentUser, requireRole } from '../../http/guards.ts';
import { parsePaging } from '../../http/paging.ts';
import { parseIdParam, queryChoice, queryText } from '../../http/route-params.ts';
import { parseBody } from '../../http/validate.ts';
import { printBinLabels } from './bin-labels.service.ts';
import { AdjustContainerDto, BinLabelsDto, CloseContainerDto, MoveContainerDto, PlaceScreenedDto, ScrapContainerDto, ScreeningSetupDto } from './bins.dto.ts';
import { adjustContainer, closeContainer, containerByCode, containerDetail, listContainers, moveContainer, scrapFromContainer } from './containers.service.ts';
import { lotScreening, placeUnplaced, recentPlacements, saveSetup } from './screening.service.ts';
import { stockByBin } from './stock.service.ts';

function queryId(value: unknown, field: string): number | undefined {
  if (value === undefined || value === '') return undefined;
  return parseIdParam(value, field);
}

/**
 * Bins: containers, stock and screening. Inspectors and quality engineers change stock and print
 * labels; every signed-in role reads (assemblers pick from it, buyers look at it).
 */
export function binsRouter(ds: DataSource): Router {
  const r = Router();
  const writer = requireRole('inspector');

  r.get('/containers', async (req, res) => {
    const { page, pageSize } = parsePaging(req.query);
    const q = req.query;
    res.json(
      await listContainers(ds, {
        page,
        pageSize,
        partTypeId: queryId(q.partTypeId, 'partTypeId'),
        lotId: queryId(q.lotId, 'lotId'),
        bin: queryText(q.bin, 'bin', 20),
        location: queryText(q.location, 'location', 60),
        status: queryChoice(q.status, 'status', CONTAINER_STATUSES),
        search: queryText(q.search, 'search', 60),
        sort: queryChoice(q.sort, 'sort', CONTAINER_SORTS) as ContainerSort | undefined,
        dir: queryChoice(q.dir, 'dir', ['asc', 'desc'] as const),
      }),
    );
  });

  r.get('/containers/by-code/:code', async (req, res) => {
    res.json(await containerByCode(ds, String(req.params.code)));
  });

  r.get('/containers/:id', async (req, res) => {
    res.json(await containerDetail(ds.manager, parseIdParam(req.params.id)));
  });

  r.post('/containers/:id/move', writer, async (req, res) => {
    const id = parseIdParam(req.params.id);
    res.json(await moveContainer(ds, currentUser(req), id, await parseBody(MoveContainerDto, req.body)));
  });

  r.post('/containers/:id/adjust', writer, async (req, res) => {
    const id = parseIdParam(req.params.id);
    res.json(await adjustContainer(ds, currentUser(req), id, await parseBody(AdjustContainerDto, req.body)));
  });

  r.post('/containers/:id/scrap', writer, async (req, res) => {
    const id = parseIdParam(req.params.id);
    const dto = await parseBody(ScrapContainerDto, req.body);
    if ((dto.quantity === undefined) === (dto.positions === undefined)) {
      throw AppError.badRequest('Give either quantity or positions.', [
        { field: dto.quantity === undefined ? 'quantity' : 'positions', message: 'send quantity (count-only container) or positions (positioned container), not both' },
      ]);
    }
    res.json(await scrapFromContainer(ds, currentUser(req), id, dto));
  });

  r.post('/containers/:id/close', writer, async (req, res) => {
    const id = parseIdParam(req.params.id);
    res.json(await closeContainer(ds, currentUser(req), id, await parseBody(CloseContainerDto, req.body ?? {})));
  });

  r.get('/stock', async (req, res) => {
    res.json(await stockByBin(ds, queryId(req.query.partTypeId, 'partTypeId')));
  });

  r.get('/lots/:id/screening', async (req, res) => {
    res.json(await lotScreening(ds, parseIdParam(req.params.id)));
  });

  r.get('/lots/:id/screening/recent', async (req, res) => {
    const limit = req.query.limit === undefined ? 5 : Number(req.query.limit);
    if (!Number.isInteger(limit) || limit < 1 || limit > 50) throw AppError.badRequest('Check limit.', [{ field: 'limit', message: 'limit must be a whole number from 1 to 50' }]);
    res.json(await recentPlacements(ds, parseIdParam(req.params.id), limit));
  });

  r.put('/lots/:id/screening/setup', writer, async (req, res) => {
    const id = parseIdParam(req.params.id);
    res.json(await saveSetup(ds, currentUser(req), id, await parseBody(ScreeningSetupDto, req.body)));
  });

  r.post('/lots/:id/screening/place', writer, async (req, res) => {
    const id = parseIdParam(req.params.id);
    const dto = await parseBody(PlaceScreenedDto, req.body ?? {});
    res.json(await placeUnplaced(ds, currentUser(req), id, dto.includeSample === true));
  });

  r.post('/labels/bins.pdf', writer, async (req, res) => {
    const dto = await parseBody(BinLabelsDto, req.body);
    const out = await printBinLabels(ds, currentUser(req), dto);
    res
      .status(200)
      .type('application/pdf')
      .set('Content-Disposition', `inline; filename="bin-labels-${out.labels}.pdf"`)
      .set('X-Label-Job', out.jobId)
      .set('X-Label-Reprints', String(out.reprints))
      .send(out.pdf);
  });

  return r;
}
