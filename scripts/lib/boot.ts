import 'reflect-metadata';
import path from 'node:path';
import type { Server } from 'node:http';
import type { DataSource } from 'typeorm';
import { readConfig, type ServerConfig } from '../../server/config.ts';
import { createDataSource } from '../../server/data-source.ts';
import { createMailTransport, startMailWorker } from '../../server/modules/mail/mail.service.ts';
import { startSmtpSink, type SmtpSink } from '../../server/modules/mail/smtp-sink.ts';
import { seedDemo } from '../../seed/demo.ts';
import { DEMO_PASSWORD, DEMO_USERS } from '../../seed/demo-users.ts';
import { clusterEnv, portIsFree, startCluster, StartupError, type RunningCluster } from './pg-cluster.ts';

export const log = (l: string) => console.log(`[binwright] ${l}`);

export interface Backend {
  config: ServerConfig;
  ds: DataSource;
  sink: SmtpSink | null;
  host: string;
  /** Registers an extra thing to close on shutdown (HTTP server, Vite dev server). */
  onStop(fn: () => Promise<void> | void): void;
}

/**
 * Everything `npm start` and `npm run dev` share: port checks, the project-local PostgreSQL,
 * migrations, the demo scenario (first start), the mail sink, and a clean stop on SIGINT/SIGTERM.
 */
export async function bootBackend(): Promise<Backend> {
  const base = readConfig();
  const host = process.env.BINWRIGHT_HOST ?? '127.0.0.1';
  // The local sink runs unless a real relay is configured.
  const localSmtp = !process.env.BINWRIGHT_SMTP_HOST;
  const stoppers: (() => Promise<void> | void)[] = [];
  let cluster: RunningCluster | null = null;
  let stopping = false;
  const stopAll = async (code: number) => {
    if (stopping) return;
    stopping = true;
    log('Stopping…');
    for (const fn of [...stoppers].reverse()) await Promise.resolve(fn()).catch(() => {});
    cluster?.stop();
    log('Stopped.');
    process.exit(code);
  };
  process.on('SIGINT', () => void stopAll(0));
  process.on('SIGTERM', () => void stopAll(0));
  process.on('SIGHUP', () => void stopAll(0));

  try {
    if (!Number.isInteger(base.port) || base.port < 1 || base.port > 65535) {
      throw new StartupError(`PORT must be a port number from 1 to 65535, got "${process.env.PORT}".`);
    }
    if (!(await portIsFree(base.port, host))) {
      throw new StartupError(`Port ${base.port} on ${host} is already in use. Set PORT to a free port, e.g.  PORT=5190 npm start`);
    }
    if (localSmtp && !(await portIsFree(base.smtp.port))) {
      throw new StartupError(`The mail sink port ${base.smtp.port} is already in use. Set BINWRIGHT_SMTP_PORT to a free port.`);
    }
    cluster = await startCluster({ dataDir: path.join(base.dataDir, 'postgres'), port: base.db.port, database: base.db.database, log });
    Object.assign(process.env, clusterEnv(cluster));
    const config = readConfig();
    log(`PostgreSQL is up on 127.0.0.1:${cluster.port} (data in ${path.join(base.dataDir, 'postgres')}).`);
    const ds = createDataSource(config);
    await ds.initialize();
    stoppers.push(() => ds.destroy());
    const applied = await ds.runMigrations({ transaction: 'each' });
    log(applied.length ? `Applied ${applied.length} migration(s).` : 'Database schema is up to date.');
    await seedDemo(ds, log);
    let sink: SmtpSink | null = null;
    if (localSmtp) {
      sink = await startSmtpSink({ port: config.smtp.port, folder: config.smtp.sinkFolder });
      stoppers.push(() => sink?.close());
      log(`Mail sink listening on 127.0.0.1:${sink.port}; messages are kept in ${sink.folder}.`);
    } else {
      log(`Outgoing mail goes to the SMTP relay ${config.smtp.host}:${config.smtp.port}.`);
    }
    const stopWorker = startMailWorker(ds, createMailTransport(config), config.smtp.from);
    stoppers.push(stopWorker);
    return { config, ds, sink, host, onStop: (fn) => stoppers.push(fn) };
  } catch (e) {
    reportStartError(e);
    await stopAll(1);
    throw e;
  }
}

export function reportStartError(e: unknown) {
  if (e instanceof StartupError) console.error(`\n[binwright] Cannot start: ${e.message}\n`);
  else console.error('[binwright] Start failed:', e);
}

export function closeServer(server: Server): Promise<void> {
  return new Promise<void>((r) => {
    server.close(() => r());
    server.closeAllConnections?.();
  });
}

export function printBanner(url: string, extra: string[] = []) {
  console.log('');
  console.log(`  Binwright is running at ${url}`);
  for (const l of extra) console.log(`  ${l}`);
  console.log('');
  console.log(`  Demo sign-ins (password for all: ${DEMO_PASSWORD})`);
  for (const u of DEMO_USERS) console.log(`    ${u.role.padEnd(10)} ${u.email}`);
  console.log('');
  console.log('  Press Ctrl-C to stop the app and its database.');
}
