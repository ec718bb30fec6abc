import { Router, type RequestHandler } from 'express';
import { buyerOrQuality } from './guard.ts';
import multer from 'multer';
import type { DataSource } from 'typeorm';
import { NCR_ANSWER_MAX_BYTES, NCR_SORTS, NCR_STATUSES } from '../../../shared/api/supplier-quality.ts';
import { AppError } from '../../http/app-error.ts';
import { currentUser } from '../../http/guards.ts';
import { parsePaging } from '../../http/paging.ts';
import { parseIdParam, queryChoice } from '../../http/route-params.ts';
import { parseBody } from '../../http/validate.ts';
import type { DocumentStore } from '../lots/documents/document-store.ts';
import { answerDocument, closeNcr, createNcr, getNcr, listNcrs, ncrDraft, ncrPdf, recordAnswer, sendNcr, updateNcr, type Mailer } from './ncr.service.ts';
import { CloseNcrDto, CreateNcrDto, UpdateNcrDto } from './supplier-quality.dto.ts';

/** One file ("file") and the answer text ("text") as multipart form data, in memory, size-limited. */
function receiveAnswer(maxBytes: number): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1, fields: 2, fieldSize: 16_384, parts: 3 }, defParamCharset: 'utf8' }).single('file');
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          const mb = (maxBytes / (1024 * 1024)).toFixed(0);
          return next(new AppError(413, 'too-large', `The file is larger than ${mb} MB; nothing was stored.`, [{ field: 'file', message: `larger than ${mb} MB` }]));
        }
        return next(AppError.badRequest(`The upload was refused: ${err.message}.`, [{ field: err.field ?? 'file', message: err.message }]));
      }
      next(err);
    });
  };
}

const optionalId = (v: unknown, field: string) => (v === undefined || v === '' ? undefined : parseIdParam(v, field));

export function ncrsRouter(ds: DataSource, store: DocumentStore, mailer: Mailer): Router {
  const r = Router();

  r.get('/ncrs', buyerOrQuality, async (req, res) => {
    const { page, pageSize } = parsePaging(req.query);
    const q = req.query;
    res.json(
      await listNcrs(ds, {
        page,
        pageSize,
        status: queryChoice(q.status, 'status', NCR_STATUSES),
        supplierId: optionalId(q.supplierId, 'supplierId'),
        lotId: optionalId(q.lotId, 'lotId'),
        sort: queryChoice(q.sort, 'sort', NCR_SORTS),
        dir: queryChoice(q.dir, 'dir', ['asc', 'desc'] as const),
      }),
    );
  });

  r.get('/ncrs/draft', buyerOrQuality, async (req, res) => {
    const lotId = optionalId(req.query.lotId, 'lotId');
    if (!lotId) throw AppError.badRequest('Give the lot the NCR is about.', [{ field: 'lotId', message: 'lotId is required' }]);
    res.json(await ncrDraft(ds, lotId, optionalId(req.query.alertId, 'alertId') ?? null));
  });

  r.post('/ncrs', buyerOrQuality, async (req, res) => {
    const dto = await parseBody(CreateNcrDto, req.body);
    const ncr = await createNcr(ds, currentUser(req), dto);
    res.status(201).location(`/api/ncrs/${ncr.id}`).json(ncr);
  });

  r.get('/ncrs/:id', buyerOrQuality, async (req, res) => {
    res.json(await getNcr(ds, parseIdParam(req.params.id)));
  });

  r.patch('/ncrs/:id', buyerOrQuality, async (req, res) => {
    const id = parseIdParam(req.params.id);
    const dto = await parseBody(UpdateNcrDto, req.body);
    if (Object.values(dto).every((v) => v === undefined)) throw AppError.badRequest('Nothing to change: send findings, disposition, correctiveAction or dueDate.');
    res.json(await updateNcr(ds, currentUser(req), id, dto));
  });

  r.get('/ncrs/:id/report.pdf', buyerOrQuality, async (req, res) => {
    const { code, pdf } = await ncrPdf(ds, parseIdParam(req.params.id));
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="${code}.pdf"`);
    res.setHeader('Cache-Control', 'private, no-store');
    res.send(pdf);
  });

  r.post('/ncrs/:id/send', buyerOrQuality, async (req, res) => {
    res.json(await sendNcr(ds, currentUser(req), parseIdParam(req.params.id), mailer));
  });

  r.post('/ncrs/:id/answer', buyerOrQuality, receiveAnswer(NCR_ANSWER_MAX_BYTES), async (req, res) => {
    const id = parseIdParam(req.params.id);
    res.json(await recordAnswer(ds, store, currentUser(req), id, (req.body as Record<string, unknown> | undefined)?.text, req.file));
  });

  r.get('/ncrs/:id/answer-document', buyerOrQuality, async (req, res) => {
    const doc = await answerDocument(ds, parseIdParam(req.params.id));
    store.pathOf(doc.key); // refuses a key outside the answers folder
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Cache-Control', 'private, no-store');
    res.attachment(doc.name);
    res.setHeader('Content-Type', doc.mediaType);
    await new Promise<void>((resolve, reject) => {
      res.sendFile(doc.key, { root: store.root, dotfiles: 'deny', lastModified: false, cacheControl: false }, (err) => {
        if (!err || res.headersSent) return resolve();
        reject(new AppError(500, 'document-missing', 'The stored answer document could not be read; tell your administrator.'));
      });
    });
  });

  r.post('/ncrs/:id/close', buyerOrQuality, async (req, res) => {
    const id = parseIdParam(req.params.id);
    const dto = await parseBody(CloseNcrDto, req.body ?? {});
    res.json(await closeNcr(ds, currentUser(req), id, dto.note ?? null));
  });

  return r;
}
