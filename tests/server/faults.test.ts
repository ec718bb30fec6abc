import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import type { DataSource, EntityManager } from 'typeorm';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { readConfig } from '../../server/config.ts';
import { createDataSource } from '../../server/data-source.ts';
import { AppError } from '../../server/http/app-error.ts';
import { nextContainerCodes } from '../../server/modules/bins/container-code.ts';
import { MeasurementSession } from '../../server/modules/measurements/measurement-session.entity.ts';
import { startAppProcess, type AppProcess } from '../../scripts/lib/app-process.ts';
import { clusterEnv, portIsFree, startCluster, type RunningCluster } from '../../scripts/lib/pg-cluster.ts';
import { DEFAULT_MAPPING, DEFAULT_UNITS, makeBenchLot } from './bench-fixtures.ts';
import { agentFor, makeUser, TEST_PASSWORD, useTestApp } from './helpers.ts';

const ctx = useTestApp();
const ROWS = 100_000;

/** A seeded tester file of `n` rows (position, hFE, Vbe in volts), about 2 MB for 100 000 rows. */
function bigCsv(n: number): string {
  const lines = new Array<string>(n + 1);
  lines[0] = 'Pos,HFE,VBE_V';
  for (let i = 1; i <= n; i++) lines[i] = `${i},${150 + ((i * 37) % 140)}.5,0.${640 + ((i * 13) % 25)}`;
  return `${lines.join('\n')}\n`;
}

interface HttpSession {
  cookie: string;
  csrf: string;
}

const sid = (res: Response) => (res.headers.getSetCookie().find((c) => c.startsWith('bw.sid=')) ?? '').split(';')[0];

async function signInOver(baseUrl: string, email: string): Promise<HttpSession> {
  const first = await fetch(`${baseUrl}/api/auth/csrf`);
  const { csrfToken } = (await first.json()) as { csrfToken: string };
  const res = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie: sid(first), 'x-csrf-token': csrfToken },
    body: JSON.stringify({ email, password: TEST_PASSWORD }),
  });
  expect(res.status).toBe(200);
  return { cookie: sid(res), csrf: csrfToken };
}

function postImport(baseUrl: string, s: HttpSession, lotId: number, sessionId: number, csv: string, token: string): Promise<Response> {
  const form = new FormData();
  form.set('sessionId', String(sessionId));
  form.set('mapping', JSON.stringify(DEFAULT_MAPPING));
  form.set('units', JSON.stringify(DEFAULT_UNITS));
  form.set('progressToken', token);
  form.set('file', new Blob([csv], { type: 'text/csv' }), 'tester.csv');
  return fetch(`${baseUrl}/api/lots/${lotId}/measurements/import`, { method: 'POST', headers: { cookie: s.cookie, 'x-csrf-token': s.csrf }, body: form });
}

const rowsOf = async (ds: DataSource, lotId: number) =>
  Number(((await ds.query('SELECT count(*)::int AS n FROM measurement WHERE lot_id = $1', [lotId])) as { n: number }[])[0].n);

/** The killed server's connections carry this name (PGAPPNAME), so the test can watch them end. */
const APP_NAME = `bw-fault-${process.pid}`;

/** Waits until PostgreSQL has noticed the dead client and ended its backends (rolling back). */
async function untilBackendsGone(ds: DataSource, timeoutMs = 20_000) {
  const t0 = Date.now();
  for (;;) {
    const [{ n }] = (await ds.query(`SELECT count(*)::int AS n FROM pg_stat_activity WHERE application_name = $1`, [APP_NAME])) as { n: number }[];
    if (n === 0) return;
    if (Date.now() - t0 > timeoutMs) throw new Error(`the killed server's backends are still there after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe('the server killed with SIGKILL in the middle of a 100 000-row import', () => {
  let app: AppProcess | null = null;
  afterAll(async () => {
    await app?.stop('SIGKILL');
  });

  it('leaves the lot with none of the rows; after a restart the same import stores all of them', async () => {
    const user = await makeUser(ctx.ds, 'inspector');
    const { lot } = await makeBenchLot(ctx.ds, { quantity: ROWS });
    const session = await ctx.ds.getRepository(MeasurementSession).save(
      ctx.ds.getRepository(MeasurementSession).create({ lotId: lot.id, instrument: 'Fault tester', ambientC: 25, mode: 'sample', operatorId: user.id, closedAt: null }),
    );
    const csv = bigCsv(ROWS);

    app = await startAppProcess({ PGAPPNAME: APP_NAME });
    const s = await signInOver(app.baseUrl, user.email);
    const token = randomUUID();
    const answer = postImport(app.baseUrl, s, lot.id, session.id, csv, token).then(
      (r) => ({ status: r.status }),
      (e: unknown) => ({ error: String(e) }),
    );

    // Kill the moment the server reports that part of the rows are written inside its transaction.
    let seen = '';
    for (const t0 = Date.now(); Date.now() - t0 < 60_000; ) {
      const p = await fetch(`${app.baseUrl}/api/lots/${lot.id}/measurements/import/progress/${token}`, { headers: { cookie: s.cookie } });
      if (p.status === 200) {
        const body = (await p.json()) as { phase: string; done: number };
        seen = `${body.phase} ${body.done}`;
        if (body.phase === 'writing' && body.done >= 25_000) break;
        if (body.phase === 'done' || body.phase === 'failed') break;
      }
      await new Promise((r) => setTimeout(r, 5));
    }
    expect(seen).toMatch(/^writing [1-9]\d{4}/);
    const exit = await app.stop('SIGKILL');
    expect(exit.signal).toBe('SIGKILL');
    expect(await answer).toHaveProperty('error');

    // PostgreSQL rolls back the dead connection's transaction: none of the rows, never a part.
    await untilBackendsGone(ctx.ds);
    expect(await rowsOf(ctx.ds, lot.id)).toBe(0);

    // Restart: the session kept in PostgreSQL survives, and the same file now imports completely.
    app = await startAppProcess({});
    const again = await postImport(app.baseUrl, s, lot.id, session.id, csv, randomUUID());
    expect(again.status).toBe(201);
    expect(((await again.json()) as { imported: number }).imported).toBe(ROWS);
    expect(await rowsOf(ctx.ds, lot.id)).toBe(ROWS);
    const [{ distinct }] = (await ctx.ds.query('SELECT count(DISTINCT position)::int AS distinct FROM measurement WHERE lot_id = $1', [lot.id])) as { distinct: number }[];
    expect(distinct).toBe(ROWS);
    await app.stop('SIGTERM');
    app = null;
  }, 120_000);
});

describe('PostgreSQL stopped while the server runs (a separate throwaway cluster)', () => {
  let cluster: RunningCluster | null = null;
  let ds: DataSource | null = null;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'bw-faults-pg-'));
  fs.chmodSync(dir, 0o755);
  afterAll(async () => {
    await ds?.destroy().catch(() => {});
    cluster?.stop();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('health answers 503, requests fail fast with a clear 503 problem, and all recovers when it is back', async () => {
    // A port of its own, derived from this run's test port so parallel runs do not collide.
    let port = Number(process.env.BINWRIGHT_DB_PORT ?? 54339) + 100;
    while (!(await portIsFree(port))) port++;
    const opts = { dataDir: dir, port, database: 'binwright_faults', log: () => {} };
    cluster = await startCluster({ ...opts, throwaway: true });
    const config = readConfig({ ...process.env, ...clusterEnv(cluster) });
    ds = createDataSource(config);
    await ds.initialize();
    await ds.runMigrations({ transaction: 'each' });
    const app = createApp({ dataSource: ds, config });
    const user = await makeUser(ds, 'quality');
    const agent = await agentFor(app, user);
    const newUser = (tag: string) => ({ email: `${tag}-${randomUUID().slice(0, 8)}@example.test`, name: 'Fault Test', role: 'buyer', password: 'long-enough-password' });
    await agent.get('/api/lots').expect(200);

    cluster.stop();

    const t0 = Date.now();
    const health = await request(app).get('/api/health');
    expect(health.status).toBe(503);
    expect(health.body).toEqual({ status: 'degraded', database: 'unreachable' });
    // The same answer for a browser that sends its session cookie.
    expect((await agent.get('/api/health').expect(503)).body).toEqual({ status: 'degraded', database: 'unreachable' });
    for (const res of [
      await agent.get('/api/lots'),
      await agent.post('/api/users').set('x-csrf-token', agent.csrf).send(newUser('down')),
      await request(app).get('/api/auth/csrf'),
    ]) {
      expect(res.status).toBe(503);
      expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
      expect(res.headers['retry-after']).toBeDefined();
      expect(res.body).toMatchObject({ status: 503, code: 'database-unavailable' });
      expect(res.body.detail).toMatch(/database/i);
    }
    // Not a hang: every answer above came back quickly.
    expect(Date.now() - t0).toBeLessThan(15_000);

    // PostgreSQL back on the same folder and port; the server was never restarted.
    cluster = await startCluster({ ...opts, throwaway: false });
    await request(app).get('/api/health').expect(200);
    const lots = await agent.get('/api/lots').expect(200);
    expect(lots.body.total).toBe(0);
    await agent.get('/api/auth/me').expect(200);
    // Writes work again too, in the same session (kept in PostgreSQL) with the same CSRF token.
    await agent.post('/api/users').set('x-csrf-token', agent.csrf).send(newUser('back')).expect(201);
  }, 90_000);

  it('a database that accepts the connection but never answers fails the start within the connect timeout', async () => {
    // A TCP listener that accepts and stays silent, like a PostgreSQL host behind a dead network path.
    const sockets: net.Socket[] = [];
    const silent = net.createServer((s) => void sockets.push(s));
    await new Promise<void>((r) => silent.listen(0, '127.0.0.1', () => r()));
    const silentPort = (silent.address() as net.AddressInfo).port;
    try {
      const config = readConfig({ ...process.env, BINWRIGHT_DB_HOST: '127.0.0.1', BINWRIGHT_DB_PORT: String(silentPort), BINWRIGHT_DB_CONNECT_TIMEOUT_MS: '1000' });
      const t0 = Date.now();
      const err = await createDataSource(config).initialize().then(
        () => null,
        (e: unknown) => e,
      );
      expect(err).toBeInstanceOf(Error);
      expect(Date.now() - t0).toBeLessThan(5_000);
    } finally {
      for (const s of sockets) s.destroy();
      silent.close();
    }
  });
});

describe('limits that are reached in a busy day', () => {
  it('when the day\'s container numbers (C-YYYYMMDD-NNNN to -NNNNNN, 999 999 a day) run out, screening is refused with 409, not a 500', async () => {
    // The counter row is stubbed: moving the shared test database's real counter would disturb
    // other tests (tests/server/bins-container-codes.test.ts moves real rows of far-off days).
    const counterAt = (last: number) => ({ query: async () => [{ last }] }) as unknown as EntityManager;
    const day = new Date(Date.UTC(2026, 11, 1, 10));
    expect(await nextContainerCodes(counterAt(10_000), day, 2)).toEqual(['C-20261201-9999', 'C-20261201-10000']);
    expect(await nextContainerCodes(counterAt(999_999), day, 1)).toEqual(['C-20261201-999999']);
    const err = await nextContainerCodes(counterAt(1_000_001), day, 2).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(AppError);
    expect(err).toMatchObject({ status: 409, errors: [{ field: 'containers', message: 'no container numbers left for today' }] });
  });
});
