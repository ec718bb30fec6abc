import { createHash } from 'node:crypto';
import { QueryFailedError, type DataSource } from 'typeorm';
import type { SessionUser } from '../../../../shared/api/auth.ts';
import { DOCUMENT_ACCEPTED, DOCUMENT_KINDS, type DocumentKind, type LotDocumentRow } from '../../../../shared/api/lots.ts';
import { AppError } from '../../../http/app-error.ts';
import { recordAudit } from '../../audit/audit.service.ts';
import { Lot, LotDocument } from '../lot.entity.ts';
import { listDocuments, toDocumentRow } from '../lots.service.ts';
import { detectMediaType } from './detect-media-type.ts';
import type { DocumentStore } from './document-store.ts';

export interface UploadedFile {
  originalname: string;
  buffer: Buffer;
}

/** A display name from the client's file name: no folders, no control characters, at most 255 characters. */
export function cleanFileName(name: string): string {
  // eslint-disable-next-line no-control-regex
  const base = name.split(/[\\/]/).pop()!.replace(/[\u0000-\u001f\u007f]/g, '').trim();
  return (base || 'document').slice(0, 255);
}

async function requireLot(ds: DataSource, lotId: number): Promise<Lot> {
  const lot = await ds.getRepository(Lot).findOneBy({ id: lotId });
  if (!lot) throw AppError.notFound(`Lot ${lotId}`);
  return lot;
}

function alreadyStored(existing: LotDocument): AppError {
  return AppError.conflict(
    `This file is already attached to the lot as document ${existing.id} "${existing.originalName}"; it was not stored again.`,
    [{ field: 'file', message: `same content as document ${existing.id} "${existing.originalName}"` }],
  );
}

/**
 * Attaches a file to a lot. The type comes from the content; a refused type or an empty file
 * writes nothing. The file goes to a temporary name, the row and its audit entry are written in
 * one transaction, and the file is published under `<lotId>/<docId>-<sha8>` inside that
 * transaction: a failure anywhere leaves neither a row without a file nor a file without a row.
 * The same content on the same lot is refused (409), never stored twice or replaced.
 */
export async function addDocument(
  ds: DataSource,
  store: DocumentStore,
  actor: SessionUser,
  lotId: number,
  kindText: unknown,
  file: UploadedFile | undefined,
): Promise<LotDocumentRow> {
  await requireLot(ds, lotId);
  const errors = [];
  if (!file) errors.push({ field: 'file', message: 'attach the document in the form field "file"' });
  if (typeof kindText !== 'string' || !(DOCUMENT_KINDS as readonly string[]).includes(kindText)) {
    errors.push({ field: 'kind', message: `kind must be one of ${DOCUMENT_KINDS.join(', ')}` });
  }
  if (errors.length || !file) throw AppError.badRequest(`Check ${errors.map((e) => e.field).join(', ')}.`, errors);
  const kind = kindText as DocumentKind;
  if (file.buffer.length === 0) throw AppError.badRequest('The file is empty.', [{ field: 'file', message: 'the file is empty' }]);

  const detected = detectMediaType(file.buffer);
  if (!detected.ok) {
    throw new AppError(
      415,
      'unsupported-media-type',
      `The content of "${cleanFileName(file.originalname)}" is ${detected.what}. Only ${DOCUMENT_ACCEPTED} files are accepted; the type is read from the content, not the name.`,
      [{ field: 'file', message: `content is ${detected.what}` }],
    );
  }
  const sha256 = createHash('sha256').update(file.buffer).digest('hex');
  const same = await ds.getRepository(LotDocument).findOneBy({ lotId, sha256 });
  if (same) throw alreadyStored(same);

  const originalName = cleanFileName(file.originalname);
  const tmp = await store.writeTemp(file.buffer);
  let published: string | null = null;
  try {
    const id = await ds.transaction(async (m) => {
      // One upload at a time per lot, so two equal uploads cannot both pass the check below.
      await m.findOne(Lot, { where: { id: lotId }, lock: { mode: 'pessimistic_write' } });
      const again = await m.findOneBy(LotDocument, { lotId, sha256 });
      if (again) throw alreadyStored(again);
      const [{ id: docId }] = (await m.query(`SELECT nextval(pg_get_serial_sequence('lot_document', 'id'))::int AS id`)) as { id: number }[];
      const storageKey = `${lotId}/${docId}-${sha256.slice(0, 8)}`;
      // Raw insert: TypeORM leaves a generated id out of INSERT, and the file name needs it now.
      await m.query(
        `INSERT INTO lot_document (id, lot_id, kind, original_name, media_type, size_bytes, sha256, storage_key, uploaded_by)
         VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9)`,
        [docId, lotId, kind, originalName, detected.mediaType, file.buffer.length, sha256, storageKey, actor.id],
      );
      await recordAudit(m, {
        actor,
        action: 'lot.document-add',
        entityType: 'lot',
        entityId: lotId,
        after: { documentId: docId, kind, originalName, mediaType: detected.mediaType, sizeBytes: file.buffer.length, sha256 },
      });
      try {
        published = await store.publish(tmp, storageKey);
      } catch (e) {
        if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
        console.error(`[binwright] document file ${storageKey} already exists; the documents folder does not match the database`);
        throw new AppError(
          500,
          'document-store-conflict',
          'A stored file already has this document\'s name: the documents folder does not match the database (was a backup restored without its files?). Nothing was stored; tell your administrator.',
        );
      }
      return docId;
    });
    const saved = await ds.getRepository(LotDocument).findOneOrFail({ where: { id }, relations: { uploader: true } });
    return toDocumentRow(saved);
  } catch (e) {
    if (published) await store.remove(published);
    if (e instanceof QueryFailedError && (e.driverError as { code?: string }).code === '23505') {
      const existing = await ds.getRepository(LotDocument).findOneBy({ lotId, sha256 });
      if (existing) throw alreadyStored(existing);
    }
    throw e;
  } finally {
    await store.remove(tmp);
  }
}

export async function documentsOfLot(ds: DataSource, lotId: number): Promise<LotDocumentRow[]> {
  await requireLot(ds, lotId);
  return listDocuments(ds, lotId);
}

export async function findDocument(ds: DataSource, lotId: number, docId: number): Promise<LotDocument> {
  const doc = await ds.getRepository(LotDocument).findOneBy({ id: docId, lotId });
  if (!doc) throw AppError.notFound(`Document ${docId} of lot ${lotId}`);
  return doc;
}
