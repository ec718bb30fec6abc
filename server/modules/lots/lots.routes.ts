import path from 'node:path';
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { DEFAULT_TRAVELER_STOCK, TRAVELER_STOCKS, type TravelerStockId } from '../../../shared/api/lots.ts';
import { AppError } from '../../http/app-error.ts';
import { currentUser, requireRole } from '../../http/guards.ts';
import { parseBody } from '../../http/validate.ts';
import { CreateLotDto } from './create-lot.dto.ts';
import { DocumentStore } from './documents/document-store.ts';
import { documentsRouter } from './documents/documents.routes.ts';
import { parseLotQuery } from './lot-query.ts';
import { createLot, getLot, listLots, openDryBag, receivingOptions } from './lots.service.ts';
import { OpenDryBagDto } from './open-dry-bag.dto.ts';
import { renderTraveler } from './traveler/traveler-pdf.ts';

function lotId(value: unknown): number {
  const id = Number(value);
  if (!Number.isInteger(id) || id < 1) throw AppError.badRequest('The lot id must be a positive whole number.', [{ field: 'id', message: 'invalid id' }]);
  return id;
}

export interface LotsRouterOptions {
  /** Data folder; documents go to `<dataDir>/documents`. */
  dataDir: string;
  maxDocumentBytes?: number;
}

/**
 * Lots: any signed-in user reads them (other areas build on lots); inspectors and quality
 * engineers receive lots, open dry bags and attach documents.
 */
export function lotsRouter(ds: DataSource, options: LotsRouterOptions): Router {
  const r = Router();
  const store = new DocumentStore(path.join(options.dataDir, 'documents'));

  r.get('/receiving-options', async (_req, res) => {
    res.json(await receivingOptions(ds));
  });

  r.get('/', async (req, res) => {
    res.json(await listLots(ds, parseLotQuery(req.query)));
  });

  r.post('/', requireRole('inspector'), async (req, res) => {
    const dto = await parseBody(CreateLotDto, req.body);
    const lot = await createLot(ds, currentUser(req), dto);
    res.status(201).location(`/api/lots/${lot.id}`).json(lot);
  });

  r.get('/:id', async (req, res) => {
    res.json(await getLot(ds, lotId(req.params.id)));
  });

  r.patch('/:id/dry-bag', requireRole('inspector'), async (req, res) => {
    const id = lotId(req.params.id);
    const dto = await parseBody(OpenDryBagDto, req.body);
    res.json(await openDryBag(ds, currentUser(req), id, dto.openedAt));
  });

  r.get('/:id/traveler.pdf', async (req, res) => {
    const id = lotId(req.params.id);
    const stock = req.query.stock === undefined || req.query.stock === '' ? DEFAULT_TRAVELER_STOCK : String(req.query.stock);
    if (!TRAVELER_STOCKS.some((s) => s.id === stock)) {
      throw AppError.badRequest('Unknown label stock.', [{ field: 'stock', message: `stock must be one of ${TRAVELER_STOCKS.map((s) => s.id).join(', ')}` }]);
    }
    const lot = await getLot(ds, id);
    const pdf = await renderTraveler(lot, stock as TravelerStockId);
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="traveler-${lot.code}-${stock}.pdf"`);
    res.setHeader('Cache-Control', 'private, no-store');
    res.send(pdf);
  });

  r.use('/:id/documents', documentsRouter(ds, store, options.maxDocumentBytes));

  return r;
}
