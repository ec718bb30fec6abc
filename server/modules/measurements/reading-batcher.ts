import type { Pool, PoolClient } from 'pg';
import type { DataSource } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { MeasurementRow, RecordMeasurementRequest } from '../../../shared/api/measurements.ts';
import type { Reading } from '../../../shared/domain/inspection/index.ts';
import { isDatabaseUnavailable } from '../../http/database-errors.ts';
import { poolOf } from '../../prepared-query.ts';
import { binaryArray, FLOAT8, INT4 } from './measurement-import.service.ts';
import { normalise, positionTaken, readingOrThrow, recordMeasurement, toRow } from './measurements.service.ts';

export interface ReadingBatcherOptions {
  /** Most readings in one batch. */
  maxBatch?: number;
  /** Batches being written at once, each on its own connection. */
  maxInFlight?: number;
  /**
   * While a batch is being written, how long (ms) newly arrived readings wait for more before
   * a second batch starts. With nothing in flight see idleWaitMs.
   */
  windowMs?: number;
  /**
   * With nothing in flight, how long (ms) a reading waits for others before it is written; 0
   * writes it in the next turn of the event loop. At a steady 1 000 readings/s, 2 ms gave batches
   * of about three instead of one or two, and about a fifth less CPU per reading in the server
   * and a third less in PostgreSQL (docs/scaling.md), for 1–2 ms more at the median.
   */
  idleWaitMs?: number;
}

export interface ReadingBatcherStats {
  batches: number;
  /** Readings written by batches (inserted or refused as a taken position). */
  batched: number;
  largestBatch: number;
  /** Readings passed to recordMeasurement (see the class comment). */
  single: number;
  /** Batches that failed and whose readings were recorded one by one. */
  failedBatches: number;
}

interface Pending {
  actor: SessionUser;
  lotId: number;
  input: RecordMeasurementRequest;
  reading: Reading;
  key: string;
  resolve(row: MeasurementRow): void;
  reject(err: unknown): void;
}

/**
 * What became of a reading in its batch: stored; refused as a taken position; to be recorded on
 * its own (`moves` when that moves a received lot to inspecting); to wait for that move; or
 * failed with the database unreachable (answered 503).
 */
type Outcome =
  | { kind: 'stored'; row: MeasurementRow }
  | { kind: 'taken'; existingId: string | null }
  | { kind: 'single'; moves?: boolean }
  | { kind: 'wait' }
  | { kind: 'failed'; err: unknown };

interface ContextRow {
  session_id: number;
  lot_id: number;
  mode: string;
  ambient_c: number;
  closed: boolean;
  status: string;
  quantity: number;
  hfe_tc_pct_per_c: number;
  vbe_tc_mv_per_c: number;
  hfe_min: number | null;
  hfe_max: number | null;
  vbe_min_mv: number | null;
  vbe_max_mv: number | null;
}

/** Lot states in which a batch writes a reading itself ("received" needs the move to inspecting). */
const BATCHED_STATUSES = new Set(['inspecting', 'awaiting-signature']);

const CONTEXT_SQL = `
  SELECT s.id AS session_id, s.lot_id, s.mode, s.ambient_c, s.closed_at IS NOT NULL AS closed,
         l.status, l.quantity, p.hfe_tc_pct_per_c, p.vbe_tc_mv_per_c, p.hfe_min, p.hfe_max, p.vbe_min_mv, p.vbe_max_mv
    FROM unnest($1::int[], $2::int[]) AS k(lot_id, session_id)
    JOIN measurement_session s ON s.id = k.session_id AND s.lot_id = k.lot_id
    JOIN lot l ON l.id = s.lot_id
    JOIN part_type p ON p.id = l.part_type_id
   ORDER BY l.id
     FOR SHARE OF l`;

const INSERT_SQL = `
  INSERT INTO measurement (lot_id, session_id, position, hfe, vbe_mv, vce_sat_mv, leakage_na, hfe_25, vbe_mv_25, source, created_by)
  SELECT t.lot_id, t.session_id, t.position, t.hfe, t.vbe_mv, t.vce_sat_mv, t.leakage_na, t.hfe_25, t.vbe_mv_25, 'grid', t.created_by
    FROM unnest($1::int[], $2::int[], $3::int[], $4::float8[], $5::float8[], $6::float8[], $7::float8[], $8::float8[], $9::float8[], $10::int[])
      AS t(lot_id, session_id, position, hfe, vbe_mv, vce_sat_mv, leakage_na, hfe_25, vbe_mv_25, created_by)
  ON CONFLICT DO NOTHING
  RETURNING id, lot_id, position, created_at`;

const TAKEN_SQL = `
  SELECT m.id, m.lot_id, m.position
    FROM unnest($1::int[], $2::int[]) AS k(lot_id, position)
    JOIN measurement m ON m.lot_id = k.lot_id AND m.position = k.position AND NOT m.superseded`;

/**
 * The one-statement write of readings whose lot, session and part type the batcher has seen
 * (KNOWN_SQL's k arrays carry what it saw). The statement checks in the database, under a
 * shared lock on each lot, everything the readings were prepared with — session open, in
 * sampling mode, same ambient; lot in a batched state and the position within its quantity;
 * the part type's temperature coefficients and limits — and inserts only the readings whose
 * context still holds. Alone, outside a transaction block, it is its own transaction.
 */
const KNOWN_SQL = `
  INSERT INTO measurement (lot_id, session_id, position, hfe, vbe_mv, vce_sat_mv, leakage_na, hfe_25, vbe_mv_25, source, created_by)
  SELECT t.lot_id, t.session_id, t.position, t.hfe, t.vbe_mv, t.vce_sat_mv, t.leakage_na, t.hfe_25, t.vbe_mv_25, 'grid', t.created_by
    FROM unnest($1::int[], $2::int[], $3::int[], $4::float8[], $5::float8[], $6::float8[], $7::float8[], $8::float8[], $9::float8[], $10::int[])
      AS t(lot_id, session_id, position, hfe, vbe_mv, vce_sat_mv, leakage_na, hfe_25, vbe_mv_25, created_by)
    JOIN unnest($11::int[], $12::int[], $13::float8[], $14::float8[], $15::float8[], $16::float8[], $17::float8[], $18::float8[], $19::float8[])
      AS k(lot_id, session_id, ambient_c, hfe_tc, vbe_tc, hfe_min, hfe_max, vbe_min_mv, vbe_max_mv)
      ON k.lot_id = t.lot_id AND k.session_id = t.session_id
    JOIN measurement_session s ON s.id = t.session_id AND s.lot_id = t.lot_id
    JOIN lot l ON l.id = t.lot_id
    JOIN part_type p ON p.id = l.part_type_id
   WHERE s.closed_at IS NULL AND s.mode = 'sample' AND s.ambient_c = k.ambient_c
     AND l.status IN ('inspecting', 'awaiting-signature') AND t.position <= l.quantity
     AND p.hfe_tc_pct_per_c = k.hfe_tc AND p.vbe_tc_mv_per_c = k.vbe_tc
     AND p.hfe_min IS NOT DISTINCT FROM k.hfe_min AND p.hfe_max IS NOT DISTINCT FROM k.hfe_max
     AND p.vbe_min_mv IS NOT DISTINCT FROM k.vbe_min_mv AND p.vbe_max_mv IS NOT DISTINCT FROM k.vbe_max_mv
   ORDER BY l.id
     FOR SHARE OF l
  ON CONFLICT DO NOTHING
  RETURNING id, lot_id, position, created_at`;

/** How long a lot's context read by a batch is used for the one-statement write, ms. */
const CONTEXT_KEEP_MS = 10_000;

/** How long the batcher keeps its connections after the last batch, ms. */
const KEEP_MS = 100;

const keyOf = (lotId: number, position: number) => `${lotId}:${position}`;
const ints = (v: number[]) => binaryArray(v, 0, v.length, INT4);
const floats = (v: (number | null)[]) => binaryArray(v, 0, v.length, FLOAT8);

/**
 * Group commit for grid readings (POST /api/lots/:id/measurements).
 *
 * Readings that arrive while a batch is being written wait in this process and are written
 * together, whatever their number. Readings of a lot whose context (session, lot, part type) a
 * batch read in the last CONTEXT_KEEP_MS go in by one statement (KNOWN_SQL: a multi-row
 * INSERT … SELECT FROM unnest(arrays) that checks that context again under a shared lock on each
 * lot, with ON CONFLICT DO NOTHING) — one round trip per batch while a bench keeps measuring.
 * The others, and any the statement did not store (context changed, position taken), get one
 * transaction (BEGIN; the lots, sessions and part types with a shared lock on each lot; the same
 * insert; COMMIT). Each request is answered only after its reading is committed, so an answer
 * 201 is a stored reading.
 *
 * Every reading still gets its own answer:
 * - a reading the domain refuses (422) is answered before it is queued;
 * - a position that already has a current reading answers 409 naming `position` (the unique
 *   index decides, as in recordMeasurement); two readings of one position are never in the
 *   same batch or in two batches at once, so the second one is told the first one's id;
 * - a reading that needs more than an insert — a screening session (the part is placed into
 *   a container), a closed session or lot, an unknown lot or session, a position beyond the
 *   lot — goes through recordMeasurement on its own after the batch, which answers it exactly
 *   as before;
 * - on a lot still "received", one reading goes through recordMeasurement and moves the lot to
 *   inspecting (exclusive lock, status, audit entry); the lot's other readings wait in the
 *   queue for that and then go in a batch, rather than each taking the exclusive lock in turn;
 * - when the batch fails because the database cannot be reached, every request of the batch
 *   answers the 503 problem; when it fails for any other reason (one row the database refuses,
 *   a deadlock), each reading is recorded again on its own through recordMeasurement, so one
 *   bad reading fails only its own request and nothing is answered 201 that was not stored.
 *
 * The statements are named (prepared once per connection, planned without TypeORM's query
 * building); the arrays are sent in PostgreSQL's binary format like the tester import's.
 */
export class ReadingBatcher {
  readonly stats: ReadingBatcherStats = { batches: 0, batched: 0, largestBatch: 0, single: 0, failedBatches: 0 };
  private readonly pool: Pool;
  private readonly maxBatch: number;
  private readonly maxInFlight: number;
  private readonly windowMs: number;
  private readonly idleWaitMs: number;
  private queue: Pending[] = [];
  private inFlight = 0;
  /** lot:position of the readings in batches being written. */
  private readonly writing = new Set<string>();
  /** Lots whose first reading is moving them from received to inspecting (see run()). */
  private readonly moving = new Set<number>();
  private timer: NodeJS.Timeout | null = null;
  private immediate: NodeJS.Immediate | null = null;
  /** Connections kept between batches (see connection()). */
  private readonly held: { client: PoolClient; onError: () => void }[] = [];
  private releaseTimer: NodeJS.Timeout | null = null;
  /** Contexts (session, lot, part type) read by recent batches, for the one-statement write. */
  private readonly contexts = new Map<string, { c: ContextRow; until: number }>();

  constructor(
    private readonly ds: DataSource,
    opts: ReadingBatcherOptions = {},
  ) {
    this.pool = poolOf(ds);
    this.maxBatch = opts.maxBatch ?? 256;
    this.maxInFlight = opts.maxInFlight ?? 2;
    this.windowMs = opts.windowMs ?? 2;
    this.idleWaitMs = opts.idleWaitMs ?? 2;
  }

  /** Records one grid reading; resolves once it is committed. Same answers as recordMeasurement. */
  record(actor: SessionUser, lotId: number, input: RecordMeasurementRequest): Promise<MeasurementRow> {
    const reading = readingOrThrow(input);
    return new Promise((resolve, reject) => {
      this.queue.push({ actor, lotId, input, reading, key: keyOf(lotId, input.position), resolve, reject });
      this.schedule();
    });
  }

  private schedule(): void {
    if (this.queue.length === 0 || this.inFlight >= this.maxInFlight) return;
    if (this.inFlight === 0) {
      // Idle: write after idleWaitMs, with whatever else arrived meanwhile.
      if (this.idleWaitMs > 0) this.timer ??= setTimeout(() => this.flush(), this.idleWaitMs);
      else this.immediate ??= setImmediate(() => this.flush());
    } else if (this.queue.length >= this.maxBatch) {
      this.flush();
    } else {
      this.timer ??= setTimeout(() => this.flush(), this.windowMs);
    }
  }

  private flush(): void {
    if (this.timer) clearTimeout(this.timer);
    if (this.immediate) clearImmediate(this.immediate);
    this.timer = null;
    this.immediate = null;
    if (this.inFlight >= this.maxInFlight) return;
    const batch: Pending[] = [];
    const rest: Pending[] = [];
    const keys = new Set<string>();
    for (const p of this.queue) {
      // A position already in this batch or in one being written waits for that one to finish;
      // a reading of a lot being moved to inspecting waits for the move.
      if (batch.length < this.maxBatch && !keys.has(p.key) && !this.writing.has(p.key) && !this.moving.has(p.lotId)) {
        batch.push(p);
        keys.add(p.key);
      } else {
        rest.push(p);
      }
    }
    this.queue = rest;
    if (batch.length === 0) return; // all wait for a batch in flight, whose end schedules again
    this.inFlight++;
    for (const k of keys) this.writing.add(k);
    void this.run(batch)
      .catch((err: unknown) => {
        // run() settles every request itself; this only keeps a bug from leaving them waiting.
        for (const p of batch) p.reject(err);
      })
      .finally(() => {
        this.inFlight--;
        for (const k of keys) this.writing.delete(k);
        // Group commit: what arrived meanwhile goes out now.
        if (this.queue.length) this.flush();
      });
    this.schedule();
  }

  private async run(batch: Pending[]): Promise<void> {
    this.stats.batches++;
    this.stats.largestBatch = Math.max(this.stats.largestBatch, batch.length);
    const outcomes: (Outcome | undefined)[] = new Array<Outcome | undefined>(batch.length);
    let client: PoolClient;
    try {
      client = await this.connection();
    } catch (err) {
      // No connection: the database is down (503 for each), or something else (each on its own).
      if (!isDatabaseUnavailable(err)) this.stats.failedBatches++;
      this.settle(batch, batch.map(() => (isDatabaseUnavailable(err) ? { kind: 'failed', err } : { kind: 'single' })));
      return;
    }
    const state = { broken: false };
    try {
      // Readings of lots seen in the last seconds: one statement (KNOWN_SQL).
      try {
        await this.writeKnown(client, batch, outcomes);
      } catch (err) {
        if (isDatabaseUnavailable(err)) {
          state.broken = true;
          this.settle(batch, batch.map(() => ({ kind: 'failed', err })));
          return;
        }
        // Anything else: nothing was written (one statement); all go the full way below.
      }
      // The rest (new lots, changed contexts, taken positions, first readings): one transaction.
      const rest: number[] = [];
      for (let i = 0; i < batch.length; i++) if (outcomes[i] === undefined) rest.push(i);
      if (rest.length) {
        try {
          const full = await this.transaction(client, rest.map((i) => batch[i]), state);
          rest.forEach((i, j) => (outcomes[i] = full[j]));
        } catch (err) {
          if (isDatabaseUnavailable(err)) {
            state.broken = true;
            for (const i of rest) outcomes[i] = { kind: 'failed', err };
          } else {
            this.stats.failedBatches++;
            for (const i of rest) outcomes[i] = { kind: 'single' };
          }
        }
      }
    } finally {
      if (state.broken) client.release(true);
      else this.keep(client);
    }
    this.settle(batch, outcomes as Outcome[]);
  }

  /** Answers each reading of a batch by its outcome (or sends it on its own way). */
  private settle(batch: Pending[], outcomes: Outcome[]): void {
    const waiting: Pending[] = [];
    batch.forEach((p, i) => {
      const o = outcomes[i];
      if (o.kind === 'stored') {
        this.stats.batched++;
        p.resolve(o.row);
      } else if (o.kind === 'taken') {
        this.stats.batched++;
        p.reject(positionTaken(p.input.position, o.existingId));
      } else if (o.kind === 'failed') {
        p.reject(o.err);
      } else if (o.kind === 'wait') {
        waiting.push(p);
      } else {
        this.stats.single++;
        const single = recordMeasurement(this.ds, p.actor, p.lotId, p.input);
        single.then(p.resolve, p.reject);
        if (o.moves) {
          // The lot's other readings wait in the queue until it is inspecting, then go in a batch.
          this.moving.add(p.lotId);
          void single
            .catch(() => {})
            .finally(() => {
              this.moving.delete(p.lotId);
              this.schedule();
            });
        }
      }
    });
    // Back to the head of the queue, in their order (flush() skips them while their lot moves).
    this.queue.unshift(...waiting);
  }

  /** One transaction for the readings; the outcome of each, in order. */
  private async transaction(client: PoolClient, batch: Pending[], state: { broken: boolean }): Promise<Outcome[]> {
    await client.query('BEGIN');
    try {
      const outcomes = await this.writeIn(client, batch);
      await client.query('COMMIT');
      return outcomes;
    } catch (err) {
      await client.query('ROLLBACK').catch(() => (state.broken = true));
      throw err;
    }
  }

  /**
   * A connection for the next batch. While readings keep coming the batcher keeps the
   * connections it used instead of giving them back to the pool after each batch, so
   * recordings never queue behind a burst of other requests (list pages, reports) waiting for
   * a pooled connection; they go back to the pool once no batch needed them for KEEP_MS.
   */
  private async connection(): Promise<PoolClient> {
    const held = this.held.pop();
    if (held) {
      held.client.removeListener('error', held.onError);
      return held.client;
    }
    return this.pool.connect();
  }

  private keep(client: PoolClient): void {
    // A connection that breaks while held (PostgreSQL restarted) is dropped, not left to crash
    // the process with an unhandled 'error' event.
    const entry = {
      client,
      onError: () => {
        const i = this.held.indexOf(entry);
        if (i >= 0) this.held.splice(i, 1);
        client.release(true);
      },
    };
    client.on('error', entry.onError);
    this.held.push(entry);
    this.releaseTimer ??= setTimeout(this.releaseIdle, KEEP_MS);
  }

  private readonly releaseIdle = () => {
    this.releaseTimer = null;
    if (this.inFlight > 0 || this.queue.length > 0) {
      this.releaseTimer = setTimeout(this.releaseIdle, KEEP_MS);
      return;
    }
    for (const { client, onError } of this.held.splice(0)) {
      client.removeListener('error', onError);
      client.release();
    }
  };

  /** The context a batch read for `lotId:sessionId` in the last CONTEXT_KEEP_MS, if any. */
  private knownContext(key: string, now: number): ContextRow | undefined {
    const hit = this.contexts.get(key);
    if (!hit) return undefined;
    if (hit.until > now) return hit.c;
    this.contexts.delete(key);
    return undefined;
  }

  private remember(rows: ContextRow[]): void {
    const until = Date.now() + CONTEXT_KEEP_MS;
    if (this.contexts.size + rows.length > 2_000) this.contexts.clear();
    for (const c of rows) this.contexts.set(`${c.lot_id}:${c.session_id}`, { c, until });
  }

  /**
   * The readings whose context was seen lately and allows a plain insert, written with one
   * statement (KNOWN_SQL). Fills `outcomes` for the readings stored; leaves the others (context
   * changed meanwhile, position taken, context not known) for the full write.
   */
  private async writeKnown(client: PoolClient, batch: Pending[], outcomes: (Outcome | undefined)[]): Promise<void> {
    const now = Date.now();
    const entries: Prepared[] = [];
    const used = new Map<string, ContextRow>();
    batch.forEach((p, index) => {
      const key = `${p.lotId}:${p.input.sessionId}`;
      const c = this.knownContext(key, now);
      if (!c || !plainInsert(c, p)) return;
      used.set(key, c);
      entries.push(prepare(p, index, c));
    });
    if (entries.length === 0) return;
    const k = [...used.values()];
    const inserted = await client.query<InsertedRow>({
      name: 'bw-reading-insert-known',
      text: KNOWN_SQL,
      values: [
        ...columns(batch, entries),
        ints(k.map((c) => c.lot_id)),
        ints(k.map((c) => c.session_id)),
        floats(k.map((c) => c.ambient_c)),
        floats(k.map((c) => c.hfe_tc_pct_per_c)),
        floats(k.map((c) => c.vbe_tc_mv_per_c)),
        floats(k.map((c) => c.hfe_min)),
        floats(k.map((c) => c.hfe_max)),
        floats(k.map((c) => c.vbe_min_mv)),
        floats(k.map((c) => c.vbe_max_mv)),
      ],
    });
    const stored = new Map(inserted.rows.map((r) => [keyOf(r.lot_id, r.position), r]));
    for (const e of entries) {
      const p = batch[e.index];
      const row = stored.get(p.key);
      if (row) outcomes[e.index] = { kind: 'stored', row: storedRow(p, e, row) };
    }
  }

  private async writeIn(client: PoolClient, batch: Pending[]): Promise<Outcome[]> {
    const pairs = new Map<string, [number, number]>();
    for (const p of batch) pairs.set(`${p.lotId}:${p.input.sessionId}`, [p.lotId, p.input.sessionId]);
    const sorted = [...pairs.values()].sort((a, b) => a[0] - b[0]);
    const ctx = await client.query<ContextRow>({
      name: 'bw-reading-context',
      text: CONTEXT_SQL,
      values: [ints(sorted.map((x) => x[0])), ints(sorted.map((x) => x[1]))],
    });
    this.remember(ctx.rows);
    const contexts = new Map(ctx.rows.map((c) => [`${c.lot_id}:${c.session_id}`, c]));

    const outcomes: Outcome[] = batch.map(() => ({ kind: 'single' }));
    const written: Prepared[] = [];
    const moved = new Set<number>();
    batch.forEach((p, index) => {
      const c = contexts.get(`${p.lotId}:${p.input.sessionId}`);
      if (!c || c.closed || c.mode !== 'sample' || p.input.position > c.quantity) return;
      if (c.status === 'received') {
        // The lot's first readings: one moves it to inspecting (an exclusive lock, an update
        // and its audit entry, in recordMeasurement); the others wait for it instead of each
        // queueing for that lock.
        if (moved.has(p.lotId)) outcomes[index] = { kind: 'wait' };
        else {
          moved.add(p.lotId);
          outcomes[index] = { kind: 'single', moves: true };
        }
        return;
      }
      if (!plainInsert(c, p)) return;
      written.push(prepare(p, index, c));
    });
    if (written.length === 0) return outcomes;

    const inserted = await client.query<InsertedRow>({ name: 'bw-reading-insert', text: INSERT_SQL, values: columns(batch, written) });
    const stored = new Map(inserted.rows.map((r) => [keyOf(r.lot_id, r.position), r]));

    const taken = written.filter((w) => !stored.has(batch[w.index].key));
    const takenIds = new Map<string, string>();
    if (taken.length) {
      const rows = await client.query<{ id: string; lot_id: number; position: number }>({
        name: 'bw-reading-taken',
        text: TAKEN_SQL,
        values: [ints(taken.map((w) => batch[w.index].lotId)), ints(taken.map((w) => batch[w.index].input.position))],
      });
      for (const r of rows.rows) takenIds.set(keyOf(r.lot_id, r.position), String(r.id));
    }

    for (const w of written) {
      const p = batch[w.index];
      const row = stored.get(p.key);
      outcomes[w.index] = row ? { kind: 'stored', row: storedRow(p, w, row) } : { kind: 'taken', existingId: takenIds.get(p.key) ?? null };
    }
    return outcomes;
  }
}

interface InsertedRow {
  id: string;
  lot_id: number;
  position: number;
  created_at: Date;
}

/** A reading ready for an insert: its place in the batch, its context, its 25 °C values. */
interface Prepared {
  index: number;
  c: ContextRow;
  hfe25: number;
  vbeMv25: number;
}

/** Whether a reading in this context is a plain insert (sampling session open, lot in a batched state, position within the lot). */
function plainInsert(c: ContextRow, p: Pending): boolean {
  return !c.closed && c.mode === 'sample' && BATCHED_STATUSES.has(c.status) && p.input.position <= c.quantity;
}

function prepare(p: Pending, index: number, c: ContextRow): Prepared {
  const { hfe25, vbeMv25 } = normalise(p.reading, c.ambient_c, { hfeTcPctPerC: c.hfe_tc_pct_per_c, vbeTcMvPerC: c.vbe_tc_mv_per_c });
  return { index, c, hfe25, vbeMv25 };
}

/** The ten arrays of INSERT_SQL / KNOWN_SQL ($1–$10), one element per prepared reading. */
function columns(batch: Pending[], entries: Prepared[]): Buffer[] {
  const at = (f: (p: Pending, e: Prepared) => number | null) => entries.map((e) => f(batch[e.index], e));
  return [
    ints(at((p) => p.lotId) as number[]),
    ints(at((_p, e) => e.c.session_id) as number[]),
    ints(at((p) => p.input.position) as number[]),
    floats(at((p) => p.reading.hfe)),
    floats(at((p) => p.reading.vbeMv)),
    floats(at((p) => p.reading.vceSatMv)),
    floats(at((p) => p.reading.leakageNa)),
    floats(at((_p, e) => e.hfe25)),
    floats(at((_p, e) => e.vbeMv25)),
    ints(at((p) => p.actor.id) as number[]),
  ];
}

/** The answer for a stored reading (as recordMeasurement answers). */
function storedRow(p: Pending, { c, hfe25, vbeMv25 }: Prepared, row: InsertedRow): MeasurementRow {
  return toRow(
    {
      id: String(row.id),
      sessionId: c.session_id,
      position: p.input.position,
      hfe: p.reading.hfe,
      vbeMv: p.reading.vbeMv,
      vceSatMv: p.reading.vceSatMv,
      leakageNa: p.reading.leakageNa,
      hfe25,
      vbeMv25,
      source: 'grid',
      supersedesId: null,
      superseded: false,
      correctionReason: null,
      createdAt: row.created_at,
    },
    { ambient_c: c.ambient_c, creator_name: p.actor.name },
    { hfeMin: c.hfe_min, hfeMax: c.hfe_max, vbeMinMv: c.vbe_min_mv, vbeMaxMv: c.vbe_max_mv },
  );
}
