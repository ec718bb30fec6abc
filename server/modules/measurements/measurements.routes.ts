import { randomUUID } from 'node:crypto';
import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import type { DataSource } from 'typeorm';
import type { HistogramRuleParam } from '../../../shared/api/lot-results.ts';
import type { MeasurementSort } from '../../../shared/api/measurements.ts';
import { AppError } from '../../http/app-error.ts';
import { currentUser, requireRole } from '../../http/guards.ts';
import { parsePaging } from '../../http/paging.ts';
import { parseBody } from '../../http/validate.ts';
import { parseLotId } from '../bench/lot-context.ts';
import { getProgress, progressKey, setProgress } from './import-progress.ts';
import { ImportFieldsDto } from './import.dto.ts';
import { getInstrumentMapping, importMeasurements } from './measurement-import.service.ts';
import { writeMeasurementsCsv } from './measurements-csv.ts';
import { CorrectMeasurementDto, RecordMeasurementDto, StartSessionDto } from './measurements.dto.ts';
import { correctMeasurement, listMeasurements } from './measurements.service.ts';
import { ReadingBatcher } from './reading-batcher.ts';
import { lotSummary } from './lot-summary.service.ts';
import { closeSession, listSessions, startSession } from './sessions.service.ts';

/** A tester file of 100 000 rows is about 4 MB; 40 MB leaves room for wide files. */
export const MAX_IMPORT_BYTES = 40 * 1024 * 1024;

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_IMPORT_BYTES, files: 1, fields: 10 } });

/** multer's errors become problem answers (413 too large, 400 otherwise). */
const receiveFile: RequestHandler = (req, res, next) => {
  upload.single('file')(req, res, (err: unknown) => {
    if (!err) return next();
    const e = err as { code?: string; message?: string };
    if (e.code === 'LIMIT_FILE_SIZE') return next(new AppError(413, 'too-large', `The file is larger than ${MAX_IMPORT_BYTES / 1024 / 1024} MB.`, [{ field: 'file', message: 'too large' }]));
    next(AppError.badRequest(`The upload could not be read: ${e.message ?? 'unknown error'}.`, [{ field: 'file', message: e.message ?? 'bad upload' }]));
  });
};

const SORTS: MeasurementSort[] = ['position', 'hfe25', 'vbeMv25', 'createdAt'];
const RULES: HistogramRuleParam[] = ['sturges', 'scott', 'freedman-diaconis', 'bins'];

function parseJsonField(raw: unknown, field: string): unknown {
  if (typeof raw !== 'string') throw AppError.badRequest(`The form field ${field} is missing.`, [{ field, message: `${field} is required` }]);
  try {
    return JSON.parse(raw);
  } catch {
    throw AppError.badRequest(`The form field ${field} is not valid JSON.`, [{ field, message: 'not valid JSON' }]);
  }
}

/**
 * Bench measurement capture and results of a lot. Writes are the inspector's (and the quality
 * engineer's); every signed-in role may read.
 */
export function measurementsRouter(ds: DataSource, opts: { readings?: ReadingBatcher } = {}): Router {
  const r = Router();
  const writer = requireRole('inspector');
  // Grid readings arriving together are written together (group commit, see reading-batcher.ts);
  // the app shares its batcher with the reading lane (reading-lane.ts).
  const readings = opts.readings ?? new ReadingBatcher(ds);

  r.get('/lots/:id/sessions', async (req, res) => {
    res.json(await listSessions(ds, parseLotId(req.params.id)));
  });

  r.post('/lots/:id/sessions', writer, async (req, res) => {
    const lotId = parseLotId(req.params.id);
    const dto = await parseBody(StartSessionDto, req.body);
    res.status(201).json(await startSession(ds, currentUser(req), lotId, dto));
  });

  r.post('/lots/:id/sessions/:sessionId/close', writer, async (req, res) => {
    const lotId = parseLotId(req.params.id);
    const sessionId = Number(req.params.sessionId);
    if (!Number.isSafeInteger(sessionId) || sessionId < 1) throw AppError.badRequest('The session id must be a positive whole number.', [{ field: 'sessionId', message: 'invalid id' }]);
    res.json(await closeSession(ds, currentUser(req), lotId, sessionId));
  });

  r.get('/lots/:id/measurements', async (req, res) => {
    const lotId = parseLotId(req.params.id);
    const { page, pageSize } = parsePaging(req.query, 50);
    const sort = (req.query.sort ?? 'position') as MeasurementSort;
    if (!SORTS.includes(sort)) throw AppError.badRequest('Unknown sort.', [{ field: 'sort', message: `sort must be one of ${SORTS.join(', ')}` }]);
    res.json(
      await listMeasurements(ds, lotId, {
        page,
        pageSize,
        sort,
        dir: req.query.dir === 'desc' ? 'desc' : 'asc',
        history: req.query.history === 'true',
        flagged: req.query.flagged === 'true',
      }),
    );
  });

  r.post('/lots/:id/measurements', writer, async (req, res) => {
    const lotId = parseLotId(req.params.id);
    const dto = await parseBody(RecordMeasurementDto, req.body);
    res.status(201).json(await readings.record(currentUser(req), lotId, dto));
  });

  r.post('/lots/:id/measurements/import', writer, receiveFile, async (req, res) => {
    const lotId = parseLotId(req.params.id);
    const user = currentUser(req);
    if (!req.file) throw AppError.badRequest('Attach the tester file in the field "file".', [{ field: 'file', message: 'file is required' }]);
    const body = req.body as Record<string, unknown>;
    const dto = await parseBody(ImportFieldsDto, {
      sessionId: Number(body.sessionId),
      mapping: parseJsonField(body.mapping, 'mapping'),
      units: parseJsonField(body.units, 'units'),
      ...(body.progressToken !== undefined ? { progressToken: body.progressToken } : {}),
    });
    const key = progressKey(user.id, dto.progressToken ?? randomUUID());
    const report = (p: Parameters<typeof setProgress>[1]) => setProgress(key, p);
    try {
      const result = await importMeasurements(
        ds,
        user,
        lotId,
        { csv: req.file.buffer.toString('utf8'), sessionId: dto.sessionId, mapping: dto.mapping, units: dto.units },
        report,
      );
      res.status(201).json(result);
    } catch (e) {
      report({ phase: 'failed', done: 0, total: 0, message: e instanceof AppError ? e.detail : 'The import failed on the server.' });
      throw e;
    }
  });

  r.get('/lots/:id/measurements/import/progress/:token', async (req, res) => {
    parseLotId(req.params.id);
    const p = getProgress(progressKey(currentUser(req).id, String(req.params.token)));
    if (!p) throw AppError.notFound('Import progress');
    res.json(p);
  });

  r.post('/lots/:id/measurements/:measurementId/corrections', writer, async (req, res) => {
    const lotId = parseLotId(req.params.id);
    const mid = String(req.params.measurementId);
    if (!/^[1-9]\d{0,17}$/.test(mid)) throw AppError.badRequest('The measurement id must be a positive whole number.', [{ field: 'measurementId', message: 'invalid id' }]);
    const dto = await parseBody(CorrectMeasurementDto, req.body);
    res.status(201).json(await correctMeasurement(ds, currentUser(req), lotId, mid, dto));
  });

  r.get('/lots/:id/measurements.csv', async (req, res) => {
    await writeMeasurementsCsv(ds, parseLotId(req.params.id), req.query.history === 'true', res);
  });

  r.get('/lots/:id/summary', async (req, res) => {
    const lotId = parseLotId(req.params.id);
    const rule = (req.query.histogram ?? 'freedman-diaconis') as HistogramRuleParam;
    if (!RULES.includes(rule)) throw AppError.badRequest('Unknown histogram rule.', [{ field: 'histogram', message: `histogram must be one of ${RULES.join(', ')}` }]);
    res.json(await lotSummary(ds, lotId, rule));
  });

  r.get('/instrument-mappings/:instrument', async (req, res) => {
    const m = await getInstrumentMapping(ds, String(req.params.instrument));
    if (!m) throw AppError.notFound(`A mapping for ${String(req.params.instrument)}`);
    res.json({ instrument: m.instrument, mapping: m.mapping, units: m.units, updatedAt: m.updatedAt.toISOString() });
  });

  return r;
}
