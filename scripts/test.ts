/**
 * `npm test` after the type check and lint: starts a throwaway PostgreSQL cluster (never the demo
 * one), applies the migrations, builds the client for the browser tests, runs every Vitest
 * project, and stops the cluster.
 */
import 'reflect-metadata';
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { build } from 'vite';
import { createDataSource } from '../server/data-source.ts';
import { readConfig } from '../server/config.ts';
import { ensureChromium } from './lib/chromium.ts';
import { clusterEnv, startCluster } from './lib/pg-cluster.ts';

const log = (l: string) => console.log(`[test] ${l}`);

async function main(): Promise<number> {
  ensureChromium(log);
  const root = path.resolve(process.env.BINWRIGHT_TEST_DATA_DIR ?? '.data/test');
  const cluster = await startCluster({
    dataDir: path.join(root, 'postgres'),
    port: Number(process.env.BINWRIGHT_TEST_DB_PORT ?? 54339),
    database: 'binwright_test',
    throwaway: true,
    log,
  });
  const stop = () => cluster.stop();
  process.on('SIGINT', () => {
    stop();
    process.exit(130);
  });
  try {
    // Stored files belong to the throwaway database: start both empty.
    fs.rmSync(path.join(root, 'files'), { recursive: true, force: true });
    Object.assign(process.env, clusterEnv(cluster), {
      BINWRIGHT_DATA_DIR: path.join(root, 'files'),
      BINWRIGHT_SMTP_PORT: process.env.BINWRIGHT_TEST_SMTP_PORT ?? '2535',
      NODE_ENV: 'test',
    });
    const ds = createDataSource(readConfig());
    await ds.initialize();
    await ds.runMigrations({ transaction: 'each' });
    await ds.destroy();
    log(`Test database ready on 127.0.0.1:${cluster.port}.`);
    if (process.env.BINWRIGHT_SKIP_BUILD !== '1') {
      log('Building the client for the browser tests…');
      await build({ logLevel: 'warn', mode: 'production' });
    }
    const args = ['vitest', 'run', ...process.argv.slice(2)];
    return await new Promise<number>((resolve) => {
      const child = spawn('npx', args, { stdio: 'inherit', env: process.env });
      child.on('exit', (code) => resolve(code ?? 1));
    });
  } finally {
    stop();
  }
}

main().then(
  (code) => process.exit(code),
  (e) => {
    console.error(e);
    process.exit(1);
  },
);
