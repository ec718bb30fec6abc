import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { APPROVAL_STATUSES, SUPPLIER_SORTS } from '../../../shared/api/catalog.ts';
import { AppError } from '../../http/app-error.ts';
import { currentUser, requireRole } from '../../http/guards.ts';
import { parsePaging } from '../../http/paging.ts';
import { parseIdParam, queryChoice, queryText } from '../../http/route-params.ts';
import { parseBody } from '../../http/validate.ts';
import { ContactDto, CreateSupplierDto, SupplierPartDto, UpdateContactDto, UpdateSupplierDto } from './supplier.dto.ts';
import {
  addContact,
  addPartMapping,
  createSupplier,
  deleteContact,
  deletePartMapping,
  getSupplier,
  listSuppliers,
  lookupSupplierPart,
  updateContact,
  updateSupplier,
} from './suppliers.service.ts';

const nothingToChange = (dto: object) => Object.values(dto).every((v) => v === undefined);

/**
 * /api/suppliers: everyone signed in reads (the Dock needs the list and the part look-up);
 * only quality engineers change suppliers, their contacts and their part-number mappings.
 */
export function suppliersRouter(ds: DataSource): Router {
  const r = Router();
  const quality = requireRole('quality');

  r.get('/', async (req, res) => {
    const { page, pageSize } = parsePaging(req.query);
    const q = req.query;
    res.json(
      await listSuppliers(ds, {
        page,
        pageSize,
        search: queryText(q.search, 'search'),
        approval: queryChoice(q.approval, 'approval', APPROVAL_STATUSES),
        sort: queryChoice(q.sort, 'sort', SUPPLIER_SORTS),
        dir: queryChoice(q.dir, 'dir', ['asc', 'desc'] as const),
      }),
    );
  });

  r.get('/part-lookup', async (req, res) => {
    const spn = queryText(req.query.supplierPartNumber, 'supplierPartNumber', 60);
    if (!spn) {
      throw AppError.badRequest('Give the supplier part number to look up.', [{ field: 'supplierPartNumber', message: 'supplierPartNumber is required' }]);
    }
    res.json(await lookupSupplierPart(ds, spn));
  });

  r.post('/', quality, async (req, res) => {
    const dto = await parseBody(CreateSupplierDto, req.body);
    res.status(201).json(await createSupplier(ds, currentUser(req), dto));
  });

  r.get('/:id', async (req, res) => {
    res.json(await getSupplier(ds, parseIdParam(req.params.id)));
  });

  r.patch('/:id', quality, async (req, res) => {
    const id = parseIdParam(req.params.id);
    const dto = await parseBody(UpdateSupplierDto, req.body);
    if (nothingToChange(dto)) throw AppError.badRequest('Nothing to change: send code, name, approval or notes.');
    res.json(await updateSupplier(ds, currentUser(req), id, dto));
  });

  r.post('/:id/contacts', quality, async (req, res) => {
    const id = parseIdParam(req.params.id);
    const dto = await parseBody(ContactDto, req.body);
    res.status(201).json(await addContact(ds, currentUser(req), id, dto));
  });

  r.patch('/:id/contacts/:contactId', quality, async (req, res) => {
    const id = parseIdParam(req.params.id);
    const contactId = parseIdParam(req.params.contactId, 'contactId');
    const dto = await parseBody(UpdateContactDto, req.body);
    if (nothingToChange(dto)) throw AppError.badRequest('Nothing to change: send name, email, phone or duty.');
    res.json(await updateContact(ds, currentUser(req), id, contactId, dto));
  });

  r.delete('/:id/contacts/:contactId', quality, async (req, res) => {
    await deleteContact(ds, currentUser(req), parseIdParam(req.params.id), parseIdParam(req.params.contactId, 'contactId'));
    res.status(204).end();
  });

  r.post('/:id/parts', quality, async (req, res) => {
    const id = parseIdParam(req.params.id);
    const dto = await parseBody(SupplierPartDto, req.body);
    res.status(201).json(await addPartMapping(ds, currentUser(req), id, dto));
  });

  r.delete('/:id/parts/:mappingId', quality, async (req, res) => {
    await deletePartMapping(ds, currentUser(req), parseIdParam(req.params.id), parseIdParam(req.params.mappingId, 'mappingId'));
    res.status(204).end();
  });

  return r;
}
