import Papa from 'papaparse';
import type { DataSource, EntityManager } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { ImportMapping, ImportProgress, ImportResult, ImportUnits } from '../../../shared/api/measurements.ts';
import type { FieldError } from '../../../shared/api/problem.ts';
import { checkReading } from '../../../shared/domain/inspection/index.ts';
import { normaliseHfe, normaliseVbeMv } from '../../../shared/domain/normalise/index.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { assertMeasurable, loadLotContext } from '../bench/lot-context.ts';
import { InstrumentMapping } from './instrument-mapping.entity.ts';
import { markInspecting, openSessionOf } from './sessions.service.ts';
import { placeUnplacedReadings } from '../bins/screening.service.ts';

/** Rows listed in a 422 answer; the detail says how many more are bad. */
const MAX_LISTED_ERRORS = 200;
/** Rows per INSERT … SELECT FROM unnest(…) statement. */
export const INSERT_CHUNK = 25_000;

export interface ImportInput {
  csv: string;
  sessionId: number;
  mapping: ImportMapping;
  units: ImportUnits;
}

/** Column arrays of a validated file, ready for the bulk insert. */
export interface ImportColumns {
  n: number;
  position: Int32Array;
  hfe: Float64Array;
  vbeMv: Float64Array;
  vceSatMv: (number | null)[];
  leakageNa: (number | null)[];
  hfe25: Float64Array;
  vbeMv25: Float64Array;
  sourceRow: Int32Array;
}

type Progress = (p: ImportProgress) => void;

const num = (s: string | undefined): number => {
  if (s === undefined) return NaN;
  const t = s.trim();
  return t === '' ? NaN : Number(t);
};

function columnIndex(header: string[], mapping: ImportMapping): { idx: Record<keyof ImportMapping, number>; errors: FieldError[] } {
  const norm = header.map((h) => h.trim());
  const errors: FieldError[] = [];
  const idx = {} as Record<keyof ImportMapping, number>;
  for (const field of ['position', 'hfe', 'vbe', 'vceSat', 'leakage'] as const) {
    const col = mapping[field];
    if (col === undefined || col === null || col === '') {
      idx[field] = -1;
      if (field === 'position' || field === 'hfe' || field === 'vbe') errors.push({ field: `mapping.${field}`, message: `map a column to ${field}` });
      continue;
    }
    const i = norm.indexOf(col.trim());
    if (i < 0) errors.push({ field: `mapping.${field}`, message: `the file has no column "${col}"` });
    idx[field] = i;
  }
  return { idx, errors };
}

/**
 * Parses and validates a whole tester file before anything is written: every data row (row 1 is
 * the first row after the header) must carry a whole position within the lot, unique in the file,
 * and a plausible hFE and Vbe in the stated units (shared/domain/inspection checkReading). Any bad
 * row → 422 listing row numbers and reasons. Returns column arrays referred to 25 °C.
 */
export function parseAndValidate(
  input: ImportInput,
  ctx: { lotQuantity: number; ambientC: number; hfeTcPctPerC: number; vbeTcMvPerC: number },
  progress: Progress = () => {},
): ImportColumns {
  progress({ phase: 'parsing', done: 0, total: 0, message: 'Reading the file…' });
  const parsed = Papa.parse<string[]>(input.csv.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy' });
  const data = parsed.data;
  if (data.length < 2) throw AppError.unprocessable('The file has no data rows under its header.', [{ field: 'file', message: 'no data rows' }]);
  const { idx, errors: mapErrors } = columnIndex(data[0], input.mapping);
  if (mapErrors.length) throw AppError.unprocessable('The column mapping does not match the file.', mapErrors);

  const n = data.length - 1;
  progress({ phase: 'validating', done: 0, total: n, message: `Checking ${n.toLocaleString('en')} rows…` });
  const cols: ImportColumns = {
    n,
    position: new Int32Array(n),
    hfe: new Float64Array(n),
    vbeMv: new Float64Array(n),
    vceSatMv: new Array<number | null>(n),
    leakageNa: new Array<number | null>(n),
    hfe25: new Float64Array(n),
    vbeMv25: new Float64Array(n),
    sourceRow: new Int32Array(n),
  };
  const seen = new Map<number, number>();
  const errors: FieldError[] = [];
  let bad = 0;
  const width = data[0].length;
  const hfeFactor = 1 + (ctx.hfeTcPctPerC / 100) * (ctx.ambientC - 25);
  for (let r = 0; r < n; r++) {
    const row = data[r + 1];
    const rowNo = r + 1;
    const reasons: string[] = [];
    if (row.length !== width) reasons.push(`has ${row.length} fields, the header has ${width}`);
    const posText = row[idx.position]?.trim() ?? '';
    const position = Number(posText);
    if (posText === '' || !Number.isSafeInteger(position) || position < 1) reasons.push(`position "${posText}" is not a whole number ≥ 1`);
    else if (position > ctx.lotQuantity) reasons.push(`position ${position} is beyond the lot of ${ctx.lotQuantity} parts`);
    else if (seen.has(position)) reasons.push(`position ${position} repeats row ${seen.get(position)}`);
    else seen.set(position, rowNo);
    const vceText = idx.vceSat >= 0 ? row[idx.vceSat]?.trim() : '';
    const leakText = idx.leakage >= 0 ? row[idx.leakage]?.trim() : '';
    const { reading, errors: readingErrors } = checkReading({
      hfe: num(row[idx.hfe]),
      vbe: num(row[idx.vbe]),
      vbeUnit: input.units.vbe,
      vceSat: vceText ? Number(vceText) : null,
      vceSatUnit: input.units.vceSat,
      leakage: leakText ? Number(leakText) : null,
      leakageUnit: input.units.leakage,
    });
    for (const e of readingErrors) {
      const col = e.field === 'hfe' ? idx.hfe : e.field === 'vbe' ? idx.vbe : e.field === 'vceSat' ? idx.vceSat : idx.leakage;
      reasons.push(`${e.message} (read "${row[col] ?? ''}")`);
    }
    if (reasons.length || !reading) {
      bad++;
      if (errors.length < MAX_LISTED_ERRORS) errors.push({ field: `row ${rowNo}`, message: `line ${rowNo + 1}: ${reasons.join('; ')}` });
      continue;
    }
    cols.position[r] = position;
    cols.hfe[r] = reading.hfe;
    cols.vbeMv[r] = reading.vbeMv;
    cols.vceSatMv[r] = reading.vceSatMv;
    cols.leakageNa[r] = reading.leakageNa;
    cols.sourceRow[r] = rowNo;
    // Same formulas as normaliseHfe / normaliseVbeMv, with the factor hoisted out of the loop.
    cols.hfe25[r] = reading.hfe / hfeFactor;
    cols.vbeMv25[r] = reading.vbeMv - ctx.vbeTcMvPerC * (ctx.ambientC - 25);
  }
  if (bad) {
    const more = bad > errors.length ? ` (the first ${errors.length} are listed)` : '';
    throw AppError.unprocessable(`${bad} of ${n} rows are not valid${more}; nothing was imported.`, errors);
  }
  // Guard the hoisted formulas against drift from the shared functions.
  if (n && (Math.abs(cols.hfe25[0] - normaliseHfe(cols.hfe[0], ctx.ambientC, ctx.hfeTcPctPerC)) > 1e-9 || Math.abs(cols.vbeMv25[0] - normaliseVbeMv(cols.vbeMv[0], ctx.ambientC, ctx.vbeTcMvPerC)) > 1e-9)) {
    throw new Error('import normalisation differs from shared/domain/normalise');
  }
  return cols;
}

/** Type OIDs of float8 and int4 (pg_type), the element types binaryArray writes. */
export const FLOAT8 = 701;
export const INT4 = 23;

/**
 * A one-dimensional PostgreSQL array in the binary wire format of array_recv (ndim, has-nulls
 * flag, element type, size, lower bound, then length-prefixed big-endian elements; −1 for NULL).
 * pg sends a Buffer parameter in binary, so PostgreSQL neither parses text numbers nor does the
 * client format them: both ends copy bytes.
 */
export function binaryArray(values: ArrayLike<number | null>, from: number, to: number, oid: typeof FLOAT8 | typeof INT4): Buffer {
  const n = to - from;
  const size = oid === FLOAT8 ? 8 : 4;
  let nulls = 0;
  for (let i = from; i < to; i++) if (values[i] === null) nulls++;
  const buf = Buffer.allocUnsafe(20 + n * 4 + (n - nulls) * size);
  buf.writeInt32BE(1, 0);
  buf.writeInt32BE(nulls ? 1 : 0, 4);
  buf.writeInt32BE(oid, 8);
  buf.writeInt32BE(n, 12);
  buf.writeInt32BE(1, 16);
  let o = 20;
  for (let i = from; i < to; i++) {
    const v = values[i];
    if (v === null) {
      buf.writeInt32BE(-1, o);
      o += 4;
    } else {
      buf.writeInt32BE(size, o);
      o += 4;
      if (oid === FLOAT8) buf.writeDoubleBE(v, o);
      else buf.writeInt32BE(v, o);
      o += size;
    }
  }
  return buf;
}

/**
 * Writes validated columns with multi-row INSERT … SELECT FROM unnest(arrays), INSERT_CHUNK rows
 * per statement, the arrays sent in binary, in the caller's transaction.
 */
export async function bulkInsert(
  m: EntityManager,
  ids: { lotId: number; sessionId: number; userId: number },
  cols: ImportColumns,
  progress: Progress = () => {},
): Promise<void> {
  for (let from = 0; from < cols.n; from += INSERT_CHUNK) {
    const to = Math.min(cols.n, from + INSERT_CHUNK);
    progress({ phase: 'writing', done: from, total: cols.n, message: `Writing rows ${(from + 1).toLocaleString('en')}–${to.toLocaleString('en')} of ${cols.n.toLocaleString('en')}…` });
    await m.query(
      `INSERT INTO measurement (lot_id, session_id, position, hfe, vbe_mv, vce_sat_mv, leakage_na, hfe_25, vbe_mv_25, source, source_row, created_by)
       SELECT $1, $2, t.position, t.hfe, t.vbe_mv, t.vce_sat_mv, t.leakage_na, t.hfe_25, t.vbe_mv_25, 'import', t.source_row, $3
         FROM unnest($4::int[], $5::float8[], $6::float8[], $7::float8[], $8::float8[], $9::float8[], $10::float8[], $11::int[])
           AS t(position, hfe, vbe_mv, vce_sat_mv, leakage_na, hfe_25, vbe_mv_25, source_row)`,
      [
        ids.lotId,
        ids.sessionId,
        ids.userId,
        binaryArray(cols.position, from, to, INT4),
        binaryArray(cols.hfe, from, to, FLOAT8),
        binaryArray(cols.vbeMv, from, to, FLOAT8),
        binaryArray(cols.vceSatMv, from, to, FLOAT8),
        binaryArray(cols.leakageNa, from, to, FLOAT8),
        binaryArray(cols.hfe25, from, to, FLOAT8),
        binaryArray(cols.vbeMv25, from, to, FLOAT8),
        binaryArray(cols.sourceRow, from, to, INT4),
      ],
    );
  }
}

/**
 * Imports a tester CSV into an open session of a lot: the whole file is validated first (422
 * listing bad rows, nothing written), then every row is written in ONE transaction together with
 * the instrument's remembered mapping and the audit entry.
 */
export async function importMeasurements(ds: DataSource, actor: SessionUser, lotId: number, input: ImportInput, progress: Progress = () => {}): Promise<ImportResult> {
  const started = performance.now();
  const pre = await loadLotContext(ds.manager, lotId);
  await assertMeasurable(ds.manager, pre.lot, null);
  const preSession = await openSessionOf(ds.manager, lotId, input.sessionId);
  await assertMeasurable(ds.manager, pre.lot, preSession.mode);
  const cols = parseAndValidate(
    input,
    { lotQuantity: pre.lot.quantity, ambientC: preSession.ambientC, hfeTcPctPerC: pre.partType.hfeTcPctPerC, vbeTcMvPerC: pre.partType.vbeTcMvPerC },
    progress,
  );
  await ds.transaction(async (m) => {
    const { lot, partType } = await loadLotContext(m, lotId, true);
    await assertMeasurable(m, lot, null);
    const session = await openSessionOf(m, lotId, input.sessionId);
    await assertMeasurable(m, lot, session.mode);
    if (session.ambientC !== preSession.ambientC || partType.hfeTcPctPerC !== pre.partType.hfeTcPctPerC || partType.vbeTcMvPerC !== pre.partType.vbeTcMvPerC) {
      throw AppError.conflict('The session or part type changed during the import; import again.');
    }
    const taken = (await m.query('SELECT position FROM measurement WHERE lot_id = $1 AND NOT superseded', [lotId])) as { position: number }[];
    if (taken.length) {
      const takenSet = new Set(taken.map((t) => t.position));
      const clashes: FieldError[] = [];
      let count = 0;
      for (let r = 0; r < cols.n; r++) {
        if (!takenSet.has(cols.position[r])) continue;
        count++;
        if (clashes.length < MAX_LISTED_ERRORS) clashes.push({ field: `row ${r + 1}`, message: `line ${r + 2}: position ${cols.position[r]} already has a reading in this lot; correct it in the grid instead` });
      }
      if (count) throw AppError.unprocessable(`${count} rows name positions that are already measured; nothing was imported.`, clashes);
    }
    await bulkInsert(m, { lotId, sessionId: session.id, userId: actor.id }, cols, progress);
    // Bins: the parts of a screening import are placed into bins in the same transaction.
    if (session.mode === 'screen') await placeUnplacedReadings(m, actor, lotId);
    await m.upsert(
      InstrumentMapping,
      { instrument: session.instrument, mapping: input.mapping, units: input.units, updatedBy: actor.id, updatedAt: new Date() },
      ['instrument'],
    );
    await markInspecting(m, actor, lot);
    await recordAudit(m, {
      actor,
      action: 'measurement.import',
      entityType: 'lot',
      entityId: lotId,
      after: { sessionId: session.id, instrument: session.instrument, rows: cols.n, mapping: input.mapping, units: input.units },
    });
  });
  const ms = Math.round(performance.now() - started);
  progress({ phase: 'done', done: cols.n, total: cols.n, message: `Imported ${cols.n.toLocaleString('en')} rows in ${(ms / 1000).toFixed(1)} s.` });
  return { imported: cols.n, sessionId: input.sessionId, ms };
}

export async function getInstrumentMapping(ds: DataSource, instrument: string): Promise<InstrumentMapping | null> {
  return ds.getRepository(InstrumentMapping).findOneBy({ instrument });
}
