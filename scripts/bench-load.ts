/**
 * Load figure for `npm run bench`: the server in its own process on loopback, driven from this
 * process (autocannon for phases 1–3) —
 *   (1) 50 connections recording measurements: POST /api/lots/:id/measurements on one lot with
 *       an open session, every request a new position, 50 inspectors' sessions;
 *   (2) 50 connections reading the lots list: GET /api/lots (first page of 25, 400 lots);
 *   (3) both at once, the dock's everyday mix;
 *   (4) recording paced at a steady 100 requests/s (latency at a working load), and
 *   (5) recording paced at the target's 1 000 requests/s (the p99 of the target).
 * The paced phases send each request at its planned time, evenly spaced, over up to 50 kept-alive
 * connections, whether or not earlier answers have come (an open loop), and measure each latency
 * from the planned time (scripts/lib/paced-client.ts, prebuilt requests on raw sockets, so the
 * load generator takes as little as it can of the two cores it shares with the server). autocannon's own rate limit is not used for them: it sends each
 * connection's share of a second in a burst at the start of the second and then adds synthetic
 * samples for the burst's waits (coordinated-omission correction at a 1 ms interval), which
 * measured the burst, not the server (it reported a p50 of 55–130 ms at 100/s where the server
 * answers in about 5 ms).
 * In the closed-loop phases (1–3) each connection sends its next request when its answer came,
 * so the mean latency is connections ÷ throughput (Little's law): 50 ms at 1 000/s with 50
 * connections. Their latencies measure queueing at saturation; phase 5 measures the target's.
 * Before each phase its users' sessions are read once (touchSessions), so it starts with them in
 * the server's caches, as in steady use.
 * Each phase is bounded in count (writers: `writes` requests) and in time (`maxSeconds`).
 * "Nothing lost": every position answered 2xx is in the database exactly once, and the rows
 * written equal the 2xx answers (a phase cut by its time limit may leave up to one in-flight
 * request per connection written but unanswered; that count is reported, not hidden).
 * Targets on 2 cores: ≥ 1 000 measurements/s, p99 < 50 ms, no errors. Prints figures only.
 *
 * `benchLoad()` without a DataSource (and the standalone run, `npx tsx --tsconfig
 * tsconfig.server.json scripts/bench-load.ts`) starts its own throwaway cluster on
 * BINWRIGHT_BENCH_LOAD_DB_PORT (default 54351) in BINWRIGHT_BENCH_LOAD_DIR (default
 * .data/bench-load); the server process listens on a free port.
 */
import 'reflect-metadata';
import fs from 'node:fs';
import os from 'node:os';
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
import { inventedBenchNpn } from './lib/bench-fixtures.ts';
import { pacedLoad } from './lib/paced-client.ts';
import { clusterEnv, startCluster } from './lib/pg-cluster.ts';

const PASSWORD = 'bench-load-password';

export interface LoadOptions {
  /**
   * An initialised, migrated DataSource of the database the server process will use. Without
   * it, a throwaway cluster is started (and stopped) for the run (see the file comment).
   */
  ds?: DataSource;
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
  /** Requests per second of the phase paced at the target (default 1 000). */
  targetRate?: number;
  /** Length of each paced phase, seconds (default 8). */
  pacedSeconds?: number;
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
  /** CPU time per successful request of this process (autocannon, the load generator), ms. */
  loadGeneratorCpuMs: number;
}

type CpuFigures = Pick<PhaseFigures, 'serverCpuMs' | 'postgresCpuMs' | 'loadGeneratorCpuMs'>;

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
  /** The machine: CPUs and load average (1, 5, 15 min) before and after the run; others' work shows here. */
  machine: { cpus: number; loadBefore: number[]; loadAfter: number[] };
  writersAlone: WriteFigures;
  readersAlone: PhaseFigures;
  mixed: { writers: WriteFigures; readers: PhaseFigures };
  /** Recording paced to a steady rate well below saturation (open loop): latency at a working load. */
  paced: WriteFigures & { ratePerSecond: number };
  /** Recording paced at the target rate (open loop): the p99 the target asks for. */
  atTarget: WriteFigures & { ratePerSecond: number };
  /** Every measurement answered 2xx is in the database exactly once, in every phase, and no request failed. */
  nothingLost: boolean;
  /**
   * The issue's targets on this machine: ≥ 1 000 measurements/s recorded by 50 connections
   * (phase 1), and p99 < 50 ms with every request answered 201 at a steady 1 000/s (phase 5).
   */
  targets: { throughput: boolean; p99: boolean };
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

/**
 * One GET /api/auth/me per user, a few at a time: the server reads each session and user again
 * into its caches (2 s, see authCacheMs in server/app.ts). Run before each phase, so that a phase
 * starts as a dock in steady use does — not with every user's first request of the phase going
 * the full way at once because the previous phase used other users for longer than the caches
 * keep them (that cold start is measured on its own in docs/scaling.md).
 */
async function touchSessions(baseUrl: string, agents: Agent[]): Promise<void> {
  await inBatches(agents, 10, async (a) => {
    const res = await fetch(`${baseUrl}/api/auth/me`, { headers: { cookie: a.cookie } });
    if (res.status !== 200) throw new Error(`GET /api/auth/me answered ${res.status}`);
    await res.arrayBuffer();
  });
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
    ds.getRepository(PartType).create(inventedBenchNpn(`HPA-LOAD-${tag}`, 'Invented small-signal NPN for the load bench')),
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

/** CPU seconds (user + system) used so far by each of the given processes still running, from /proc (Linux). */
function cpuSecondsOf(pids: number[]): Map<number, number> {
  const out = new Map<number, number>();
  for (const pid of pids) {
    try {
      const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      out.set(pid, (Number(fields[11]) + Number(fields[12])) / 100); // utime, stime (fields 14 and 15 of proc(5)); USER_HZ is 100
    } catch {
      // the process ended
    }
  }
  return out;
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
  /** CPU ms per request of the server, of PostgreSQL and of the load generator since start(). */
  stop(requests: number): CpuFigures;
}

function cpuMeter(serverPid: number, pgPids: () => number[]): CpuMeter {
  let at0 = new Map<number, number>();
  let g0 = process.cpuUsage();
  return {
    start() {
      at0 = cpuSecondsOf([serverPid, ...pgPids()]);
      g0 = process.cpuUsage();
    },
    stop(requests) {
      const g = process.cpuUsage(g0);
      // A process started during the phase (a new pool connection's backend) counts whole; one
      // that ended during it (rare: the pool keeps its connections) is not counted.
      const used = (pids: number[]) => [...cpuSecondsOf(pids)].reduce((sum, [pid, s]) => sum + s - (at0.get(pid) ?? 0), 0);
      const per = (s: number) => Math.round(((s * 1000) / Math.max(1, requests)) * 100) / 100;
      return {
        serverCpuMs: per(used([serverPid])),
        postgresCpuMs: per(used(pgPids())),
        loadGeneratorCpuMs: per((g.user + g.system) / 1e6),
      };
    },
  };
}

/** What a phase's load generator saw. */
interface LoadResult {
  statusCodes: Record<string, number>;
  p50Ms: number;
  p99Ms: number;
  maxMs: number;
  /** Connection errors + timeouts + non-2xx answers. */
  errors: number;
  seconds: number;
}

function fromAutocannon(r: AutocannonResult, seconds = r.duration): LoadResult {
  const statusCodes: Record<string, number> = {};
  for (const [code, s] of Object.entries(r.statusCodeStats ?? {})) statusCodes[code] = s.count;
  return { statusCodes, p50Ms: r.latency.p50, p99Ms: r.latency.p99, maxMs: r.latency.max, errors: r.errors + r.timeouts + r.non2xx, seconds };
}

function figures(r: LoadResult, ok: number, cpu: CpuFigures): PhaseFigures {
  const requests = Object.values(r.statusCodes).reduce((a, b) => a + b, 0);
  return { requests, ok, perSecond: Math.round(ok / r.seconds), ...r, ...cpu };
}

/**
 * Open-loop recording at `rate` requests/s for `seconds`: request i leaves at t0 + i/rate
 * (several per timer tick when the timer is late), over at most `connections` kept-alive
 * sockets; a request finding them all busy waits for one, and that wait counts. Latency runs
 * from the planned time to the end of the answer.
 */
async function pacedWrites(baseUrl: string, agents: Agent[], lot: { lotId: number; sessionId: number }, o: { rate: number; seconds: number; connections: number }) {
  const url = new URL(baseUrl);
  const total = Math.round(o.rate * o.seconds);
  const latencies: number[] = [];
  const statusCodes: Record<string, number> = {};
  const answered: number[] = [];
  let errors = 0;
  const { seconds } = await pacedLoad({
    host: url.hostname,
    port: Number(url.port),
    rate: o.rate,
    total,
    connections: o.connections,
    request: (i) => {
      const position = i + 1;
      const a = agents[i % agents.length];
      const hfe = 150 + ((position * 37) % 140) + 0.5;
      const vbe = 640 + ((position * 13) % 25) / 2;
      const body = JSON.stringify({ sessionId: lot.sessionId, position, hfe, vbe, vbeUnit: 'mV' });
      const head =
        `POST /api/lots/${lot.lotId}/measurements HTTP/1.1\r\nHost: ${url.host}\r\nContent-Type: application/json\r\n` +
        `Content-Length: ${Buffer.byteLength(body)}\r\nCookie: ${a.cookie}\r\nX-CSRF-Token: ${a.csrf}\r\n\r\n`;
      return { bytes: Buffer.from(head + body) };
    },
    onAnswer: (i, { status, latencyMs }) => {
      latencies.push(latencyMs);
      const code = String(status);
      statusCodes[code] = (statusCodes[code] ?? 0) + 1;
      if (status === 201) answered.push(i + 1);
      else errors++;
    },
  });
  latencies.sort((x, y) => x - y);
  const at = (q: number) => (latencies.length ? Math.round(latencies[Math.min(latencies.length - 1, Math.floor(q * latencies.length))] * 10) / 10 : 0);
  const result: LoadResult = { statusCodes, p50Ms: at(0.5), p99Ms: at(0.99), maxMs: at(1), errors, seconds: Math.round(seconds * 100) / 100 };
  return { result, answered };
}

function runFor<T extends PromiseLike<AutocannonResult> & { stop(): void }>(instance: T, maxSeconds: number): Promise<AutocannonResult> {
  const timer = setTimeout(() => instance.stop(), maxSeconds * 1000);
  return Promise.resolve(instance).finally(() => clearTimeout(timer));
}

/** Starts the measuring connections; resolves with the figures once they finish or are cut. */
function writeLoad(baseUrl: string, agents: Agent[], lot: { lotId: number; sessionId: number }, o: { connections: number; amount: number; maxSeconds: number }) {
  let next = 0;
  let turn = 0;
  const answered: number[] = [];
  const started = performance.now();
  let lastAnswer = started;
  const instance = autocannon({
    url: baseUrl,
    connections: o.connections,
    amount: o.amount,
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
          lastAnswer = performance.now();
          if (status === 201) answered.push((JSON.parse(body) as { position: number }).position);
        },
      },
    ],
  });
  // autocannon reports a count-bound run only at its next whole-second tick, so its duration
  // overstates the run by up to a second: the phase lasts until the last answer.
  const seconds = () => Math.round(lastAnswer - started) / 1000;
  return { instance, done: runFor(instance, o.maxSeconds), answered, seconds };
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

async function accountWrites(ds: DataSource, lotId: number, r: LoadResult, answered: number[], cpu: CpuFigures): Promise<WriteFigures> {
  const rows = (await ds.query('SELECT position, count(*)::int AS n FROM measurement WHERE lot_id = $1 GROUP BY position', [lotId])) as { position: number; n: number }[];
  const stored = new Map(rows.map((x) => [x.position, x.n]));
  const rowsInDatabase = rows.reduce((a, x) => a + x.n, 0);
  const lost = answered.filter((p) => !stored.has(p)).length;
  const duplicated = rows.filter((x) => x.n > 1).length;
  return { ...figures(r, answered.length, cpu), rowsInDatabase, lost, duplicated, unanswered: rowsInDatabase - (answered.length - lost) };
}

/** Starts a throwaway cluster, migrates it, and runs the phases on it (see the file comment). */
async function benchLoadOwnCluster(opts: LoadOptions): Promise<LoadReport> {
  const log = opts.log ?? ((l: string) => console.log(`[bench-load] ${l}`));
  const root = path.resolve(process.env.BINWRIGHT_BENCH_LOAD_DIR ?? '.data/bench-load');
  const cluster = await startCluster({
    dataDir: path.join(root, 'postgres'),
    port: Number(process.env.BINWRIGHT_BENCH_LOAD_DB_PORT ?? 54351),
    database: 'binwright_bench_load',
    throwaway: true,
    log,
  });
  let ds: DataSource | null = null;
  try {
    const env = { ...clusterEnv(cluster), BINWRIGHT_DATA_DIR: path.join(root, 'files'), NODE_ENV: 'production' };
    ds = createDataSource(readConfig({ ...process.env, ...env }));
    await ds.initialize();
    await ds.runMigrations({ transaction: 'each' });
    return await benchLoad({ ...opts, ds, env: { ...env, ...opts.env } });
  } finally {
    await ds?.destroy();
    cluster.stop();
  }
}

/**
 * Runs the five phases against a server process; returns the figures (prints nothing but
 * progress through `log`). Without `opts.ds` it brings its own throwaway database.
 */
export async function benchLoad(opts: LoadOptions = {}): Promise<LoadReport> {
  const { ds } = opts;
  if (!ds) return benchLoadOwnCluster(opts);
  const loadBefore = os.loadavg();
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
    await touchSessions(app.baseUrl, writers);
    meter.start();
    const w1 = writeLoad(app.baseUrl, writers, lot1, { connections, amount: writes, maxSeconds });
    const w1Result = await w1.done;
    const writersAlone = await accountWrites(ds, lot1.lotId, fromAutocannon(w1Result, w1.seconds()), w1.answered, meter.stop(w1.answered.length));

    log(`Phase 2: ${connections} connections reading the lots list for ${readSeconds} s…`);
    await touchSessions(app.baseUrl, readers);
    meter.start();
    const r2Result = await readLoad(app.baseUrl, readers, { connections, seconds: readSeconds }).done;
    const readersAlone = figures(fromAutocannon(r2Result), r2Result['2xx'], meter.stop(r2Result['2xx']));

    log(`Phase 3: both at once…`);
    const lot3 = await measuringLot(ds, f, `L-LOAD-M-${Date.now()}`, writes + 1000);
    await touchSessions(app.baseUrl, [...writers, ...readers]);
    meter.start();
    const w3 = writeLoad(app.baseUrl, writers, lot3, { connections, amount: writes, maxSeconds });
    const r3 = readLoad(app.baseUrl, readers, { connections, seconds: maxSeconds });
    const w3Result = await w3.done;
    r3.instance.stop();
    const r3Result = await r3.done;
    // In the mixed phase the CPU is shared between both kinds of request: reported per request of either kind.
    const mixedCpu = meter.stop(w3.answered.length + r3Result['2xx']);
    // Rows written for requests still in flight when a phase is cut by its time limit are not
    // losses (they are stored; their answer was not awaited): reported as `unanswered`.
    const mixedWriters = await accountWrites(ds, lot3.lotId, fromAutocannon(w3Result, w3.seconds()), w3.answered, mixedCpu);
    const mixedReaders = figures(fromAutocannon(r3Result), r3Result['2xx'], mixedCpu);

    const pacedSeconds = opts.pacedSeconds ?? 8;
    const paceAt = async (phase: string, rate: number) => {
      log(`Phase ${phase}: recording at a steady ${rate}/s for ${pacedSeconds} s over up to ${connections} connections…`);
      const lot = await measuringLot(ds, f, `L-LOAD-P${rate}-${Date.now()}`, rate * pacedSeconds + 1000);
      await touchSessions(app.baseUrl, writers);
      meter.start();
      const w = await pacedWrites(app.baseUrl, writers, lot, { rate, seconds: pacedSeconds, connections });
      return { ...(await accountWrites(ds, lot.lotId, w.result, w.answered, meter.stop(w.answered.length))), ratePerSecond: rate };
    };
    const paced = await paceAt('4', opts.pacedRate ?? 100);
    const atTarget = await paceAt('5', opts.targetRate ?? 1000);

    const clean = (w: WriteFigures) => w.lost === 0 && w.duplicated === 0 && w.errors === 0;
    return {
      connections,
      machine: { cpus: os.cpus().length, loadBefore, loadAfter: os.loadavg() },
      writersAlone,
      readersAlone,
      mixed: { writers: mixedWriters, readers: mixedReaders },
      paced,
      atTarget,
      nothingLost: clean(writersAlone) && clean(mixedWriters) && clean(paced) && clean(atTarget),
      targets: { throughput: writersAlone.perSecond >= 1000, p99: atTarget.p99Ms < 50 && atTarget.errors === 0 && atTarget.ok === atTarget.requests },
    };
  } finally {
    await app.stop('SIGTERM');
  }
}

const met = (ok: boolean) => (ok ? 'met' : 'MISSED');

/** The report as printed lines. */
export function formatLoadReport(r: LoadReport): string[] {
  const cpu = (x: PhaseFigures) => `CPU/request: server ${x.serverCpuMs} ms, PostgreSQL ${x.postgresCpuMs} ms, load generator ${x.loadGeneratorCpuMs} ms`;
  const load = (l: number[]) => l.map((x) => x.toFixed(1)).join(' ');
  const w = (x: WriteFigures) =>
    `${x.perSecond.toLocaleString('en').padStart(6)} measurements/s  p50 ${x.p50Ms} ms  p99 ${x.p99Ms} ms  max ${x.maxMs} ms  errors ${x.errors}  ${cpu(x)}\n` +
    `                       rows ${x.rowsInDatabase} = 2xx ${x.ok}${x.unanswered ? ` (+${x.unanswered} in flight at the cut)` : ''}, lost ${x.lost}, duplicated ${x.duplicated}`;
  const rd = (x: PhaseFigures) => `${x.perSecond.toLocaleString('en').padStart(6)} lists/s         p50 ${x.p50Ms} ms  p99 ${x.p99Ms} ms  max ${x.maxMs} ms  errors ${x.errors}  ${cpu(x)}`;
  return [
    `  (e) load, ${r.connections} connections each, server in its own process on loopback (${r.machine.cpus} CPUs, load average ${load(r.machine.loadBefore)} before, ${load(r.machine.loadAfter)} after)`,
    `      recording alone  ${w(r.writersAlone)}`,
    `                       target ≥ 1,000/s ${met(r.targets.throughput)} (closed loop: latency here is queueing, mean = connections ÷ throughput)`,
    `      lots list alone  ${rd(r.readersAlone)}`,
    `      both at once     ${w(r.mixed.writers)}`,
    `                       ${rd(r.mixed.readers)}`,
    `      paced ${String(r.paced.ratePerSecond).padStart(5)}/s     ${w(r.paced)}`,
    `      paced ${String(r.atTarget.ratePerSecond).padStart(5)}/s     ${w(r.atTarget)}`,
    `                       target p99 < 50 ms at ${r.atTarget.ratePerSecond.toLocaleString('en')}/s, all answered 201: ${met(r.targets.p99)}`,
    `      nothing lost: ${r.nothingLost ? 'yes' : 'NO'}`,
  ];
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const report = await benchLoad({
    writes: Number(process.env.BENCH_LOAD_WRITES ?? 6_000),
    connections: Number(process.env.BENCH_LOAD_CONNECTIONS ?? 50),
  });
  console.log(['', ...formatLoadReport(report), ''].join('\n'));
  if (process.env.BENCH_LOAD_JSON) console.log(JSON.stringify(report, null, 2));
}
