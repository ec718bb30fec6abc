import { spawnSync } from 'node:child_process';
import fs from 'node:fs';

export const CHROMIUM_PATH = process.env.BINWRIGHT_CHROMIUM ?? '/usr/bin/chromium';

/** Makes sure Debian's Chromium is present for the browser tests (apt-get when root). */
export function ensureChromium(log: (l: string) => void): void {
  if (fs.existsSync(CHROMIUM_PATH)) return;
  const root = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!root) {
    throw new Error(`Chromium was not found at ${CHROMIUM_PATH}. Install Debian's package: sudo apt-get install -y chromium (or set BINWRIGHT_CHROMIUM).`);
  }
  log('Installing Debian\'s chromium for the browser tests (one time, about a minute)…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  for (const args of [['update', '-qq'], ['install', '-y', '-qq', 'chromium']]) {
    const r = spawnSync('apt-get', args, { stdio: 'inherit', env });
    if (r.status !== 0) throw new Error(`apt-get ${args.join(' ')} failed`);
  }
}
