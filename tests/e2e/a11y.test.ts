import fs from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AREAS_BY_ROLE, type Area, type Role } from '../../shared/api/roles.ts';
import { DEMO_USERS } from '../../seed/demo-users.ts';
import { SHOTS, signIn, startE2e, stopE2e, type E2eContext } from './helpers.ts';

const AXE_SOURCE = fs.readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
const WIDE = { width: 1366, height: 768 };
const NARROW = { width: 390, height: 844 };

let ctx: E2eContext;
/** Every page of the app, with the area it belongs to (null: any signed-in role). */
let pages: { name: string; path: string; area: Area | null }[] = [];

async function firstId(sql: string): Promise<number | null> {
  try {
    const rows = (await ctx.ds.query(sql)) as { id: number }[];
    return rows[0]?.id ?? null;
  } catch {
    return null; // the table of an area that is not built yet
  }
}

beforeAll(async () => {
  ctx = await startE2e();
  const lot = await firstId(`SELECT id FROM lot ORDER BY id LIMIT 1`);
  const benchLot = await firstId(`SELECT id FROM lot WHERE status IN ('received','inspecting','awaiting-signature') ORDER BY id LIMIT 1`);
  const container = await firstId(`SELECT id FROM container ORDER BY id LIMIT 1`);
  const part = await firstId(`SELECT id FROM part_type ORDER BY id LIMIT 1`);
  const supplier = await firstId(`SELECT id FROM supplier ORDER BY id LIMIT 1`);
  const kit = await firstId(`SELECT id FROM kit_request ORDER BY id LIMIT 1`);
  const ncr = await firstId(`SELECT id FROM ncr ORDER BY id LIMIT 1`);
  const all: ({ name: string; path: string; area: Area | null } | null)[] = [
    { name: 'home', path: '/', area: null },
    { name: 'dock', path: '/dock', area: 'dock' },
    lot && { name: 'dock-lot', path: `/dock/lots/${lot}`, area: 'dock' },
    { name: 'bench-queue', path: '/bench', area: 'bench' },
    benchLot && { name: 'bench-lot', path: `/bench/lots/${benchLot}`, area: 'bench' },
    { name: 'bins', path: '/bins', area: 'bins' },
    container && { name: 'bins-container', path: `/bins/containers/${container}`, area: 'bins' },
    { name: 'pairing', path: '/pairing', area: 'pairing' },
    kit && { name: 'pairing-kit', path: `/pairing/kits/${kit}`, area: 'pairing' },
    { name: 'pairing-loose-parts', path: '/pairing/loose-parts', area: 'pairing' },
    { name: 'pairing-fit-for-use', path: '/pairing/fit-for-use', area: 'pairing' },
    { name: 'suppliers', path: '/suppliers', area: 'suppliers' },
    supplier && { name: 'suppliers-scorecard', path: `/suppliers/${supplier}`, area: 'suppliers' },
    { name: 'suppliers-ncrs', path: '/suppliers/ncrs', area: 'suppliers' },
    ncr && { name: 'suppliers-ncr', path: `/suppliers/ncrs/${ncr}`, area: 'suppliers' },
    { name: 'suppliers-planning', path: '/suppliers/planning', area: 'suppliers' },
    { name: 'catalog', path: '/catalog', area: 'catalog' },
    part && { name: 'catalog-part-type', path: `/catalog/part-types/${part}`, area: 'catalog' },
    { name: 'catalog-suppliers', path: '/catalog/suppliers', area: 'catalog' },
    supplier && { name: 'catalog-supplier', path: `/catalog/suppliers/${supplier}`, area: 'catalog' },
    { name: 'admin-users', path: '/admin/users', area: 'admin' },
    { name: 'admin-audit', path: '/admin/audit', area: 'admin' },
    { name: 'admin-mail', path: '/admin/mail', area: 'admin' },
    { name: 'not-found', path: '/no-such-page', area: null },
  ];
  pages = all.filter((p): p is { name: string; path: string; area: Area | null } => Boolean(p));
});

afterAll(async () => {
  await stopE2e(ctx);
});

interface Violation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[]; html: string }[];
}

/** Waits for the page's own content: a level-1 heading and no loading indicator left. */
async function settled(page: Page) {
  await page.locator('main h1').first().waitFor({ timeout: 15_000 });
  await page
    .waitForFunction(() => ![...document.querySelectorAll('[role=status]')].some((el) => /Loading|Checking/.test(el.textContent ?? '')), undefined, { timeout: 10_000 })
    .catch(() => {});
  await page.waitForLoadState('networkidle', { timeout: 3_000 }).catch(() => {});
}

async function seriousViolations(page: Page): Promise<Violation[]> {
  // The app's CSP (script-src 'self') refuses an injected <script> (addScriptTag), which is right;
  // evaluating the source through the DevTools protocol is not subject to it.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  const result = (await page.evaluate(() =>
    (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: Violation[] }> } }).axe.run(document, { resultTypes: ['violations'] }),
  )) as { violations: Violation[] };
  return result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}

const describeViolations = (where: string, vs: Violation[]) =>
  vs.map((v) => `${where}: [${v.impact}] ${v.id} — ${v.help}\n    ${v.nodes.slice(0, 3).map((n) => `${n.target.join(' ')}  ${n.html.slice(0, 120)}`).join('\n    ')}`);

/** The document's width beyond the viewport (horizontal scrolling of the whole page), px. */
const overflow = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);

describe('accessibility (axe-core) and layout of every page, for every demo role', () => {
  for (const demo of DEMO_USERS) {
    it(`${demo.role}: no serious or critical axe violations at 1366×768 and 390×844; no page scrolls sideways when narrow`, async () => {
      const role = demo.role as Role;
      const mine = pages.filter((p) => p.area === null || AREAS_BY_ROLE[role].includes(p.area));
      const page = await signIn(ctx, demo.email);
      await page.getByTestId('user-name').waitFor();
      const problems: string[] = [];
      for (const p of mine) {
        for (const [label, size] of [
          ['wide', WIDE],
          ['narrow', NARROW],
        ] as const) {
          await page.setViewportSize(size);
          await page.goto(`${ctx.baseUrl}${p.path}`);
          await settled(page);
          problems.push(...describeViolations(`${p.path} (${role}, ${label})`, await seriousViolations(page)));
          if (label === 'narrow') {
            const extra = await overflow(page);
            if (extra > 1) problems.push(`${p.path} (${role}, narrow): the page is ${extra}px wider than the 390px screen`);
          }
          // Every page at both widths, once (the quality engineer reaches them all); the other roles' narrow views too.
          if (role === 'quality' || label === 'narrow') await page.screenshot({ path: `${SHOTS}/a11y-${p.name}-${label}${role === 'quality' ? '' : `-${role}`}.png`, fullPage: label === 'wide' });
        }
      }
      await page.close();
      expect(problems, problems.join('\n')).toEqual([]);
    }, 300_000);
  }

  it('the sign-in page has no serious or critical violations either', async () => {
    await ctx.browser.clearCookies();
    const page = await ctx.browser.newPage();
    for (const [label, size] of [
      ['wide', WIDE],
      ['narrow', NARROW],
    ] as const) {
      await page.setViewportSize(size);
      await page.goto(`${ctx.baseUrl}/sign-in`);
      await page.getByRole('heading', { name: 'Sign in' }).waitFor();
      const vs = await seriousViolations(page);
      expect(vs, describeViolations(`/sign-in (${label})`, vs).join('\n')).toEqual([]);
      await page.screenshot({ path: `${SHOTS}/a11y-sign-in-${label}.png` });
    }
    await page.close();
  });
});
