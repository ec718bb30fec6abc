import { Router, type Response } from 'express';
import type { DataSource } from 'typeorm';
import { KIT_SORTS, KIT_STATUSES, type KitSort } from '../../../shared/api/pairing.ts';
import { AppError } from '../../http/app-error.ts';
import { currentUser, requireRole } from '../../http/guards.ts';
import { parsePaging } from '../../http/paging.ts';
import { parseIdParam, queryChoice, queryText } from '../../http/route-params.ts';
import { parseBody } from '../../http/validate.ts';
import { releaseExpiredKits } from './kit-expiry.ts';
import { renderKitLabel } from './kit-label-pdf.ts';
import { planKitRequest } from './kit-plan.service.ts';
import { listKits, lotKits } from './kit-view.ts';
import { cancelKit, getKit, pullKitPart, reserveKit } from './kits.service.ts';
import { CancelKitDto, CreateKitDto, KitPlanDto, PullKitPartDto, parsePreviewBody } from './pairing.dto.ts';
import { pairingStock } from './pairing-stock.service.ts';
import { previewPairing } from './preview.service.ts';
import { renderPickList } from './pick-list-pdf.ts';

function sendPdf(res: Response, pdf: Buffer, filename: string) {
  res.status(200).type('application/pdf').set('Content-Disposition', `inline; filename="${filename}"`).set('Cache-Control', 'no-store').send(pdf);
}

/**
 * Pairing: the loose-parts preview (any signed-in role; it changes nothing), kit planning,
 * reservation, cancel and pull by scan (assemblers and quality engineers), kit reads, pick list
 * and kit label PDFs, and the lot → kits trace (every signed-in role reads).
 */
export function pairingRouter(ds: DataSource): Router {
  const r = Router();
  const kitter = requireRole('assembler', 'quality');

  r.post('/pairing/preview', async (req, res) => {
    res.json(previewPairing(await parsePreviewBody(req.body)));
  });

  r.get('/pairing/stock', async (_req, res) => {
    await releaseExpiredKits(ds);
    res.json(await pairingStock(ds));
  });

  r.post('/kits/plan', kitter, async (req, res) => {
    res.json(await planKitRequest(ds, await parseBody(KitPlanDto, req.body)));
  });

  r.post('/kits', kitter, async (req, res) => {
    const dto = await parseBody(CreateKitDto, req.body);
    res.status(201).json(await reserveKit(ds, currentUser(req), dto));
  });

  r.get('/kits', async (req, res) => {
    const { page, pageSize } = parsePaging(req.query);
    const q = req.query;
    await releaseExpiredKits(ds);
    res.json(
      await listKits(ds, {
        page,
        pageSize,
        status: queryChoice(q.status, 'status', KIT_STATUSES),
        search: queryText(q.search, 'search', 60),
        sort: queryChoice(q.sort, 'sort', KIT_SORTS) as KitSort | undefined,
        dir: queryChoice(q.dir, 'dir', ['asc', 'desc'] as const),
      }),
    );
  });

  r.get('/kits/:id', async (req, res) => {
    res.json(await getKit(ds, parseIdParam(req.params.id)));
  });

  r.post('/kits/:id/cancel', kitter, async (req, res) => {
    const id = parseIdParam(req.params.id);
    res.json(await cancelKit(ds, currentUser(req), id, await parseBody(CancelKitDto, req.body ?? {})));
  });

  r.post('/kits/:id/pull', kitter, async (req, res) => {
    const id = parseIdParam(req.params.id);
    res.json(await pullKitPart(ds, currentUser(req), id, await parseBody(PullKitPartDto, req.body)));
  });

  r.get('/kits/:id/pick-list.pdf', async (req, res) => {
    const kit = await getKit(ds, parseIdParam(req.params.id));
    sendPdf(res, await renderPickList(kit), `pick-list-${kit.code}.pdf`);
  });

  r.get('/kits/:id/label.pdf', async (req, res) => {
    const kit = await getKit(ds, parseIdParam(req.params.id));
    if (kit.pickList.length === 0) throw AppError.conflict(`Kit ${kit.code} holds no parts (${kit.status}); there is nothing to label.`);
    const { pdf, payload } = await renderKitLabel(kit);
    res.set('X-Label-Parts-Listed', String(payload.listedParts)).set('X-Label-Parts-Omitted', String(payload.omittedParts));
    sendPdf(res, pdf, `kit-label-${kit.code}.pdf`);
  });

  r.get('/lots/:id/kits', async (req, res) => {
    await releaseExpiredKits(ds);
    res.json(await lotKits(ds, parseIdParam(req.params.id)));
  });

  return r;
}
