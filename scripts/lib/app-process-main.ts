/**
 * Entry of a separate server process (see app-process.ts): the app on an already migrated
 * database, listening on 127.0.0.1 at PORT (0 picks a free port). Prints one line
 * `{"listening":<port>}` when it accepts connections. Used by the load bench (so the load
 * generator and the server do not share one event loop) and by the fault tests (so the server
 * can be killed with SIGKILL).
 */
import 'reflect-metadata';
import type { AddressInfo } from 'node:net';
import { createApp } from '../../server/app.ts';
import { readConfig } from '../../server/config.ts';
import { createDataSource } from '../../server/data-source.ts';
import { tuneGarbageCollector } from '../../server/gc-tuning.ts';

async function main() {
  tuneGarbageCollector();
  const config = readConfig();
  const ds = createDataSource(config);
  await ds.initialize();
  const app = createApp({ dataSource: ds, config });
  const server = app.listen(config.port, '127.0.0.1', () => {
    process.stdout.write(`${JSON.stringify({ listening: (server.address() as AddressInfo).port })}\n`);
  });
  const stop = () => {
    server.close(() => void ds.destroy().finally(() => process.exit(0)));
    server.closeAllConnections();
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
