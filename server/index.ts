import 'reflect-metadata';
import path from 'node:path';
import { createApp } from './app.ts';
import { readConfig } from './config.ts';
import { createDataSource } from './data-source.ts';
import { tuneGarbageCollector } from './gc-tuning.ts';
import { releaseExpiredKits } from './modules/pairing/kit-expiry.ts';

/**
 * Runs the server against an already running database (see scripts/start.ts for the full
 * one-command start): initialise the DataSource, apply migrations, listen.
 */
async function main() {
  tuneGarbageCollector();
  const config = readConfig();
  const ds = createDataSource(config);
  await ds.initialize();
  await ds.runMigrations({ transaction: 'each' });
  const app = createApp({ dataSource: ds, config, clientDir: path.resolve('dist') });
  const server = app.listen(config.port, '127.0.0.1', () => console.log(`Binwright API on http://127.0.0.1:${config.port}`));
  // Pairing: expired kit reservations go back to stock once a minute (reads release them too).
  const sweep = setInterval(() => void releaseExpiredKits(ds).catch((e) => console.error('[binwright] kit expiry sweep', e)), 60_000);
  sweep.unref();
  const shutdown = () => {
    clearInterval(sweep);
    server.close(() => void ds.destroy().then(() => process.exit(0)));
  };
  process.on('SIGINT', shutdown);
  process.on('SIGTERM', shutdown);
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
