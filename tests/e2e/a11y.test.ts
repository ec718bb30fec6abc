import fs from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '../../shared/api/auth.ts';
import { AREAS_BY_ROLE, type Area, type Role } from '../../shared/api/roles.ts';
import { pullKitPart, reserveKit } from '../../server/modules/pairing/kits.service.ts';
import { DEMO_USERS } from '../../seed/demo-users.ts';
import { makePairingPartType, makeStockLot, setLocation } from '../server/pairing-fixtures.ts';
import { SHOTS, signIn, startE2e, stopE2e, type E2eContext } from './helpers.ts';

// Browser-side code inside page.evaluate runs in Chromium. This file is type-checked without the
// DOM library (server tsconfig), so the few browser names it uses are declared here.
interface BrowserEl {
  tagName: string;
  textContent: string | null;
  getAttribute(name: string): string | null;
  getBoundingClientRect(): { right: number; width: number };
}
declare const document: { documentElement: { scrollWidth: number; clientWidth: number }; querySelectorAll(selector: string): Iterable<BrowserEl> };
declare const window: { scrollX: number };
declare function requestAnimationFrame(callback: () => void): number;

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

/**
 * A kit being picked (one part pulled, long storage locations) from a lot of its own, so the kit
 * page with its scan field and the lot page with its kits are checked whatever else the database
 * holds: the demo seed makes no kits.
 */
async function kitInProgress(): Promise<{ kitId: number; lotId: number }> {
  const pt = await makePairingPartType(ctx.ds, { matchHfePct: 3, matchVbeMv: 1, prefix: 'A11Y' });
  const stock = await makeStockLot(
    ctx.ds,
    pt,
    [100, 140, 180, 220].flatMap((h, i) => [
      { hfe: h, vbeMv: 640 + i * 5 },
      { hfe: h * 1.01, vbeMv: 640.3 + i * 5 },
    ]),
    { capacity: 4, location: 'ESD cabinet 12, drawer 3, left-hand tray' },
  );
  await setLocation(ctx.ds, stock.containers[1]!.id, 'ESD cabinet 3, drawer 1, right-hand tray');
  const [u] = (await ctx.ds.query(`SELECT id, email, name, role FROM app_user WHERE email = 'assembler@harrowpoint.test'`)) as SessionUser[];
  const kit = await reserveKit(ctx.ds, u!, { partTypeId: pt.partTypeId, mode: 'same', setSize: 2, setsWanted: 3, note: 'Accessibility check' });
  const first = kit.pickList[0]!;
  await pullKitPart(ctx.ds, u!, kit.id, { containerCode: first.containerCode, position: first.position });
  return { kitId: kit.id, lotId: stock.lotId };
}

beforeAll(async () => {
  ctx = await startE2e();
  for (const f of fs.readdirSync(SHOTS)) if (/^a11y-.*\.png$/.test(f)) fs.rmSync(`${SHOTS}/${f}`);
  const picking = await kitInProgress();
  const lot = await firstId(`SELECT id FROM lot ORDER BY id LIMIT 1`);
  const benchLot = await firstId(`SELECT id FROM lot WHERE status IN ('received','inspecting','awaiting-signature') ORDER BY id LIMIT 1`);
  const container = await firstId(`SELECT id FROM container ORDER BY id LIMIT 1`);
  const part = await firstId(`SELECT id FROM part_type ORDER BY id LIMIT 1`);
  const supplier = await firstId(`SELECT id FROM supplier ORDER BY id LIMIT 1`);
  const ncr = await firstId(`SELECT id FROM ncr ORDER BY id LIMIT 1`);
  const all: ({ name: string; path: string; area: Area | null } | null)[] = [
    { name: 'home', path: '/', area: null },
    { name: 'dock', path: '/dock', area: 'dock' },
    lot ? { name: 'dock-lot', path: `/dock/lots/${lot}`, area: 'dock' } : null,
    { name: 'dock-lot-kits', path: `/dock/lots/${picking.lotId}`, area: 'dock' },
    { name: 'bench-queue', path: '/bench', area: 'bench' },
    benchLot ? { name: 'bench-lot', path: `/bench/lots/${benchLot}`, area: 'bench' } : null,
    { name: 'bins', path: '/bins', area: 'bins' },
    container ? { name: 'bins-container', path: `/bins/containers/${container}`, area: 'bins' } : null,
    { name: 'pairing', path: '/pairing', area: 'pairing' },
    { name: 'pairing-kit', path: `/pairing/kits/${picking.kitId}`, area: 'pairing' },
    { name: 'pairing-loose-parts', path: '/pairing/loose-parts', area: 'pairing' },
    { name: 'pairing-fit-for-use', path: '/pairing/fit-for-use', area: 'pairing' },
    { name: 'suppliers', path: '/suppliers', area: 'suppliers' },
    supplier ? { name: 'suppliers-scorecard', path: `/suppliers/${supplier}`, area: 'suppliers' } : null,
    { name: 'suppliers-ncrs', path: '/suppliers/ncrs', area: 'suppliers' },
    ncr ? { name: 'suppliers-ncr', path: `/suppliers/ncrs/${ncr}`, area: 'suppliers' } : null,
    { name: 'suppliers-planning', path: '/suppliers/planning', area: 'suppliers' },
    { name: 'catalog', path: '/catalog', area: 'catalog' },
    part ? { name: 'catalog-part-type', path: `/catalog/part-types/${part}`, area: 'catalog' } : null,
    { name: 'catalog-suppliers', path: '/catalog/suppliers', area: 'catalog' },
    supplier ? { name: 'catalog-supplier', path: `/catalog/suppliers/${supplier}`, area: 'catalog' } : null,
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
async function settled(page: Page): Promise<boolean> {
  try {
    await page.locator('main h1').first().waitFor({ timeout: 10_000 });
  } catch {
    return false;
  }
  await page
    .waitForFunction(() => ![...document.querySelectorAll('[role=status]')].some((el) => /Loading|Checking/.test(el.textContent ?? '')), undefined, { timeout: 10_000 })
    .catch(() => {});
  return true;
}

async function seriousViolations(page: Page): Promise<Violation[]> {
  // The app's CSP (script-src 'self') refuses an injected <script> (addScriptTag), which is right;
  // evaluating the source through the DevTools protocol is not subject to it.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  const result = (await page.evaluate(() =>
    (window as unknown as { axe: { run: (ctx: unknown, o: object) => Promise<{ violations: Violation[] }> } }).axe.run(document, { resultTypes: ['violations'] }),
  )) as { violations: Violation[] };
  return result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}

const describeViolations = (where: string, vs: Violation[]) =>
  vs.map((v) => `${where}: [${v.impact}] ${v.id} — ${v.help}\n    ${v.nodes.slice(0, 3).map((n) => `${n.target.join(' ')}  ${n.html.slice(0, 120)}`).join('\n    ')}`);

/**
 * The document's width beyond the viewport (horizontal scrolling of the whole page), px, and the
 * elements that reach furthest right (for the failure message).
 */
const overflow = (page: Page) =>
  page.evaluate(() => {
    const width = document.documentElement.clientWidth;
    const extra = document.documentElement.scrollWidth - width;
    // The elements whose right edge is the page's right edge: they set its width.
    const edge = document.documentElement.scrollWidth;
    const far = [...document.querySelectorAll('body *')]
      .map((el) => ({ el, right: el.getBoundingClientRect().right + window.scrollX }))
      .filter((x) => x.right > width + 1 && Math.abs(x.right - edge) <= 2)
      .slice(-3);
    const describe = ({ el, right }: { el: BrowserEl; right: number }) =>
      `<${el.tagName.toLowerCase()} class="${(el.getAttribute('class') ?? '').slice(0, 60)}">${(el.textContent ?? '').trim().slice(0, 20)}… ends at ${Math.round(right)}px`;
    return { extra, culprits: far.map(describe) };
  });

describe('accessibility (axe-core) and layout of every page, for every demo role', () => {
  const report: string[] = [];
  afterAll(() => {
    fs.writeFileSync(`${SHOTS}/a11y-problems.txt`, report.length ? report.join('\n') : 'none\n');
  });

  for (const demo of DEMO_USERS) {
    const role = demo.role as Role;
    // The quality engineer reaches every page: checked and photographed at both widths. The other
    // roles see the same pages with fewer actions: checked at the wide size.
    const sizes = role === 'quality' ? ([['wide', WIDE], ['narrow', NARROW]] as const) : ([['wide', WIDE]] as const);
    it(`${role}: every page of the role has no serious or critical axe violations${role === 'quality' ? ' at 1366×768 and 390×844, and none scrolls sideways when narrow' : ''}`, async () => {
      const mine = pages.filter((p) => p.area === null || AREAS_BY_ROLE[role].includes(p.area));
      const page = await signIn(ctx, demo.email);
      await page.getByTestId('user-name').waitFor();
      const problems: string[] = [];
      for (const p of mine) {
        await page.setViewportSize(WIDE);
        await page.goto(`${ctx.baseUrl}${p.path}`);
        if (!(await settled(page))) {
          problems.push(`${p.path} (${role}): no level-1 heading within 10 s`);
          await page.screenshot({ path: `${SHOTS}/a11y-${p.name}-broken-${role}.png` });
          continue;
        }
        for (const [label, size] of sizes) {
          await page.setViewportSize(size);
          // Let layout and ResizeObserver callbacks (ScrollBox) run after the resize.
          await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => setTimeout(r, 50)))));
          problems.push(...describeViolations(`${p.path} (${role}, ${label})`, await seriousViolations(page)));
          if (label === 'narrow') {
            const { extra, culprits } = await overflow(page);
            if (extra > 1) problems.push(`${p.path} (${role}, narrow): the page is ${extra}px wider than the 390px screen: ${culprits.join('; ')}`);
          }
          if (role === 'quality') await page.screenshot({ path: `${SHOTS}/a11y-${p.name}-${label}.png`, fullPage: true });
        }
      }
      await page.close();
      report.push(...problems);
      // No exceptions: any serious or critical finding, or sideways scrolling, fails.
      expect(problems, problems.join('\n')).toEqual([]);
    }, 240_000);
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
      const vs = describeViolations(`/sign-in (${label})`, await seriousViolations(page));
      report.push(...vs);
      expect(vs, vs.join('\n')).toEqual([]);
      await page.screenshot({ path: `${SHOTS}/a11y-sign-in-${label}.png` });
    }
    await page.close();
  });
});
