import fs from 'node:fs';
import type { Server } from 'node:http';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import type { DataSource } from 'typeorm';
import { createApp } from '../../server/app.ts';
import { readConfig } from '../../server/config.ts';
import { createDataSource } from '../../server/data-source.ts';
import { seedDemo } from '../../seed/demo.ts';

export const CHROMIUM = process.env.BINWRIGHT_CHROMIUM ?? '/usr/bin/chromium';
export const SHOTS = path.resolve('test-results/screens');

export interface E2eContext {
  ds: DataSource;
  server: Server;
  baseUrl: string;
  browser: BrowserContext;
}

/** The built client served by the real server on the throwaway database, plus headless Chromium. */
export async function startE2e(): Promise<E2eContext> {
  const clientDir = path.resolve(process.env.BINWRIGHT_DIST_DIR ?? 'dist');
  if (!fs.existsSync(path.join(clientDir, 'index.html'))) throw new Error(`No built client in ${clientDir}: run through npm test.`);
  const ds = createDataSource(readConfig());
  await ds.initialize();
  await seedDemo(ds);
  const app = createApp({ dataSource: ds, clientDir });
  const server = await new Promise<Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  const profile = fs.mkdtempSync(path.join(process.env.TMPDIR ?? '/tmp', 'bw-chromium-'));
  const browser = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1366, height: 860 },
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  fs.mkdirSync(SHOTS, { recursive: true });
  return { ds, server, baseUrl: `http://127.0.0.1:${port}`, browser };
}

export async function stopE2e(ctx: E2eContext | undefined): Promise<void> {
  if (!ctx) return;
  await ctx.browser.close();
  await new Promise<void>((r) => ctx.server.close(() => r()));
  ctx.server.closeAllConnections?.();
  await ctx.ds.destroy();
}

/** Signs in through the sign-in page in a fresh page with its own cookies cleared. */
export async function signIn(ctx: E2eContext, email: string, password = 'binwright-demo'): Promise<Page> {
  await ctx.browser.clearCookies();
  const page = await ctx.browser.newPage();
  await page.goto(`${ctx.baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  return page;
}
