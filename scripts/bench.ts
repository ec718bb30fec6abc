/**
 * `npm run bench`: measures the Bench's bulk paths on a throwaway PostgreSQL cluster (port 54350,
 * folder .data/bench, fsync off like the test cluster):
 *   (a) the tester-CSV import of 100 000 rows (parse + validate + normalise + multi-row INSERT …
 *       unnest in one transaction), rows/s, in-process and over HTTP;
 *   (b) a plain COPY of the same 100 000 readings into the same table with psql's \copy, and the
 *       ratio import / COPY;
 *   (c) GET /api/lots/:id/summary of the 100 000-part lot, median of several runs, ms;
 *   (d) 500 bin labels rendered into one PDF (ms, bytes).
 * Targets: import ≥ 50 000 rows/s, within 3× of COPY, summary < 150 ms. Prints figures only; it
 * asserts nothing.
 */
import 'reflect-metadata';
import { benchBinLabels } from './bench-labels.ts';
import { benchMatching } from './bench-matching.ts';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { createApp } from '../server/app.ts';
import { readConfig } from '../server/config.ts';
import { createDataSource } from '../server/data-source.ts';
import { hashPassword } from '../server/modules/auth/password.ts';
import { PartType } from '../server/modules/catalog/part-type.entity.ts';
import { GainBinRow, GainBinSchemeVersion } from '../server/modules/catalog/gain-bin-scheme.entity.ts';
import { Lot } from '../server/modules/lots/lot.entity.ts';
import { importMeasurements } from '../server/modules/measurements/measurement-import.service.ts';
import { MeasurementSession } from '../server/modules/measurements/measurement-session.entity.ts';
import { loadLotValues, lotSummary } from '../server/modules/measurements/lot-summary.service.ts';
import { Supplier } from '../server/modules/suppliers/supplier.entity.ts';
import { User } from '../server/modules/users/user.entity.ts';
import { normaliseHfe, normaliseVbeMv } from '../shared/domain/normalise/index.ts';
import { clusterEnv, startCluster, type RunningCluster } from './lib/pg-cluster.ts';

const ROWS = Number(process.env.BENCH_ROWS ?? 100_000);
const RUNS = 3;
const SUMMARY_RUNS = 15;
const AMBIENT_C = 27;
const PASSWORD = 'bench-password-123';
const root = path.resolve('.data/bench');
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

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

async function newLot(ds: DataSource, f: { supplier: Supplier; part: PartType; user: User; schemeId: number }, code: string) {
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
    ds.getRepository(MeasurementSession).create({ lotId: lot.id, instrument: 'Bench tester', ambientC: AMBIENT_C, mode: 'screen', operatorId: f.user.id, closedAt: null }),
  );
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

async function main() {
  fs.mkdirSync(root, { recursive: true });
  const cluster = await startCluster({ dataDir: path.join(root, 'postgres'), port: Number(process.env.BINWRIGHT_BENCH_DB_PORT ?? 54350), database: 'binwright_bench', throwaway: true, log });
  let ds: DataSource | null = null;
  try {
    Object.assign(process.env, clusterEnv(cluster), { BINWRIGHT_DATA_DIR: path.join(root, 'files'), NODE_ENV: 'production' });
    ds = createDataSource(readConfig());
    await ds.initialize();
    await ds.runMigrations({ transaction: 'each' });

    const user = await ds.getRepository(User).save(
      ds.getRepository(User).create({ email: 'bench@example.test', name: 'Bench Inspector', role: 'inspector', passwordHash: await hashPassword(PASSWORD), active: true }),
    );
    const supplier = await ds.getRepository(Supplier).save(ds.getRepository(Supplier).create({ code: 'BENCH', name: 'Bench Distributor (invented)', approval: 'approved', notes: null }));
    const part = await ds.getRepository(PartType).save(
      ds.getRepository(PartType).create({
        partNumber: 'HPA-BENCH-NPN',
        description: 'Invented small-signal NPN for the benchmark',
        polarity: 'NPN',
        packageName: 'TO-92',
        hfeIcMa: 2,
        hfeVceV: 5,
        vbeIcMa: 2,
        hfeMin: 110,
        hfeMax: 320,
        vbeMinMv: 580,
        vbeMaxMv: 700,
        vbeTcMvPerC: -2,
        hfeTcPctPerC: 0.5,
        msl: 'not-classified',
        esdHbmClass: '1B',
        samplingMethod: 'attribute',
        inspectionLevel: 'II',
        aql: 1.0,
        matchHfePct: 5,
        matchVbeMv: 2,
        active: true,
      }),
    );
    const scheme = await ds.getRepository(GainBinSchemeVersion).save(ds.getRepository(GainBinSchemeVersion).create({ partTypeId: part.id, version: 1, note: null, lockedAt: null, createdBy: null }));
    await ds.getRepository(GainBinRow).save(
      [
        ['A', 110, 180],
        ['B', 180, 250],
        ['C', 250, 320],
      ].map(([code, lo, hi], i) => ds!.getRepository(GainBinRow).create({ schemeId: scheme.id, position: i + 1, code: String(code), label: `Gain ${code}`, hfeMin: Number(lo), hfeMax: Number(hi), vbeMinMv: null, vbeMaxMv: null, gapBeforeIntended: false })),
    );
    const fixture = { supplier, part, user, schemeId: scheme.id };
    const actor = { id: user.id, email: user.email, name: user.name, role: user.role };

    log(`Generating ${ROWS.toLocaleString('en')} readings…`);
    const rs = readings(ROWS);
    const csv = testerCsv(rs);
    log(`Tester file: ${(csv.length / 1024 / 1024).toFixed(1)} MB`);
    const mapping = { position: 'Position', hfe: 'hFE', vbe: 'Vbe (V)' };
    const units = { vbe: 'V' as const, vceSat: 'mV' as const, leakage: 'nA' as const };

    // Warm-up on a small file so JIT and connection set-up are not in the first figure.
    {
      const { lot, session } = await newLot(ds, fixture, 'BENCH-WARM');
      await importMeasurements(ds, actor, lot.id, { csv: testerCsv(rs.slice(0, 2000)), sessionId: session.id, mapping, units });
    }

    // (a) in-process import
    const importMs: number[] = [];
    const phases: Record<string, number[]> = {};
    let summaryLotId = 0;
    for (let run = 0; run < RUNS; run++) {
      const { lot, session } = await newLot(ds, fixture, `BENCH-IMP-${run}`);
      const t = performance.now();
      // Phase times from the import's own progress reports: parse, validate, write (+ commit).
      let phase = 'start';
      let since = t;
      const seen: Record<string, number> = {};
      const res = await importMeasurements(ds, actor, lot.id, { csv, sessionId: session.id, mapping, units }, (p) => {
        if (p.phase === phase) return;
        const now = performance.now();
        seen[phase] = (seen[phase] ?? 0) + (now - since);
        phase = p.phase;
        since = now;
      });
      importMs.push(performance.now() - t);
      for (const [k, v] of Object.entries(seen)) (phases[k] ??= []).push(v);
      if (res.imported !== ROWS) throw new Error(`imported ${res.imported}`);
      summaryLotId = lot.id;
    }

    // (a') over HTTP: multipart upload, multer, the same service
    const app = createApp({ dataSource: ds });
    const agent = request.agent(app);
    const csrf = (await agent.get('/api/auth/csrf')).body.csrfToken as string;
    await agent.post('/api/auth/login').set('x-csrf-token', csrf).send({ email: user.email, password: PASSWORD }).expect(200);
    const httpMs: number[] = [];
    for (let run = 0; run < RUNS; run++) {
      const { lot, session } = await newLot(ds, fixture, `BENCH-HTTP-${run}`);
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

    // (b) plain COPY of the same readings into the same table
    const copyMs: number[] = [];
    for (let run = 0; run < RUNS; run++) {
      const { lot, session } = await newLot(ds, fixture, `BENCH-COPY-${run}`);
      const file = path.join(root, `copy-${run}.csv`);
      fs.writeFileSync(file, tableCsv(rs, lot.id, session.id, user.id, part));
      copyMs.push(copyWithPsql(cluster, file));
      fs.rmSync(file);
    }

    // (c) summary of the 100 000-part lot (after three warm-up calls)
    await ds.query('ANALYZE measurement');
    for (let i = 0; i < 5; i++) await lotSummary(ds, summaryLotId);
    const direct: number[] = [];
    for (let i = 0; i < SUMMARY_RUNS; i++) {
      const t = performance.now();
      await lotSummary(ds, summaryLotId);
      direct.push(performance.now() - t);
    }
    const fetchOnly: number[] = [];
    for (let i = 0; i < SUMMARY_RUNS; i++) {
      const t = performance.now();
      await loadLotValues(ds, summaryLotId);
      fetchOnly.push(performance.now() - t);
    }
    const viaHttp: number[] = [];
    let n = 0;
    for (let i = 0; i < SUMMARY_RUNS; i++) {
      const t = performance.now();
      const res = await agent.get(`/api/lots/${summaryLotId}/summary`).expect(200);
      viaHttp.push(performance.now() - t);
      n = res.body.n;
    }

    const labels = await benchBinLabels(500);
    const matching = await benchMatching();

    const imp = median(importMs);
    const copy = median(copyMs);
    const rowsPerS = (ms: number) => Math.round((ROWS / ms) * 1000);
    const lines = [
      '',
      `Bench results (${ROWS.toLocaleString('en')} rows, median of ${RUNS} runs; summary median of ${SUMMARY_RUNS}; PostgreSQL ${cluster.port}, fsync off)`,
      `  (a) import, in-process     ${imp.toFixed(0).padStart(6)} ms  ${rowsPerS(imp).toLocaleString('en').padStart(9)} rows/s   target ≥ 50,000  ${rowsPerS(imp) >= 50_000 ? 'met' : 'MISSED'}`,
      `      phases (median ms): ${['parsing', 'validating', 'writing'].map((k) => `${k} ${median(phases[k] ?? [0]).toFixed(0)}`).join(', ')}`,
      `      import, over HTTP      ${median(httpMs).toFixed(0).padStart(6)} ms  ${rowsPerS(median(httpMs)).toLocaleString('en').padStart(9)} rows/s`,
      `  (b) plain COPY (psql)      ${copy.toFixed(0).padStart(6)} ms  ${rowsPerS(copy).toLocaleString('en').padStart(9)} rows/s`,
      `      ratio import / COPY    ${(imp / copy).toFixed(2)}×                      target ≤ 3×  ${imp / copy <= 3 ? 'met' : 'MISSED'}`,
      `  (c) summary, n = ${n.toLocaleString('en')}  ${median(viaHttp).toFixed(1).padStart(6)} ms over HTTP, ${median(direct).toFixed(1)} ms in-process   target < 150 ms  ${median(viaHttp) < 150 ? 'met' : 'MISSED'}`,
      `      of which fetching the two columns: ${median(fetchOnly).toFixed(1)} ms`,
      `  (d) bin labels, 500 in one PDF  ${labels.ms.toFixed(0).padStart(6)} ms  ${(labels.bytes / 1024).toFixed(0)} kB   target < 3,000 ms  ${labels.ms < 3000 ? 'met' : 'MISSED'}`,
      `  (e) matching, ${matching.parts.toLocaleString('en')} parts in stock (pairs)  ${matching.ms.toFixed(0).padStart(6)} ms, ${matching.sets} pairs   target < 300 ms  ${matching.ms < 300 ? 'met' : 'MISSED'}`,
      `      reference library (test-only) on ${matching.referenceParts.toLocaleString('en')} parts: ${matching.referenceMs.toFixed(0)} ms; ratio ours/reference ${matching.ratio.toFixed(2)}; same number of sets: ${matching.sameSets}`,
      `  runs (ms): import ${importMs.map((x) => x.toFixed(0)).join(', ')}; http ${httpMs.map((x) => x.toFixed(0)).join(', ')}; copy ${copyMs.map((x) => x.toFixed(0)).join(', ')}; summary ${viaHttp.map((x) => x.toFixed(0)).join(', ')}`,
      '',
    ];
    console.log(lines.join('\n'));
  } finally {
    await ds?.destroy();
    cluster.stop();
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
