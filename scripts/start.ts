/**
 * `npm start`: project-local PostgreSQL → migrations → demo scenario (first start) → SMTP sink →
 * client build → one Express server. Ctrl-C or SIGTERM stops all of it, the database included.
 */
import 'reflect-metadata';
import path from 'node:path';
import type { Server } from 'node:http';
import { build } from 'vite';
import type { DataSource } from 'typeorm';
import { createApp } from '../server/app.ts';
import { readConfig } from '../server/config.ts';
import { createDataSource } from '../server/data-source.ts';
import { startSmtpSink, type SmtpSink } from '../server/modules/mail/smtp-sink.ts';
import { seedDemo } from '../seed/demo.ts';
import { DEMO_PASSWORD, DEMO_USERS } from '../seed/demo-users.ts';
import { clusterEnv, portIsFree, startCluster, StartupError, type RunningCluster } from './lib/pg-cluster.ts';

const log = (l: string) => console.log(`[binwright] ${l}`);

async function main() {
  const base = readConfig();
  const host = process.env.BINWRIGHT_HOST ?? '127.0.0.1';
  if (!Number.isInteger(base.port) || base.port < 1 || base.port > 65535) throw new StartupError(`PORT must be a port number, got "${process.env.PORT}".`);
  if (!(await portIsFree(base.port, host))) {
    throw new StartupError(`Port ${base.port} on ${host} is already in use. Set PORT to a free port, e.g.  PORT=5190 npm start`);
  }
  if (!(await portIsFree(base.smtp.port))) {
    throw new StartupError(`The mail sink port ${base.smtp.port} is already in use. Set BINWRIGHT_SMTP_PORT to a free port.`);
  }

  let cluster: RunningCluster | null = null;
  let ds: DataSource | null = null;
  let sink: SmtpSink | null = null;
  let server: Server | null = null;
  let stopping = false;
  const stopAll = async (code: number) => {
    if (stopping) return;
    stopping = true;
    log('Stopping…');
    await new Promise<void>((r) => (server ? server.close(() => r()) : r()));
    server?.closeAllConnections?.();
    await sink?.close().catch(() => {});
    await ds?.destroy().catch(() => {});
    cluster?.stop();
    log('Stopped.');
    process.exit(code);
  };
  process.on('SIGINT', () => void stopAll(0));
  process.on('SIGTERM', () => void stopAll(0));

  try {
    cluster = await startCluster({
      dataDir: path.join(base.dataDir, 'postgres'),
      port: base.db.port,
      database: base.db.database,
      log,
    });
    Object.assign(process.env, clusterEnv(cluster));
    const config = readConfig();
    log(`PostgreSQL is up on 127.0.0.1:${cluster.port} (data in ${path.join(base.dataDir, 'postgres')}).`);

    ds = createDataSource(config);
    await ds.initialize();
    const applied = await ds.runMigrations({ transaction: 'each' });
    log(applied.length ? `Applied ${applied.length} migration(s).` : 'Database schema is up to date.');
    await seedDemo(ds, log);

    sink = await startSmtpSink({ port: config.smtp.port, folder: path.join(config.dataDir, 'mail') });
    log(`Mail sink listening on 127.0.0.1:${sink.port}; messages are kept in ${sink.folder}.`);

    const clientDir = path.resolve(process.env.BINWRIGHT_DIST_DIR ?? 'dist');
    if (process.env.BINWRIGHT_SKIP_BUILD !== '1') {
      log('Building the client…');
      await build({ logLevel: 'warn', mode: 'production' });
    }
    const app = createApp({ dataSource: ds, config, clientDir });
    server = await new Promise<Server>((resolve, reject) => {
      const s = app.listen(config.port, host, () => resolve(s));
      s.once('error', reject);
    });
    const url = `http://${host === '0.0.0.0' ? 'localhost' : host}:${config.port}/`;
    console.log('');
    console.log(`  Binwright is running at ${url}`);
    console.log('');
    console.log(`  Demo sign-ins (password for all: ${DEMO_PASSWORD})`);
    for (const u of DEMO_USERS) console.log(`    ${u.role.padEnd(10)} ${u.email}`);
    console.log('');
    console.log('  Press Ctrl-C to stop the app and its database.');
  } catch (e) {
    if (e instanceof StartupError) console.error(`\n[binwright] Cannot start: ${e.message}\n`);
    else console.error('[binwright] Start failed:', e);
    await stopAll(1);
  }
}

main().catch((e) => {
  console.error(e instanceof StartupError ? `\n[binwright] Cannot start: ${e.message}\n` : e);
  process.exit(1);
});
