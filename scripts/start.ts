/**
 * `npm start`: project-local PostgreSQL → migrations → demo scenario (first start) → mail sink →
 * client build → one Express server. Ctrl-C or SIGTERM stops all of it, the database included.
 */
import path from 'node:path';
import type { Server } from 'node:http';
import { build } from 'vite';
import { createApp } from '../server/app.ts';
import { tuneGarbageCollector } from '../server/gc-tuning.ts';
import { releaseExpiredKits } from '../server/modules/pairing/kit-expiry.ts';
import { bootBackend, closeServer, log, printBanner, reportStartError } from './lib/boot.ts';

async function main() {
  tuneGarbageCollector();
  const b = await bootBackend();
  try {
    const clientDir = path.resolve(process.env.BINWRIGHT_DIST_DIR ?? 'dist');
    if (process.env.BINWRIGHT_SKIP_BUILD !== '1') {
      log('Building the client…');
      await build({ logLevel: 'warn', mode: 'production' });
    }
    const app = createApp({ dataSource: b.ds, config: b.config, clientDir });
    const server = await new Promise<Server>((resolve, reject) => {
      const s = app.listen(b.config.port, b.host, () => resolve(s));
      s.once('error', reject);
    });
    b.onStop(() => closeServer(server));
    // Pairing: expired kit reservations go back to stock once a minute (reads release them too).
    const sweep = setInterval(() => void releaseExpiredKits(b.ds).catch((e) => console.error('[binwright] kit expiry sweep', e)), 60_000);
    sweep.unref();
    b.onStop(() => clearInterval(sweep));
    printBanner(`http://${b.host === '0.0.0.0' ? 'localhost' : b.host}:${b.config.port}/`);
  } catch (e) {
    reportStartError(e);
    process.kill(process.pid, 'SIGTERM');
  }
}

main().catch(() => process.exit(1));
