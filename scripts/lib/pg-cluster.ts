/**
 * A project-local PostgreSQL cluster built from Debian's server binaries.
 * Used by `npm start` (kept data), `npm test` and `npm run bench` (throwaway data).
 */
import { spawnSync, type SpawnSyncOptions } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';

export class StartupError extends Error {}

export interface ClusterOptions {
  /** Folder that holds PGDATA (created when missing). */
  dataDir: string;
  port: number;
  database: string;
  /** Throwaway cluster: wiped before start, fsync off. Never for kept data. */
  throwaway?: boolean;
  log?: (line: string) => void;
}

export interface RunningCluster {
  host: string;
  port: number;
  database: string;
  user: string;
  socketDir: string;
  stop(): void;
}

const SUPERUSER = 'binwright';

function isRoot(): boolean {
  return typeof process.getuid === 'function' && process.getuid() === 0;
}

function run(cmd: string, args: string[], opts: SpawnSyncOptions = {}): { status: number | null; out: string } {
  const r = spawnSync(cmd, args, { encoding: 'utf8', cwd: '/', ...opts });
  return { status: r.status, out: `${r.stdout ?? ''}${r.stderr ?? ''}` };
}

function findBinDir(): string | null {
  const fromEnv = process.env.BINWRIGHT_PG_BIN;
  if (fromEnv) return fs.existsSync(path.join(fromEnv, 'pg_ctl')) ? fromEnv : null;
  const base = '/usr/lib/postgresql';
  if (!fs.existsSync(base)) return null;
  const versions = fs
    .readdirSync(base)
    .filter((v) => fs.existsSync(path.join(base, v, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(base, versions[0], 'bin') : null;
}

/** Finds the server binaries, installing Debian's `postgresql` when root and missing. */
export function ensureBinaries(log: (l: string) => void): string {
  let bin = findBinDir();
  if (bin) return bin;
  if (!isRoot()) {
    throw new StartupError(
      'PostgreSQL server binaries were not found under /usr/lib/postgresql/<version>/bin.\n' +
        'Install them with:  sudo apt-get install -y postgresql\n' +
        'or point BINWRIGHT_PG_BIN at a folder that holds pg_ctl, initdb and postgres.',
    );
  }
  log('PostgreSQL server binaries missing: installing Debian package "postgresql" (one time, about a minute)…');
  // Keep Debian's package from creating and starting its own cluster on 5432.
  fs.mkdirSync('/etc/postgresql-common', { recursive: true });
  const conf = '/etc/postgresql-common/createcluster.conf';
  const existing = fs.existsSync(conf) ? fs.readFileSync(conf, 'utf8') : '';
  if (!/^\s*create_main_cluster\s*=\s*false/m.test(existing)) {
    fs.writeFileSync(conf, `${existing}\ncreate_main_cluster = false\n`);
  }
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const upd = run('apt-get', ['update', '-qq'], { env, stdio: 'inherit' });
  if (upd.status !== 0) throw new StartupError('apt-get update failed; cannot install PostgreSQL.');
  const inst = run('apt-get', ['install', '-y', '-qq', 'postgresql'], { env, stdio: 'inherit' });
  if (inst.status !== 0) throw new StartupError('apt-get install postgresql failed.');
  bin = findBinDir();
  if (!bin) throw new StartupError('PostgreSQL was installed but pg_ctl was not found under /usr/lib/postgresql.');
  return bin;
}

/** As root the server runs as an unprivileged system user; otherwise as the current user. */
function serverUser(): string | null {
  if (!isRoot()) return null;
  for (const name of ['postgres', 'binwright-pg']) {
    if (run('id', ['-u', name]).status === 0) return name;
  }
  const add = run('useradd', ['--system', '--no-create-home', '--shell', '/usr/sbin/nologin', 'binwright-pg']);
  if (add.status !== 0) throw new StartupError(`Could not create system user binwright-pg: ${add.out}`);
  return 'binwright-pg';
}

function asUser(user: string | null, cmd: string, args: string[], opts: SpawnSyncOptions = {}) {
  return user ? run('runuser', ['-u', user, '--', cmd, ...args], opts) : run(cmd, args, opts);
}

function canTraverse(user: string | null, dir: string): boolean {
  if (!user) return true;
  return asUser(user, 'test', ['-x', dir, '-a', '-w', dir]).status === 0;
}

export async function portIsFree(port: number, host = '127.0.0.1'): Promise<boolean> {
  return new Promise((resolve) => {
    const srv = net.createServer();
    srv.once('error', () => resolve(false));
    srv.listen(port, host, () => srv.close(() => resolve(true)));
  });
}

function majorOf(binDir: string): string {
  const r = run(path.join(binDir, 'pg_ctl'), ['--version']);
  const m = /(\d+)(?:\.\d+)?/.exec(r.out);
  return m ? m[1] : '?';
}

/** The server binaries' folder (installing them when root and missing). */
export function pgBinDir(log: (l: string) => void = () => {}): string {
  return ensureBinaries(log);
}

export async function startCluster(opts: ClusterOptions): Promise<RunningCluster> {
  const log = opts.log ?? ((l: string) => console.log(l));
  const bin = ensureBinaries(log);
  const user = serverUser();
  let dataRoot = path.resolve(opts.dataDir);
  fs.mkdirSync(dataRoot, { recursive: true });

  if (user) {
    // The unprivileged server user must reach the folder through every parent.
    const probe = path.join(dataRoot, '.probe');
    fs.mkdirSync(probe, { recursive: true });
    run('chown', [user, probe]);
    const ok = canTraverse(user, probe);
    fs.rmSync(probe, { recursive: true, force: true });
    if (!ok) {
      const fallback = path.join(os.tmpdir(), `binwright-${hash(dataRoot)}`);
      log(`Note: user ${user} cannot reach ${dataRoot}; keeping the database in ${fallback} instead.`);
      dataRoot = fallback;
      fs.mkdirSync(dataRoot, { recursive: true });
    }
  }

  const pgdata = path.join(dataRoot, 'pgdata');
  if (opts.throwaway) fs.rmSync(pgdata, { recursive: true, force: true });

  const major = majorOf(bin);
  const versionFile = path.join(pgdata, 'PG_VERSION');
  if (fs.existsSync(versionFile)) {
    const have = fs.readFileSync(versionFile, 'utf8').trim();
    if (have !== major) {
      throw new StartupError(
        `The data folder ${pgdata} was made by PostgreSQL ${have}, but the server found is PostgreSQL ${major}.\n` +
          `Start PostgreSQL ${have} (set BINWRIGHT_PG_BIN to its bin folder), upgrade the data with pg_upgrade, ` +
          'or choose another data folder with BINWRIGHT_DATA_DIR.',
      );
    }
  }

  // Unix socket paths are limited to 107 bytes.
  let socketDir = dataRoot;
  if (path.join(socketDir, `.s.PGSQL.${opts.port}`).length > 100) {
    socketDir = path.join('/tmp', `bw-${hash(dataRoot).slice(0, 10)}`);
    fs.mkdirSync(socketDir, { recursive: true });
  }

  if (user) {
    run('chown', ['-R', user, dataRoot]);
    if (socketDir !== dataRoot) run('chown', [user, socketDir]);
  }

  if (!fs.existsSync(versionFile)) {
    log(`Creating a PostgreSQL ${major} cluster in ${pgdata}…`);
    fs.mkdirSync(pgdata, { recursive: true, mode: 0o700 });
    if (user) run('chown', [user, pgdata]);
    const init = asUser(user, path.join(bin, 'initdb'), [
      '-D', pgdata, '-U', SUPERUSER, '--auth-local=trust', '--auth-host=scram-sha-256',
      '--encoding=UTF8', '--no-locale', '--no-instructions',
    ]);
    if (init.status !== 0) throw new StartupError(`initdb failed:\n${init.out}`);
  }

  // A cluster already running on this data folder (e.g. `npm start` in another terminal) is used
  // as it is and left running.
  let attached = false;
  if (!opts.throwaway && fs.existsSync(path.join(pgdata, 'postmaster.pid'))) {
    attached = asUser(user, path.join(bin, 'pg_ctl'), ['-D', pgdata, 'status']).status === 0;
  }
  if (attached) {
    log(`Using the PostgreSQL already running on ${pgdata}.`);
    const pid = fs.readFileSync(path.join(pgdata, 'postmaster.pid'), 'utf8').split('\n');
    const runningPort = Number(pid[3]);
    const runningSocket = pid[4] || socketDir;
    return { host: runningSocket, port: runningPort, database: opts.database, user: SUPERUSER, socketDir: runningSocket, stop: () => {} };
  }

  if (!(await portIsFree(opts.port))) {
    throw new StartupError(
      `The database port ${opts.port} on 127.0.0.1 is already in use.\n` +
        `Stop whatever is using it, or set ${opts.throwaway ? 'BINWRIGHT_TEST_DB_PORT' : 'BINWRIGHT_DB_PORT'} to a free port.`,
    );
  }

  const logFile = path.join(dataRoot, 'postgres.log');
  const settings = [
    `-p ${opts.port}`,
    `-c listen_addresses=127.0.0.1`,
    `-c unix_socket_directories=${socketDir}`,
    ...(opts.throwaway ? ['-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off'] : []),
  ].join(' ');
  const start = asUser(user, path.join(bin, 'pg_ctl'), ['-D', pgdata, '-l', logFile, '-w', '-t', '60', '-o', settings, 'start']);
  if (start.status !== 0) {
    const tail = fs.existsSync(logFile) ? fs.readFileSync(logFile, 'utf8').split('\n').slice(-15).join('\n') : '';
    throw new StartupError(`PostgreSQL did not start:\n${start.out}\n${tail}`);
  }

  let stopped = false;
  const stop = () => {
    if (stopped) return;
    stopped = true;
    asUser(user, path.join(bin, 'pg_ctl'), ['-D', pgdata, '-m', 'fast', '-w', 'stop']);
  };

  try {
    const admin = new pg.Client({ host: socketDir, port: opts.port, user: SUPERUSER, database: 'postgres' });
    await admin.connect();
    const exists = await admin.query('SELECT 1 FROM pg_database WHERE datname = $1', [opts.database]);
    if (exists.rowCount === 0) await admin.query(`CREATE DATABASE "${opts.database.replace(/"/g, '')}"`);
    await admin.end();
  } catch (e) {
    stop();
    throw e;
  }

  return { host: socketDir, port: opts.port, database: opts.database, user: SUPERUSER, socketDir, stop };
}

function hash(s: string): string {
  return createHash('sha256').update(s).digest('hex').slice(0, 16);
}

/** Environment variables that server/config.ts reads to reach this cluster. */
export function clusterEnv(c: RunningCluster): Record<string, string> {
  return {
    BINWRIGHT_DB_HOST: c.host,
    BINWRIGHT_DB_PORT: String(c.port),
    BINWRIGHT_DB_NAME: c.database,
    BINWRIGHT_DB_USER: c.user,
  };
}
