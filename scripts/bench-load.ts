/**
 * Load figure for `npm run bench`: the server in its own process on loopback, driven by
 * autocannon from this process —
 *   (1) 50 connections recording measurements: POST /api/lots/:id/measurements on one lot with
 *       an open session, every request a new position, 50 inspectors' sessions;
 *   (2) 50 connections reading the lots list: GET /api/lots (first page of 25, 400 lots);
 *   (3) both at once, the dock's everyday mix;
 *   (4) the 50 recording connections paced to a steady 100 requests/s: latency at a working load.
 * Each phase is bounded in count (writers: `writes` requests) and in time (`maxSeconds`).
 * "Nothing lost": every position answered 2xx is in the database exactly once, and the rows
 * written equal the 2xx answers (a phase cut by its time limit may leave up to one in-flight
 * request per connection written but unanswered; that count is reported, not hidden).
 * Targets on 2 cores: ≥ 1 000 measurements/s, p99 < 50 ms, no errors. Prints figures only.
 *
 * Standalone: `npx tsx --tsconfig tsconfig.server.json scripts/bench-load.ts` starts its own
 * throwaway cluster (BINWRIGHT_BENCH_LOAD_DB_PORT, default 54351, folder .data/bench-load).
 */
import 'reflect-metadata';
import fs from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import autocannon, { type AutocannonResult } from 'autocannon';
import type { DataSource } from 'typeorm';
import { readConfig } from '../server/config.ts';
import { createDataSource } from '../server/data-source.ts';
import { hashPassword } from '../server/modules/auth/password.ts';
import { PartType } from '../server/modules/catalog/part-type.entity.ts';
import { Lot } from '../server/modules/lots/lot.entity.ts';
import { MeasurementSession } from '../server/modules/measurements/measurement-session.entity.ts';
import { Supplier } from '../server/modules/suppliers/supplier.entity.ts';
import { User } from '../server/modules/users/user.entity.ts';
import { startAppProcess, type AppProcess } from './lib/app-process.ts';
import { clusterEnv, startCluster } from './lib/pg-cluster.ts';

const PASSWORD = 'bench-load-password';

export interface LoadOptions {
  /** An initialised, migrated DataSource of the database the server process will use. */
  ds: DataSource;
  /** Environment for the server process (database); defaults to this process's environment. */
  env?: Record<string, string>;
  connections?: number;
  /** Measurements requested per measuring phase (the count bound). */
  writes?: number;
  /** Time bound of each phase, seconds. */
  maxSeconds?: number;
  /** Length of the reading-only phase, seconds. */
  readSeconds?: number;
  log?: (line: string) => void;
  /** Requests per second of the paced phase (default 100). */
  pacedRate?: number;
  /** Extra Node flags for the server process (e.g. --cpu-prof while tuning). */
  nodeArgs?: string[];
}

export interface PhaseFigures {
  requests: number;
  ok: number;
  perSecond: number;
  p50Ms: number;
  p99Ms: number;
  maxMs: number;
  /** Connection errors + timeouts + non-2xx answers. */
  errors: number;
  statusCodes: Record<string, number>;
  seconds: number;
  /** CPU time per successful request: the server process and the PostgreSQL cluster, ms. */
  serverCpuMs: number;
  postgresCpuMs: number;
}

export interface WriteFigures extends PhaseFigures {
  rowsInDatabase: number;
  /** Positions answered 2xx that are missing from the database (must be 0). */
  lost: number;
  /** Positions stored more than once (must be 0). */
  duplicated: number;
  /** Rows written whose answer never arrived (only when a phase is cut by its time limit). */
  unanswered: number;
}

export interface LoadReport {
  connections: number;
  writersAlone: WriteFigures;
  readersAlone: PhaseFigures;
  mixed: { writers: WriteFigures; readers: PhaseFigures };
  /** The same 50 recording connections paced to a steady rate well below saturation: latency at a working load. */
  paced: WriteFigures & { ratePerSecond: number };
  /** Every measurement answered 2xx is in the database exactly once, in every phase, and no request failed. */
  nothingLost: boolean;
}

interface Agent {
  cookie: string;
  csrf: string;
}

function cookieOf(res: Response): string {
  const set = res.headers.getSetCookie();
  const sid = set.find((c) => c.startsWith('bw.sid='));
  if (!sid) throw new Error(`no session cookie in ${res.status} answer`);
  return sid.split(';')[0];
}

/** Signs in over HTTP like the client does: CSRF token, then the login that regenerates the session. */
async function signIn(baseUrl: string, email: string): Promise<Agent> {
  const first = await fetch(`${baseUrl}/api/auth/csrf`);
  const { csrfToken } = (await first.json()) as { csrfToken: string };
  const res = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie: cookieOf(first), 'x-csrf-token': csrfToken },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}: ${await res.text()}`);
  return { cookie: cookieOf(res), csrf: csrfToken };
}

async function inBatches<T, R>(items: T[], size: number, fn: (t: T) => Promise<R>): Promise<R[]> {
  const out: R[] = [];
  for (let i = 0; i < items.length; i += size) out.push(...(await Promise.all(items.slice(i, i + size).map(fn))));
  return out;
}

interface Fixture {
  supplier: Supplier;
  part: PartType;
  writers: User[];
  readers: User[];
}

async function makeFixture(ds: DataSource, connections: number, listLots: number): Promise<Fixture> {
  const tag = Date.now().toString(36);
  const hash = await hashPassword(PASSWORD);
  const users = ds.getRepository(User);
  const mk = (role: 'inspector' | 'buyer', i: number) =>
    users.create({ email: `load-${role}-${tag}-${i}@example.test`, name: `Load ${role} ${i}`, role, passwordHash: hash, active: true });
  const writers = await users.save(Array.from({ length: connections }, (_, i) => mk('inspector', i)));
  const readers = await users.save(Array.from({ length: connections }, (_, i) => mk('buyer', i)));
  const supplier = await ds.getRepository(Supplier).save(
    ds.getRepository(Supplier).create({ code: `LOAD-${tag}`.slice(0, 20), name: 'Load Distributor (invented)', approval: 'approved', notes: null }),
  );
  const part = await ds.getRepository(PartType).save(
    ds.getRepository(PartType).create({
      partNumber: `HPA-LOAD-${tag}`,
      description: 'Invented small-signal NPN for the load bench',
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
  const f = { supplier, part, writers, readers };
  // The lots list shows a realistic first page out of a few hundred lots.
  const lots = ds.getRepository(Lot);
  await lots.save(Array.from({ length: listLots }, (_, i) => lots.create(lotFields(f, `L-LOAD-${tag}-${i}`, 2000))));
  return f;
}

function lotFields(f: Pick<Fixture, 'supplier' | 'part' | 'writers'>, code: string, quantity: number): Partial<Lot> {
  return {
    code,
    supplierId: f.supplier.id,
    partTypeId: f.part.id,
    quantity,
    status: 'received',
    receivedBy: f.writers[0].id,
    dryBag: 'not-applicable',
    binSchemeId: null,
    purchaseOrder: 'PO-LOAD',
    supplierPartNumber: null,
    supplierLot: 'SL-LOAD',
    dateCode: '2548',
    countryOfOrigin: null,
    msl: null,
    bagOpenedAt: null,
    labelRaw: null,
    labelFingerprint: null,
    labelElements: null,
    overrideBy: null,
    overrideReason: null,
  };
}

/** A lot with an open sampling session, ready for measurements. */
async function measuringLot(ds: DataSource, f: Fixture, code: string, quantity: number): Promise<{ lotId: number; sessionId: number }> {
  const lot = await ds.getRepository(Lot).save(ds.getRepository(Lot).create(lotFields(f, code, quantity)));
  const session = await ds.getRepository(MeasurementSession).save(
    ds.getRepository(MeasurementSession).create({ lotId: lot.id, instrument: 'Load tester', ambientC: 25, mode: 'sample', operatorId: f.writers[0].id, closedAt: null }),
  );
  return { lotId: lot.id, sessionId: session.id };
}

/** CPU seconds (user + system) used so far by the given processes, from /proc (Linux). */
function cpuSeconds(pids: number[]): number {
  let ticks = 0;
  for (const pid of pids) {
    try {
      const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      ticks += Number(fields[11]) + Number(fields[12]); // utime, stime (fields 14 and 15 of proc(5))
    } catch {
      // the process ended
    }
  }
  return ticks / 100; // USER_HZ is 100 on Linux
}

/** The postmaster and its children (backends, walwriter …) of the cluster behind `ds`. */
async function postgresPids(ds: DataSource): Promise<() => number[]> {
  const [{ pid }] = (await ds.query('SELECT pg_backend_pid() AS pid')) as { pid: number }[];
  const ppidOf = (p: number) => {
    try {
      const stat = fs.readFileSync(`/proc/${p}/stat`, 'utf8');
      return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
    } catch {
      return -1;
    }
  };
  const postmaster = ppidOf(pid);
  return () => [postmaster, ...fs.readdirSync('/proc').filter((d) => /^\d+$/.test(d)).map(Number).filter((p) => ppidOf(p) === postmaster)];
}

interface CpuMeter {
  start(): void;
  /** CPU ms per request of the server and of PostgreSQL since start(). */
  stop(requests: number): { serverCpuMs: number; postgresCpuMs: number };
}

function cpuMeter(serverPid: number, pgPids: () => number[]): CpuMeter {
  let s0 = 0;
  let p0 = 0;
  let pids: number[] = [];
  return {
    start() {
      pids = pgPids();
      s0 = cpuSeconds([serverPid]);
      p0 = cpuSeconds(pids);
    },
    stop(requests) {
      // Backends that ended during the phase are not counted; the pool keeps its connections open.
      const per = (s: number) => Math.round(((s * 1000) / Math.max(1, requests)) * 100) / 100;
      return { serverCpuMs: per(cpuSeconds([serverPid]) - s0), postgresCpuMs: per(cpuSeconds(pids) - p0) };
    },
  };
}

function figures(r: AutocannonResult, ok: number, cpu: { serverCpuMs: number; postgresCpuMs: number }): PhaseFigures {
  const statusCodes: Record<string, number> = {};
  for (const [code, s] of Object.entries(r.statusCodeStats ?? {})) statusCodes[code] = s.count;
  const requests = Object.values(statusCodes).reduce((a, b) => a + b, 0);
  return {
    requests,
    ok,
    perSecond: Math.round(ok / r.duration),
    p50Ms: r.latency.p50,
    p99Ms: r.latency.p99,
    maxMs: r.latency.max,
    errors: r.errors + r.timeouts + r.non2xx,
    statusCodes,
    seconds: r.duration,
    ...cpu,
  };
}

function runFor<T extends PromiseLike<AutocannonResult> & { stop(): void }>(instance: T, maxSeconds: number): Promise<AutocannonResult> {
  const timer = setTimeout(() => instance.stop(), maxSeconds * 1000);
  return Promise.resolve(instance).finally(() => clearTimeout(timer));
}

/** Starts the measuring connections; resolves with the figures once they finish or are cut. */
function writeLoad(baseUrl: string, agents: Agent[], lot: { lotId: number; sessionId: number }, o: { connections: number; amount: number; maxSeconds: number; overallRate?: number }) {
  let next = 0;
  let turn = 0;
  const answered: number[] = [];
  const instance = autocannon({
    url: baseUrl,
    connections: o.connections,
    amount: o.amount,
    ...(o.overallRate ? { overallRate: o.overallRate } : {}),
    timeout: 10,
    requests: [
      {
        method: 'POST',
        path: `/api/lots/${lot.lotId}/measurements`,
        setupRequest: (req) => {
          const position = ++next;
          const a = agents[turn++ % agents.length];
          // Invented readings spread over the gain range; deterministic per position.
          const hfe = 150 + ((position * 37) % 140) + 0.5;
          const vbe = 640 + ((position * 13) % 25) / 2;
          return {
            ...req,
            headers: { ...req.headers, 'content-type': 'application/json', cookie: a.cookie, 'x-csrf-token': a.csrf },
            body: JSON.stringify({ sessionId: lot.sessionId, position, hfe, vbe, vbeUnit: 'mV' }),
          };
        },
        onResponse: (status, body) => {
          if (status === 201) answered.push((JSON.parse(body) as { position: number }).position);
        },
      },
    ],
  });
  return { instance, done: runFor(instance, o.maxSeconds), answered };
}

function readLoad(baseUrl: string, agents: Agent[], o: { connections: number; seconds: number }) {
  let turn = 0;
  const instance = autocannon({
    url: baseUrl,
    connections: o.connections,
    duration: o.seconds,
    timeout: 10,
    requests: [
      {
        method: 'GET',
        path: '/api/lots?page=1&pageSize=25&sort=receivedAt&dir=desc',
        setupRequest: (req) => ({ ...req, headers: { ...req.headers, cookie: agents[turn++ % agents.length].cookie } }),
      },
    ],
  });
  return { instance, done: runFor(instance, o.seconds + 5) };
}

async function accountWrites(ds: DataSource, lotId: number, r: AutocannonResult, answered: number[], cpu: { serverCpuMs: number; postgresCpuMs: number }): Promise<WriteFigures> {
  const rows = (await ds.query('SELECT position, count(*)::int AS n FROM measurement WHERE lot_id = $1 GROUP BY position', [lotId])) as { position: number; n: number }[];
  const stored = new Map(rows.map((x) => [x.position, x.n]));
  const rowsInDatabase = rows.reduce((a, x) => a + x.n, 0);
  const lost = answered.filter((p) => !stored.has(p)).length;
  const duplicated = rows.filter((x) => x.n > 1).length;
  return { ...figures(r, answered.length, cpu), rowsInDatabase, lost, duplicated, unanswered: rowsInDatabase - (answered.length - lost) };
}

/** Runs the three phases against a server process on the given database. */
export async function benchLoad(opts: LoadOptions): Promise<LoadReport> {
  const { ds } = opts;
  const connections = opts.connections ?? 50;
  const writes = opts.writes ?? 6_000;
  const maxSeconds = opts.maxSeconds ?? 30;
  const readSeconds = opts.readSeconds ?? 8;
  const log = opts.log ?? ((l: string) => console.log(`[bench-load] ${l}`));

  const f = await makeFixture(ds, connections, 400);
  const app: AppProcess = await startAppProcess(opts.env ?? {}, { nodeArgs: opts.nodeArgs });
  try {
    log(`Server process ${app.child.pid} on ${app.baseUrl}; signing in ${connections} inspectors and ${connections} buyers…`);
    const writers = await inBatches(f.writers, 4, (u) => signIn(app.baseUrl, u.email));
    const readers = await inBatches(f.readers, 4, (u) => signIn(app.baseUrl, u.email));

    // Warm-up: JIT, pool connections, plan caches.
    const warmLot = await measuringLot(ds, f, `L-LOAD-WARM-${Date.now()}`, 5_000);
    await writeLoad(app.baseUrl, writers, warmLot, { connections: 10, amount: 1_500, maxSeconds: 15 }).done;
    await readLoad(app.baseUrl, readers, { connections: 10, seconds: 2 }).done;

    log(`Phase 1: ${connections} connections recording ${writes} measurements…`);
    const meter = cpuMeter(app.child.pid!, await postgresPids(ds));
    const lot1 = await measuringLot(ds, f, `L-LOAD-W-${Date.now()}`, writes + 1000);
    meter.start();
    const w1 = writeLoad(app.baseUrl, writers, lot1, { connections, amount: writes, maxSeconds });
    const w1Result = await w1.done;
    const writersAlone = await accountWrites(ds, lot1.lotId, w1Result, w1.answered, meter.stop(w1.answered.length));

    log(`Phase 2: ${connections} connections reading the lots list for ${readSeconds} s…`);
    meter.start();
    const r2Result = await readLoad(app.baseUrl, readers, { connections, seconds: readSeconds }).done;
    const readersAlone = figures(r2Result, r2Result['2xx'], meter.stop(r2Result['2xx']));

    log(`Phase 3: both at once…`);
    const lot3 = await measuringLot(ds, f, `L-LOAD-M-${Date.now()}`, writes + 1000);
    meter.start();
    const w3 = writeLoad(app.baseUrl, writers, lot3, { connections, amount: writes, maxSeconds });
    const r3 = readLoad(app.baseUrl, readers, { connections, seconds: maxSeconds });
    const w3Result = await w3.done;
    r3.instance.stop();
    const r3Result = await r3.done;
    // In the mixed phase the CPU is shared between both kinds of request: reported per request of either kind.
    const mixedCpu = meter.stop(w3.answered.length + r3Result['2xx']);
    const mixedWriters = await accountWrites(ds, lot3.lotId, w3Result, w3.answered, mixedCpu);
    const mixedReaders = figures(r3Result, r3Result['2xx'], mixedCpu);

    // Rows written for requests still in flight when a phase is cut by its time limit are not
    // losses (they are stored; their answer was not awaited): reported as `unanswered`.
    const rate = opts.pacedRate ?? 100;
    const pacedAmount = rate * 8;
    log(`Phase 4: ${connections} connections recording at a steady ${rate}/s for ${pacedAmount / rate} s…`);
    const lot4 = await measuringLot(ds, f, `L-LOAD-P-${Date.now()}`, pacedAmount + 1000);
    meter.start();
    const w4 = writeLoad(app.baseUrl, writers, lot4, { connections, amount: pacedAmount, maxSeconds: 30, overallRate: rate });
    const w4Result = await w4.done;
    const paced = { ...(await accountWrites(ds, lot4.lotId, w4Result, w4.answered, meter.stop(w4.answered.length))), ratePerSecond: rate };

    const clean = (w: WriteFigures) => w.lost === 0 && w.duplicated === 0 && w.errors === 0;
    return {
      connections,
      writersAlone,
      readersAlone,
      mixed: { writers: mixedWriters, readers: mixedReaders },
      paced,
      nothingLost: clean(writersAlone) && clean(mixedWriters) && clean(paced),
    };
  } finally {
    await app.stop('SIGTERM');
  }
}

const met = (ok: boolean) => (ok ? 'met' : 'MISSED');

/** The report as printed lines. */
export function formatLoadReport(r: LoadReport): string[] {
  const cpu = (x: PhaseFigures) => `CPU/request: server ${x.serverCpuMs} ms, PostgreSQL ${x.postgresCpuMs} ms`;
  const w = (x: WriteFigures) =>
    `${x.perSecond.toLocaleString('en').padStart(6)} measurements/s  p50 ${x.p50Ms} ms  p99 ${x.p99Ms} ms  max ${x.maxMs} ms  errors ${x.errors}  ${cpu(x)}\n` +
    `                       rows ${x.rowsInDatabase} = 2xx ${x.ok}${x.unanswered ? ` (+${x.unanswered} in flight at the cut)` : ''}, lost ${x.lost}, duplicated ${x.duplicated}`;
  const rd = (x: PhaseFigures) => `${x.perSecond.toLocaleString('en').padStart(6)} lists/s         p50 ${x.p50Ms} ms  p99 ${x.p99Ms} ms  max ${x.maxMs} ms  errors ${x.errors}  ${cpu(x)}`;
  return [
    `  (e) load, ${r.connections} connections each, server in its own process on loopback`,
    `      recording alone  ${w(r.writersAlone)}`,
    `                       target ≥ 1,000/s ${met(r.writersAlone.perSecond >= 1000)}, p99 < 50 ms ${met(r.writersAlone.p99Ms < 50)}`,
    `      lots list alone  ${rd(r.readersAlone)}`,
    `      both at once     ${w(r.mixed.writers)}`,
    `                       ${rd(r.mixed.readers)}`,
    `      paced ${String(r.paced.ratePerSecond).padStart(4)}/s      ${w(r.paced)}`,
    `      nothing lost: ${r.nothingLost ? 'yes' : 'NO'}`,
  ];
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const root = path.resolve('.data/bench-load');
  const cluster = await startCluster({
    dataDir: path.join(root, 'postgres'),
    port: Number(process.env.BINWRIGHT_BENCH_LOAD_DB_PORT ?? 54351),
    database: 'binwright_bench_load',
    throwaway: true,
    log: (l) => console.log(`[bench-load] ${l}`),
  });
  let ds: DataSource | null = null;
  try {
    Object.assign(process.env, clusterEnv(cluster), { BINWRIGHT_DATA_DIR: path.join(root, 'files'), NODE_ENV: 'production' });
    ds = createDataSource(readConfig());
    await ds.initialize();
    await ds.runMigrations({ transaction: 'each' });
    const report = await benchLoad({
      ds,
      writes: Number(process.env.BENCH_LOAD_WRITES ?? 6_000),
      connections: Number(process.env.BENCH_LOAD_CONNECTIONS ?? 50),
    });
    console.log(['', ...formatLoadReport(report), ''].join('\n'));
    if (process.env.BENCH_LOAD_JSON) console.log(JSON.stringify(report, null, 2));
  } finally {
    await ds?.destroy();
    cluster.stop();
  }
}
