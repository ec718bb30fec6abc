import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import type { DataSource } from 'typeorm';
import { DOCUMENT_MAX_BYTES } from '../../../../shared/api/lots.ts';
import { AppError } from '../../../http/app-error.ts';
import { currentUser, requireRole } from '../../../http/guards.ts';
import type { DocumentStore } from './document-store.ts';
import { addDocument, documentsOfLot, findDocument } from './documents.service.ts';

function positiveId(value: unknown, field: string): number {
  const id = Number(value);
  if (!Number.isInteger(id) || id < 1) throw AppError.badRequest(`The ${field} must be a positive whole number.`, [{ field, message: 'invalid id' }]);
  return id;
}

/**
 * Multipart parsing in memory with a size limit: an oversized or malformed upload is refused
 * before anything reaches the disk or the database.
 */
function receiveOneFile(maxBytes: number): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxBytes, files: 1, fields: 5, fieldSize: 1024, parts: 6 },
    defParamCharset: 'utf8',
  }).single('file');
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          const mb = (maxBytes / (1024 * 1024)).toFixed(0);
          return next(new AppError(413, 'too-large', `The file is larger than ${mb} MB; nothing was stored.`, [{ field: 'file', message: `larger than ${mb} MB` }]));
        }
        const field = err.field ?? 'file';
        return next(AppError.badRequest(`The upload was refused: ${err.message}.`, [{ field, message: err.message }]));
      }
      // Anything else here comes from reading the multipart body itself (busboy: a malformed part
      // header, e.g. a NUL in the file name, or a body cut short): the request is at fault, not the server.
      const message = err instanceof Error ? err.message : 'unreadable multipart body';
      next(AppError.badRequest(`The upload could not be read: ${message}.`, [{ field: 'file', message }]));
    });
  };
}

export function documentsRouter(ds: DataSource, store: DocumentStore, maxBytes = DOCUMENT_MAX_BYTES): Router {
  const r = Router({ mergeParams: true });
  // The lot id comes from the parent router's path (mergeParams).
  const lotParam = (req: { params: object }) => positiveId((req.params as Record<string, string>).id, 'id');

  r.get('/', async (req, res) => {
    res.json(await documentsOfLot(ds, lotParam(req)));
  });

  r.post('/', requireRole('inspector'), receiveOneFile(maxBytes), async (req, res) => {
    const lotId = lotParam(req);
    const doc = await addDocument(ds, store, currentUser(req), lotId, (req.body as Record<string, unknown> | undefined)?.kind, req.file);
    res.status(201).location(doc.contentUrl).json(doc);
  });

  r.get('/:docId/content', async (req, res) => {
    const doc = await findDocument(ds, lotParam(req), positiveId(req.params.docId, 'docId'));
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Cache-Control', 'private, no-store');
    res.attachment(doc.originalName);
    // attachment() guesses a type from the name; the type detected from the content wins.
    res.setHeader('Content-Type', doc.mediaType);
    await new Promise<void>((resolve, reject) => {
      store.pathOf(doc.storageKey); // refuses a key outside the documents folder
      res.sendFile(doc.storageKey, { root: store.root, dotfiles: 'deny', lastModified: false, cacheControl: false }, (err) => {
        if (!err) return resolve();
        if (res.headersSent) return resolve();
        console.error(`[binwright] document ${doc.id}: stored file unreadable`, err);
        reject(new AppError(500, 'document-missing', `The stored file of document ${doc.id} could not be read; tell your administrator.`));
      });
    });
  });

  return r;
}
