import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { PART_TYPE_SORTS, POLARITIES, type PartTypeSort } from '../../../shared/api/catalog.ts';
import { AppError } from '../../http/app-error.ts';
import { currentUser, requireRole } from '../../http/guards.ts';
import { parsePaging } from '../../http/paging.ts';
import { parseIdParam, queryChoice, queryText } from '../../http/route-params.ts';
import { parseBody } from '../../http/validate.ts';
import { parseBinSchemeBody } from './bin-scheme.dto.ts';
import { createBinScheme, listBinSchemes, updateBinScheme } from './bin-schemes.service.ts';
import { CreatePartTypeDto, UpdatePartTypeDto } from './part-type.dto.ts';
import { createPartType, getPartType, listPackages, listPartTypes, updatePartType } from './part-types.service.ts';

/**
 * /api/part-types: everyone signed in reads; only quality engineers write (part types and
 * their gain-bin schemes). Part types are deactivated, never deleted.
 */
export function partTypesRouter(ds: DataSource): Router {
  const r = Router();
  const quality = requireRole('quality');

  r.get('/', async (req, res) => {
    const { page, pageSize } = parsePaging(req.query);
    const q = req.query;
    const active = queryChoice(q.active, 'active', ['true', 'false'] as const);
    res.json(
      await listPartTypes(ds, {
        page,
        pageSize,
        search: queryText(q.search, 'search'),
        polarity: queryChoice(q.polarity, 'polarity', POLARITIES),
        packageName: queryText(q.package, 'package', 40),
        active: active === undefined ? undefined : active === 'true',
        sort: queryChoice<PartTypeSort>(q.sort, 'sort', PART_TYPE_SORTS),
        dir: queryChoice(q.dir, 'dir', ['asc', 'desc'] as const),
      }),
    );
  });

  r.get('/packages', async (_req, res) => {
    res.json(await listPackages(ds));
  });

  r.post('/', quality, async (req, res) => {
    const dto = await parseBody(CreatePartTypeDto, req.body);
    res.status(201).json(await createPartType(ds, currentUser(req), dto));
  });

  r.get('/:id', async (req, res) => {
    res.json(await getPartType(ds, parseIdParam(req.params.id)));
  });

  r.patch('/:id', quality, async (req, res) => {
    const id = parseIdParam(req.params.id);
    const dto = await parseBody(UpdatePartTypeDto, req.body);
    if (Object.values(dto).every((v) => v === undefined)) throw AppError.badRequest('Nothing to change: send at least one field.');
    res.json(await updatePartType(ds, currentUser(req), id, dto));
  });

  r.get('/:id/bin-schemes', async (req, res) => {
    res.json(await listBinSchemes(ds, parseIdParam(req.params.id)));
  });

  r.post('/:id/bin-schemes', quality, async (req, res) => {
    const id = parseIdParam(req.params.id);
    const dto = await parseBinSchemeBody(req.body);
    res.status(201).json(await createBinScheme(ds, currentUser(req), id, dto));
  });

  r.put('/:id/bin-schemes/:version', quality, async (req, res) => {
    const id = parseIdParam(req.params.id);
    const version = parseIdParam(req.params.version, 'version');
    const dto = await parseBinSchemeBody(req.body);
    res.json(await updateBinScheme(ds, currentUser(req), id, version, dto));
  });

  return r;
}
