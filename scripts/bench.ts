/**
 * `npm run bench`: measures Binwright's bulk paths and prints ONE report — a table
 * `measure | result | target | met?` under the machine's details — and writes it into the
 * generated part of docs/benchmarks.md (between <!-- bench:start --> and <!-- bench:end -->;
 * BENCH_NO_WRITE=1 skips writing). On a throwaway PostgreSQL cluster (port
 * BINWRIGHT_BENCH_DB_PORT, default 54350; folder BINWRIGHT_BENCH_DATA_DIR, default .data/bench;
 * fsync off like the test cluster):
 *   (a) the tester-CSV import of 100 000 rows into a *sampling* session (parse + validate +
 *       normalise + INSERT … unnest in one transaction), rows/s, in-process and over HTTP —
 *       recording rows only, what the import target is about;
 *   (b) a plain COPY of the same 100 000 readings into the same table with psql's \copy, and the
 *       ratio import / COPY;
 *   (c) the same file into a *screening* session: recorded and every part placed into a
 *       container of its gain bin (10-part strips, so one run issues over 10 000 container
 *       codes a day) in the same transaction, rows/s;
 *   (d) GET /api/lots/:id/summary of the 100 000-part lot, median of several calls, ms;
 *   (e) 500 bin labels rendered into one PDF (scripts/bench-labels.ts);
 *   (f) matching of the parts in stock (scripts/bench-matching.ts);
 *   (g) the client bundle: first-load JavaScript gzip and what each route adds
 *       (scripts/bench-bundle.ts; builds the client into <data dir>/dist first, or measures
 *       BINWRIGHT_DIST_DIR as it is with BENCH_SKIP_BUILD=1);
 *   (h) the load figure (scripts/bench-load.ts) — see loadRows().
 * Targets: import ≥ 50 000 rows/s and within 3× of COPY, summary < 150 ms, labels < 3 s,
 * matching < 300 ms, first-load JS < 250 kB gzip. Figures only: it asserts nothing. Every part
 * prints a progress line; the whole run stops after BENCH_MAX_MINUTES (default 20).
 */
import 'reflect-metadata';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import type { SessionMode } from '../shared/api/measurements.ts';
import { createApp } from '../server/app.ts';
import { readConfig } from '../server/config.ts';
import { createDataSource } from '../server/data-source.ts';
import { hashPassword } from '../server/modules/auth/password.ts';
import { containerCodeOrderSql } from '../server/modules/bins/container-code.ts';
import { PartType } from '../server/modules/catalog/part-type.entity.ts';
import { GainBinRow, GainBinSchemeVersion } from '../server/modules/catalog/gain-bin-scheme.entity.ts';
import { Lot } from '../server/modules/lots/lot.entity.ts';
import { importMeasurements } from '../server/modules/measurements/measurement-import.service.ts';
import { MeasurementSession } from '../server/modules/measurements/measurement-session.entity.ts';
import { loadLotValues, lotSummary } from '../server/modules/measurements/lot-summary.service.ts';
import { Supplier } from '../server/modules/suppliers/supplier.entity.ts';
import { User } from '../server/modules/users/user.entity.ts';
import { normaliseHfe, normaliseVbeMv } from '../shared/domain/normalise/index.ts';
import { benchBundle } from './bench-bundle.ts';
import { benchBinLabels } from './bench-labels.ts';
import { benchLoad, type PhaseFigures, type WriteFigures } from './bench-load.ts';
import { benchMatching } from './bench-matching.ts';
import { median, num, replaceBenchSection, reportMarkdown, reportText, rowsPerSecond, type BenchReport, type ReportRow, type ReportTable } from './lib/bench-report.ts';
import { inventedBenchNpn } from './lib/bench-fixtures.ts';
import { clusterEnv, startCluster, type RunningCluster } from './lib/pg-cluster.ts';

const STANDARD_ROWS = 100_000;
const ROWS = Number(process.env.BENCH_ROWS ?? STANDARD_ROWS);
const RUNS = 3;
const SUMMARY_RUNS = 15;
/** Parts per container in the screening import: small strips, as a big screening day uses. */
const SCREEN_CAPACITY = Number(process.env.BENCH_SCREEN_CAPACITY ?? 10);
const MAX_MINUTES = Number(process.env.BENCH_MAX_MINUTES ?? 20);
const AMBIENT_C = 27;
const PASSWORD = 'bench-password-123';
const root = path.resolve(process.env.BINWRIGHT_BENCH_DATA_DIR ?? '.data/bench');
const DOC = path.resolve('docs/benchmarks.md');
const log = (l: string) => console.log(`[bench] ${l}`);

/** mulberry32: a small seeded generator, so every run measures the same file. */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function normal(next: () => number) {
  return () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
}

interface Reading {
  hfe: number;
  vbeV: number;
}

function readings(n: number): Reading[] {
  const z = normal(rng(20261201));
  const out: Reading[] = new Array(n);
  for (let i = 0; i < n; i++) out[i] = { hfe: Math.round((215 + 28 * z()) * 10) / 10, vbeV: Math.round((0.652 + 0.006 * z()) * 10000) / 10000 };
  return out;
}

function testerCsv(rs: Reading[]): string {
  const lines = new Array<string>(rs.length + 1);
  lines[0] = 'Serial,Position,hFE,Vbe (V)';
  for (let i = 0; i < rs.length; i++) lines[i + 1] = `HPA-${i + 1},${i + 1},${rs[i].hfe},${rs[i].vbeV}`;
  return `${lines.join('\n')}\n`;
}

/** The same readings with the table's own columns, for a plain COPY. */
function tableCsv(rs: Reading[], lotId: number, sessionId: number, userId: number, part: PartType): string {
  const lines = new Array<string>(rs.length);
  for (let i = 0; i < rs.length; i++) {
    const vbeMv = rs[i].vbeV * 1000;
    const hfe25 = normaliseHfe(rs[i].hfe, AMBIENT_C, part.hfeTcPctPerC);
    const vbe25 = normaliseVbeMv(vbeMv, AMBIENT_C, part.vbeTcMvPerC);
    lines[i] = `${lotId},${sessionId},${i + 1},${rs[i].hfe},${vbeMv},,,${hfe25},${vbe25},import,${i + 1},${userId}`;
  }
  return `${lines.join('\n')}\n`;
}

interface Fixture {
  supplier: Supplier;
  part: PartType;
  user: User;
  schemeId: number;
}

/** A received lot with gain bins and one open session of the given mode ('sample' records only; 'screen' also places every part). */
async function newLot(ds: DataSource, f: Fixture, code: string, mode: SessionMode) {
  const lot = await ds.getRepository(Lot).save(
    ds.getRepository(Lot).create({
      code,
      supplierId: f.supplier.id,
      partTypeId: f.part.id,
      quantity: ROWS,
      status: 'received',
      receivedBy: f.user.id,
      dryBag: 'not-applicable',
      binSchemeId: f.schemeId,
      purchaseOrder: null,
      supplierPartNumber: null,
      supplierLot: null,
      dateCode: null,
      countryOfOrigin: null,
      msl: null,
      bagOpenedAt: null,
      labelRaw: null,
      labelFingerprint: null,
      labelElements: null,
      overrideBy: null,
      overrideReason: null,
    }),
  );
  const session = await ds.getRepository(MeasurementSession).save(
    ds.getRepository(MeasurementSession).create({ lotId: lot.id, instrument: 'Bench tester', ambientC: AMBIENT_C, mode, operatorId: f.user.id, closedAt: null }),
  );
  if (mode === 'screen') {
    await ds.query(`INSERT INTO screening_setup (lot_id, kind, capacity, has_positions, location) VALUES ($1, 'strip', $2, true, 'Bench rack')`, [lot.id, SCREEN_CAPACITY]);
  }
  return { lot, session };
}

function psqlBinary(): string {
  const local = '/usr/lib/postgresql/15/bin/psql';
  return fs.existsSync(local) ? local : 'psql';
}

function copyWithPsql(cluster: RunningCluster, file: string): number {
  const sql = `\\timing on\n\\copy measurement (lot_id, session_id, position, hfe, vbe_mv, vce_sat_mv, leakage_na, hfe_25, vbe_mv_25, source, source_row, created_by) FROM '${file}' WITH (FORMAT csv)\n`;
  const started = performance.now();
  const r = spawnSync(psqlBinary(), ['-X', '-q', '-v', 'ON_ERROR_STOP=1', '-h', cluster.socketDir, '-p', String(cluster.port), '-U', cluster.user, '-d', cluster.database], {
    input: sql,
    encoding: 'utf8',
  });
  const wall = performance.now() - started;
  if (r.status !== 0) throw new Error(`psql \\copy failed: ${r.stderr}`);
  const m = /Time: ([\d.]+) ms/.exec(r.stdout);
  return m ? Number(m[1]) : wall;
}

/** Runs one part of the bench with a progress line before and after. */
async function part<T>(name: string, fn: () => Promise<T>): Promise<T> {
  log(`${name}…`);
  const t = performance.now();
  const out = await fn();
  log(`${name}: done in ${((performance.now() - t) / 1000).toFixed(1)} s`);
  return out;
}

/** Runs a part whose failure should not lose the other figures: a failure becomes a row saying so. */
async function optionalPart(name: string, fn: () => Promise<ReportRow[]>, failures: string[]): Promise<ReportRow[]> {
  try {
    return await part(name, fn);
  } catch (e) {
    const message = e instanceof Error ? e.message : String(e);
    log(`${name}: FAILED — ${message}`);
    failures.push(name);
    return [{ measure: name, result: `FAILED: ${message.split('\n')[0]?.slice(0, 160)}`, target: '', met: null }];
  }
}

const ms = (x: number) => `${num(x)} ms`;
const kB = (bytes: number) => `${(bytes / 1000).toFixed(1)} kB`;

interface BenchContext {
  ds: DataSource;
  cluster: RunningCluster;
  /** Environment of the bench database, for a server process (clusterEnv). */
  env: Record<string, string>;
  log: (line: string) => void;
}

/**
 * The load figure (scripts/bench-load.ts): the server in its own process on the bench database,
 * 50 connections recording, 50 reading the lots list, both at once, and recording paced at 100/s
 * and at the target's 1 000/s. Targets: ≥ 1 000 measurements/s, p99 < 50 ms, nothing lost.
 */
async function loadRows(ctx: BenchContext): Promise<ReportRow[]> {
  const r = await benchLoad({ ds: ctx.ds, env: ctx.env, log: (line) => ctx.log(`load: ${line}`) });
  const cpu = (x: PhaseFigures) => `CPU per request: server ${x.serverCpuMs} ms, PostgreSQL ${x.postgresCpuMs} ms, load generator ${x.loadGeneratorCpuMs} ms`;
  const kept = (x: WriteFigures) => `rows ${num(x.rowsInDatabase)} = 2xx ${num(x.ok)}${x.unanswered ? ` (+${x.unanswered} in flight at the cut)` : ''}, lost ${x.lost}, duplicated ${x.duplicated}`;
  const lat = (x: PhaseFigures) => `p50 ${x.p50Ms} ms, p99 ${x.p99Ms} ms, errors ${x.errors}`;
  return [
    {
      measure: `(h) load: ${r.connections} connections recording measurements (closed loop)`,
      result: `**${num(r.writersAlone.perSecond)} measurements/s**, ${lat(r.writersAlone)}`,
      target: '≥ 1 000 measurements/s',
      met: r.targets.throughput,
    },
    {
      measure: 'the same 50 connections: p99 of the closed loop (queueing at saturation included)',
      result: `p99 ${r.writersAlone.p99Ms} ms at ${num(r.writersAlone.perSecond)}/s`,
      target: 'p99 < 50 ms',
      met: r.writersAlone.p99Ms < 50,
      detail: true,
    },
    { measure: 'recording alone: what the server and PostgreSQL spent', result: `${cpu(r.writersAlone)}; ${kept(r.writersAlone)}`, target: '', met: null, detail: true },
    {
      measure: `(h) load: recording paced at ${num(r.atTarget.ratePerSecond)}/s (open loop)`,
      result: `${num(r.atTarget.perSecond)}/s answered, **p99 ${r.atTarget.p99Ms} ms** (p50 ${r.atTarget.p50Ms} ms), errors ${r.atTarget.errors}; ${kept(r.atTarget)}`,
      target: 'p99 < 50 ms, all answered 201',
      met: r.targets.p99,
    },
    { measure: `paced at ${num(r.paced.ratePerSecond)}/s`, result: `${lat(r.paced)}; ${kept(r.paced)}`, target: '', met: null, detail: true },
    { measure: `(h) load: ${r.connections} connections reading the lots list`, result: `${num(r.readersAlone.perSecond)} lists/s, ${lat(r.readersAlone)}; ${cpu(r.readersAlone)}`, target: '', met: null },
    {
      measure: 'both at once',
      result: `${num(r.mixed.writers.perSecond)} measurements/s (${lat(r.mixed.writers)}) + ${num(r.mixed.readers.perSecond)} lists/s (${lat(r.mixed.readers)})`,
      target: '',
      met: null,
      detail: true,
    },
    { measure: '(h) load: nothing lost (every 2xx reading in the database exactly once, in every phase)', result: r.nothingLost ? 'yes' : 'NO', target: 'nothing lost', met: r.nothingLost },
  ];
}

/** The client bundle figure: built into the bench's own folder unless BENCH_SKIP_BUILD=1. */
async function bundleRows(tables: ReportTable[]): Promise<ReportRow[]> {
  const skipBuild = process.env.BENCH_SKIP_BUILD === '1';
  const distDir = skipBuild ? path.resolve(process.env.BINWRIGHT_DIST_DIR ?? 'dist') : path.resolve(process.env.BINWRIGHT_BENCH_DIST_DIR ?? path.join(root, 'dist'));
  const r = await benchBundle({ distDir, build: !skipBuild });
  const rows: ReportRow[] = [
    {
      measure: '(g) client first load: JavaScript (gzip, level 9)',
      result: `${kB(r.initialJsGzipBytes)} gzip (${kB(r.initialJsBytes)} raw, ${r.initial.length} file${r.initial.length === 1 ? '' : 's'}); CSS ${kB(r.cssGzipBytes)} gzip`,
      target: '< 250 kB gzip',
      met: r.initialJsGzipBytes < r.targetGzipBytes,
    },
  ];
  if (r.routes?.length) {
    const largest = r.routes[0];
    rows.push({
      measure: 'client: what a first visit to a route adds (gzip)',
      result: `${r.routes.length} lazy routes, ${kB(r.routes[r.routes.length - 1].gzipBytes)} to ${kB(largest.gzipBytes)} (largest ${largest.route}); all later chunks ${kB(r.laterJsGzipBytes)}`,
      target: '',
      met: null,
      detail: true,
    });
    tables.push({
      title: 'Client: JavaScript a first visit to each route adds beyond the first load',
      columns: ['route', 'gzip', 'raw', 'files'],
      rows: r.routes.map((x) => [`\`${x.route}\``, kB(x.gzipBytes), kB(x.bytes), String(x.files.length)]),
    });
  } else {
    rows.push({
      measure: 'client: chunks loaded later (no manifest: per route not known)',
      result: `${r.later.length} chunks, ${kB(r.laterJsGzipBytes)} gzip`,
      target: '',
      met: null,
      detail: true,
    });
  }
  return rows;
}

async function postgresVersion(ds: DataSource): Promise<string> {
  const [row] = (await ds.query('SHOW server_version')) as { server_version: string }[];
  return row?.server_version ?? 'unknown';
}

async function main() {
  const startedAt = new Date();
  const loadStart = os.loadavg();
  let stopCluster = () => {};
  const watchdog = setTimeout(() => {
    log(`stopped: the run took longer than BENCH_MAX_MINUTES=${MAX_MINUTES}`);
    stopCluster();
    process.exit(2);
  }, MAX_MINUTES * 60_000);
  watchdog.unref();

  fs.mkdirSync(root, { recursive: true });
  const cluster = await startCluster({
    dataDir: path.join(root, 'postgres'),
    port: Number(process.env.BINWRIGHT_BENCH_DB_PORT ?? 54350),
    database: 'binwright_bench',
    throwaway: true,
    log,
  });
  stopCluster = () => cluster.stop();
  let ds: DataSource | null = null;
  const rows: ReportRow[] = [];
  const tables: ReportTable[] = [];
  const notes: string[] = [];
  const failures: string[] = [];
  let pgVersion = 'unknown';
  try {
    Object.assign(process.env, clusterEnv(cluster), { BINWRIGHT_DATA_DIR: path.join(root, 'files'), NODE_ENV: 'production' });
    ds = createDataSource(readConfig());
    await ds.initialize();
    await ds.runMigrations({ transaction: 'each' });
    const db = ds;
    pgVersion = await postgresVersion(db);

    const user = await db.getRepository(User).save(
      db.getRepository(User).create({ email: 'bench@example.test', name: 'Bench Inspector', role: 'inspector', passwordHash: await hashPassword(PASSWORD), active: true }),
    );
    const supplier = await db.getRepository(Supplier).save(db.getRepository(Supplier).create({ code: 'BENCH', name: 'Bench Distributor (invented)', approval: 'approved', notes: null }));
    const partType = await db.getRepository(PartType).save(
      db.getRepository(PartType).create(inventedBenchNpn('HPA-BENCH-NPN', 'Invented small-signal NPN for the benchmark')),
    );
    const scheme = await db.getRepository(GainBinSchemeVersion).save(db.getRepository(GainBinSchemeVersion).create({ partTypeId: partType.id, version: 1, note: null, lockedAt: null, createdBy: null }));
    await db.getRepository(GainBinRow).save(
      [
        ['A', 110, 180],
        ['B', 180, 250],
        ['C', 250, 320],
      ].map(([code, lo, hi], i) => db.getRepository(GainBinRow).create({ schemeId: scheme.id, position: i + 1, code: String(code), label: `Gain ${code}`, hfeMin: Number(lo), hfeMax: Number(hi), vbeMinMv: null, vbeMaxMv: null, gapBeforeIntended: false })),
    );
    const fixture: Fixture = { supplier, part: partType, user, schemeId: scheme.id };
    const actor = { id: user.id, email: user.email, name: user.name, role: user.role };

    const rs = readings(ROWS);
    const csv = testerCsv(rs);
    log(`Tester file: ${num(ROWS)} rows, ${(csv.length / 1024 / 1024).toFixed(1)} MB`);
    const mapping = { position: 'Position', hfe: 'hFE', vbe: 'Vbe (V)' };
    const units = { vbe: 'V' as const, vceSat: 'mV' as const, leakage: 'nA' as const };
    const importInto = async (lotId: number, sessionId: number, progress?: Parameters<typeof importMeasurements>[4]) => {
      const res = await importMeasurements(db, actor, lotId, { csv, sessionId, mapping, units }, progress);
      if (res.imported !== ROWS) throw new Error(`imported ${res.imported} of ${ROWS} rows`);
    };

    // Warm-up on a small file so JIT and connection set-up are not in the first figure.
    await part('warm-up (2 000 rows, both session modes)', async () => {
      for (const mode of ['sample', 'screen'] as const) {
        const { lot, session } = await newLot(db, fixture, `BENCH-WARM-${mode}`, mode);
        await importMeasurements(db, actor, lot.id, { csv: testerCsv(rs.slice(0, 2000)), sessionId: session.id, mapping, units });
      }
    });

    // (a) import into a sampling session: recording rows only
    const importMs: number[] = [];
    const phases: Record<string, number[]> = {};
    let summaryLotId = 0;
    await part(`(a) import into a sampling session, in-process, ${RUNS} runs`, async () => {
      for (let run = 0; run < RUNS; run++) {
        const { lot, session } = await newLot(db, fixture, `BENCH-IMP-${run}`, 'sample');
        const t = performance.now();
        // Phase times from the import's own progress reports: parse, validate, write (+ commit).
        let phase = 'start';
        let since = t;
        const seen: Record<string, number> = {};
        await importInto(lot.id, session.id, (p) => {
          if (p.phase === phase) return;
          const now = performance.now();
          seen[phase] = (seen[phase] ?? 0) + (now - since);
          phase = p.phase;
          since = now;
        });
        importMs.push(performance.now() - t);
        for (const [k, v] of Object.entries(seen)) (phases[k] ??= []).push(v);
        summaryLotId = lot.id;
      }
    });

    // (a') over HTTP: multipart upload, multer, the same service
    const app = createApp({ dataSource: db });
    const agent = request.agent(app);
    const csrf = (await agent.get('/api/auth/csrf')).body.csrfToken as string;
    await agent.post('/api/auth/login').set('x-csrf-token', csrf).send({ email: user.email, password: PASSWORD }).expect(200);
    const httpMs: number[] = [];
    await part(`(a) the same import over HTTP, ${RUNS} runs`, async () => {
      for (let run = 0; run < RUNS; run++) {
        const { lot, session } = await newLot(db, fixture, `BENCH-HTTP-${run}`, 'sample');
        const t = performance.now();
        await agent
          .post(`/api/lots/${lot.id}/measurements/import`)
          .set('x-csrf-token', csrf)
          .field('sessionId', String(session.id))
          .field('mapping', JSON.stringify(mapping))
          .field('units', JSON.stringify(units))
          .attach('file', Buffer.from(csv), 'tester.csv')
          .expect(201);
        httpMs.push(performance.now() - t);
      }
    });

    // (b) plain COPY of the same readings into the same table
    const copyMs: number[] = [];
    await part(`(b) plain COPY with psql, ${RUNS} runs`, async () => {
      for (let run = 0; run < RUNS; run++) {
        const { lot, session } = await newLot(db, fixture, `BENCH-COPY-${run}`, 'sample');
        const file = path.join(root, `copy-${run}.csv`);
        fs.writeFileSync(file, tableCsv(rs, lot.id, session.id, user.id, partType));
        copyMs.push(copyWithPsql(cluster, file));
        fs.rmSync(file);
      }
    });

    // (c) the same file into a screening session: recorded and placed into containers
    const screenMs: number[] = [];
    const containersPerRun: number[] = [];
    let lastCode = '';
    await part(`(c) screening import (record + place into ${SCREEN_CAPACITY}-part strips), ${RUNS} runs`, async () => {
      for (let run = 0; run < RUNS; run++) {
        const { lot, session } = await newLot(db, fixture, `BENCH-SCREEN-${run}`, 'screen');
        const t = performance.now();
        await importInto(lot.id, session.id);
        screenMs.push(performance.now() - t);
        const [c] = (await db.query(`SELECT count(*)::int AS n FROM container WHERE lot_id = $1`, [lot.id])) as { n: number }[];
        containersPerRun.push(c.n);
        log(`  run ${run + 1}: ${ms(screenMs[run])}, ${num(c.n)} containers`);
      }
      const [last] = (await db.query(`SELECT code FROM container ORDER BY ${containerCodeOrderSql('code')} DESC LIMIT 1`)) as { code: string }[];
      lastCode = last?.code ?? '';
    });

    // (d) summary of the 100 000-part lot (after five warm-up calls)
    const direct: number[] = [];
    const fetchOnly: number[] = [];
    const viaHttp: number[] = [];
    let n = 0;
    await part(`(d) lot summary, median of ${SUMMARY_RUNS} calls`, async () => {
      await db.query('ANALYZE measurement');
      for (let i = 0; i < 5; i++) await lotSummary(db, summaryLotId);
      for (let i = 0; i < SUMMARY_RUNS; i++) {
        const t = performance.now();
        await lotSummary(db, summaryLotId);
        direct.push(performance.now() - t);
      }
      for (let i = 0; i < SUMMARY_RUNS; i++) {
        const t = performance.now();
        await loadLotValues(db, summaryLotId);
        fetchOnly.push(performance.now() - t);
      }
      for (let i = 0; i < SUMMARY_RUNS; i++) {
        const t = performance.now();
        const res = await agent.get(`/api/lots/${summaryLotId}/summary`).expect(200);
        viaHttp.push(performance.now() - t);
        n = res.body.n;
      }
    });

    const imp = median(importMs);
    const copy = median(copyMs);
    const scr = median(screenMs);
    const phaseText = (
      [
        ['parsing', 'parse'],
        ['validating', 'validate'],
        ['writing', 'write'],
      ] as const
    )
      .map(([k, name]) => `${name} ${ms(median(phases[k] ?? [0]))}`)
      .join(', ');
    rows.push(
      {
        measure: `(a) tester import into a sampling session, in-process (${num(ROWS)} rows)`,
        result: `${ms(imp)} → **${num(rowsPerSecond(ROWS, imp))} rows/s** (${phaseText})`,
        target: '≥ 50 000 rows/s',
        met: rowsPerSecond(ROWS, imp) >= 50_000,
      },
      { measure: 'the same import over HTTP (multipart upload)', result: `${ms(median(httpMs))} → ${num(rowsPerSecond(ROWS, median(httpMs)))} rows/s`, target: '', met: null, detail: true },
      { measure: '(b) plain COPY of the same rows (psql \\copy)', result: `${ms(copy)} → ${num(rowsPerSecond(ROWS, copy))} rows/s`, target: '', met: null },
      { measure: 'ratio import / COPY', result: `**${(imp / copy).toFixed(2)}×**`, target: '≤ 3×', met: imp / copy <= 3 },
      {
        measure: `(c) screening import (record + place into containers), same ${num(ROWS)} rows`,
        result: `${ms(scr)} → ${num(rowsPerSecond(ROWS, scr))} rows/s; ${num(median(containersPerRun))} containers of ${SCREEN_CAPACITY} per run, last code of the day ${lastCode}`,
        target: '',
        met: null,
      },
      {
        measure: `(d) lot summary, n = ${num(n)} (GET /api/lots/:id/summary)`,
        result: `**${median(viaHttp).toFixed(1)} ms** over HTTP, ${median(direct).toFixed(1)} ms in-process; fetching the two columns ${median(fetchOnly).toFixed(1)} ms`,
        target: '< 150 ms',
        met: median(viaHttp) < 150,
      },
    );
    notes.push(
      `Import, COPY and screening figures are medians of ${RUNS} runs, the summary the median of ${SUMMARY_RUNS} calls after 5 warm-up calls; PostgreSQL with fsync off.`,
      `Runs (ms): import ${importMs.map((x) => x.toFixed(0)).join(', ')}; HTTP ${httpMs.map((x) => x.toFixed(0)).join(', ')}; COPY ${copyMs.map((x) => x.toFixed(0)).join(', ')}; screening ${screenMs.map((x) => x.toFixed(0)).join(', ')}; summary over HTTP ${viaHttp.map((x) => x.toFixed(0)).join(', ')}.`,
    );

    rows.push(
      ...(await optionalPart(
        '(e) 500 bin labels in one PDF',
        async () => {
          const labels = await benchBinLabels(500);
          return [{ measure: '(e) 500 bin labels in one PDF (100 × 50 mm roll)', result: `${ms(labels.ms)}, ${kB(labels.bytes)}`, target: '< 3 000 ms', met: labels.ms < 3000 }];
        },
        failures,
      )),
    );
    rows.push(
      ...(await optionalPart(
        '(f) matching',
        async () => {
          const m = await benchMatching();
          return [
            { measure: `(f) matching ${num(m.parts)} parts in stock into pairs`, result: `${ms(m.ms)}, ${num(m.sets)} pairs`, target: '< 300 ms', met: m.ms < 300 },
            { measure: 'first run after start (before JIT warm-up; scratch buffers not yet sized)', result: ms(m.firstMs), target: '', met: null, detail: true },
            {
              measure: 'reference library (test-only) on the same graph',
              result: `${ms(m.referenceMs)} on ${num(m.referenceParts)} parts; ours / reference ${m.ratio.toFixed(2)}; same number of pairs: ${m.sameSets ? 'yes' : 'NO'}`,
              target: '',
              met: null,
              detail: true,
            },
          ];
        },
        failures,
      )),
    );
    rows.push(...(await optionalPart('(g) client bundle', () => bundleRows(tables), failures)));
    rows.push(...(await optionalPart('(h) load', () => loadRows({ ds: db, cluster, env: clusterEnv(cluster), log }), failures)));
  } finally {
    await ds?.destroy();
    cluster.stop();
    clearTimeout(watchdog);
  }

  const cpus = os.cpus();
  const report: BenchReport = {
    machine: {
      cpuModel: cpus[0]?.model.trim() ?? 'unknown CPU',
      cpuCount: cpus.length,
      totalMemoryBytes: os.totalmem(),
      nodeVersion: process.versions.node,
      postgresVersion: pgVersion,
      loadStart,
      loadEnd: os.loadavg(),
      startedAt: startedAt.toISOString(),
      durationSeconds: (Date.now() - startedAt.getTime()) / 1000,
    },
    rows,
    tables,
    notes,
  };
  console.log(reportText(report));

  if (process.env.BENCH_NO_WRITE === '1') log('BENCH_NO_WRITE=1: docs/benchmarks.md left as it is');
  else if (ROWS !== STANDARD_ROWS) log(`BENCH_ROWS=${ROWS} is not the standard ${num(STANDARD_ROWS)}: docs/benchmarks.md left as it is`);
  else {
    fs.writeFileSync(DOC, replaceBenchSection(fs.readFileSync(DOC, 'utf8'), reportMarkdown(report)));
    log(`wrote the figures into ${path.relative(process.cwd(), DOC)}`);
  }
  if (failures.length) {
    log(`failed parts: ${failures.join(', ')}`);
    process.exitCode = 1;
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
