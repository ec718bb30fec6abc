/**
 * `npm run dev`: the same backend as `npm start`, plus Vite's dev server with HMR that proxies
 * /api to Express. Server code changes need a restart.
 */
import type { Server } from 'node:http';
import { createServer } from 'vite';
import { createApp } from '../server/app.ts';
import { bootBackend, closeServer, printBanner, reportStartError } from './lib/boot.ts';

async function main() {
  const b = await bootBackend();
  try {
    const app = createApp({ dataSource: b.ds, config: b.config });
    const server = await new Promise<Server>((resolve, reject) => {
      const s = app.listen(b.config.port, '127.0.0.1', () => resolve(s));
      s.once('error', reject);
    });
    b.onStop(() => closeServer(server));
    const vite = await createServer({ server: { host: b.host } });
    await vite.listen();
    b.onStop(() => vite.close());
    const url = vite.resolvedUrls?.local[0] ?? 'http://localhost:5173/';
    printBanner(url, [`API on http://127.0.0.1:${b.config.port}/api (proxied by Vite)`]);
  } catch (e) {
    reportStartError(e);
    process.kill(process.pid, 'SIGTERM');
  }
}

main().catch(() => process.exit(1));
