import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PartType } from '../../server/modules/catalog/part-type.entity.ts';
import { Supplier, SupplierPart } from '../../server/modules/suppliers/supplier.entity.ts';
import { SHOTS, startE2e, stopE2e, type E2eContext } from './helpers.ts';

let ctx: E2eContext;
const u = `K${Date.now().toString(36).toUpperCase()}`;
const PART = `KBD-${u}`;
const SPN = `KBD-SPN-${u}`;
// A format-06 supplier label as a keyboard-wedge scanner types it (<GS>/<RS>/<EOT> substitutes).
const LABEL = `[)><RS>06<GS>P${PART}<GS>1P${SPN}<GS>Q200<GS>KPO-${u}<GS>1TZ${u}<GS>10D2331<GS>4LMY<RS><EOT>`;
let containerCode = '';

beforeAll(async () => {
  ctx = await startE2e();
  const part = await ctx.ds.getRepository(PartType).save(
    ctx.ds.getRepository(PartType).create({
      partNumber: PART,
      description: 'Invented NPN small-signal for the keyboard walk',
      polarity: 'NPN',
      packageName: 'TO-92',
      hfeIcMa: 2,
      hfeVceV: 5,
      vbeIcMa: 2,
      hfeMin: 100,
      hfeMax: 300,
      vbeMinMv: 580,
      vbeMaxMv: 700,
      vbeTcMvPerC: -2,
      hfeTcPctPerC: 0.5,
      msl: 'not-classified',
      esdHbmClass: '1B',
      samplingMethod: 'attribute',
      inspectionLevel: 'II',
      aql: 1,
      matchHfePct: 5,
      matchVbeMv: 2,
      active: true,
    }),
  );
  const supplier = await ctx.ds.getRepository(Supplier).save(ctx.ds.getRepository(Supplier).create({ code: `KB${u}`.slice(0, 20), name: `Keyboard Test Distribution ${u}`, approval: 'approved', notes: null }));
  await ctx.ds.getRepository(SupplierPart).save(ctx.ds.getRepository(SupplierPart).create({ supplierId: supplier.id, supplierPartNumber: SPN, partTypeId: part.id }));
  const [c] = (await ctx.ds.query(`SELECT code FROM container ORDER BY id LIMIT 1`)) as { code: string }[];
  containerCode = c?.code ?? '';
});
afterAll(async () => {
  await stopE2e(ctx);
});

// page.evaluate code runs in Chromium; this file is checked without the DOM library.
interface FocusableEl {
  tagName: string;
  id: string;
  textContent: string | null;
  getAttribute(name: string): string | null;
  labels?: ArrayLike<{ textContent: string | null }> | null;
}
declare const document: { activeElement: FocusableEl | null };

interface Focused {
  tag: string;
  id: string;
  name: string;
  text: string;
}

/** What has the keyboard focus: element, id, accessible-ish name (aria-label or label text), text. */
const focused = (page: Page): Promise<Focused> =>
  page.evaluate(() => {
    const el = document.activeElement;
    if (!el) return { tag: '', id: '', name: '', text: '' };
    const labelled = el.getAttribute('aria-label') ?? el.labels?.[0]?.textContent ?? '';
    return { tag: el.tagName.toLowerCase(), id: el.id, name: labelled.trim(), text: (el.textContent ?? '').trim() };
  });

/** Presses Tab until `match` holds for the focused element; fails after `max` presses. */
async function tabTo(page: Page, what: string, match: (f: Focused) => boolean, max = 40): Promise<number> {
  for (let i = 1; i <= max; i++) {
    await page.keyboard.press('Tab');
    if (match(await focused(page))) return i;
  }
  throw new Error(`Tab never reached ${what} within ${max} presses (last: ${JSON.stringify(await focused(page))})`);
}

const link = (text: string | RegExp) => (f: Focused) => f.tag === 'a' && (typeof text === 'string' ? f.text === text : text.test(f.text));

describe('keyboard only: Dock → Bench → Bins', () => {
  it('an inspector signs in, receives a scanned lot, measures it with Enter, and opens a container by scan, without the mouse', async () => {
    expect(containerCode).not.toBe('');
    await ctx.browser.clearCookies();
    const page = await ctx.browser.newPage();
    await page.setViewportSize({ width: 1366, height: 768 });
    await page.goto(`${ctx.baseUrl}/sign-in`);

    // Sign-in: the e-mail field has the focus on arrival; Tab to the password; Enter signs in.
    await expect.poll(async () => (await focused(page)).name).toBe('E-mail');
    await page.keyboard.type('inspector@harrowpoint.test');
    await page.keyboard.press('Tab');
    expect((await focused(page)).name).toBe('Password');
    await page.keyboard.type('binwright-demo');
    await page.keyboard.press('Enter');
    await page.getByTestId('user-name').waitFor();

    // Dock: reach the area from the top bar; the scan field has the focus on arrival.
    await tabTo(page, 'the Dock link', link('Dock'));
    await page.keyboard.press('Enter');
    await expect.poll(async () => (await focused(page)).id).toBe('scan-field');
    await page.keyboard.type(LABEL);
    await page.keyboard.press('Enter');
    await page.getByTestId('parsed-label').waitFor();
    const form = page.getByRole('form', { name: 'Receive lot' });
    await expect.poll(() => form.getByLabel('Purchase order').inputValue()).toBe(`PO-${u}`);
    await tabTo(page, 'the Receive lot button', (f) => f.tag === 'button' && f.text === 'Receive lot');
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/dock\/lots\/\d+$/);
    const heading = page.getByRole('heading', { level: 1, name: /^Lot L-/ });
    await heading.waitFor();
    const code = (await heading.textContent())!.replace('Lot ', '');

    // Bench: the lot is in the queue; open it, start a session, record three parts with Enter.
    await tabTo(page, 'the Bench link', link('Bench'));
    await page.keyboard.press('Enter');
    await page.getByRole('link', { name: code }).waitFor();
    await tabTo(page, `the link of lot ${code}`, link(code), 60);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: new RegExp(code) }).waitFor();
    await tabTo(page, 'the Instrument field', (f) => f.tag === 'input' && f.name === 'Instrument', 60);
    await page.keyboard.press('Control+A');
    await page.keyboard.type('Bench meter K');
    await page.keyboard.press('Tab');
    expect((await focused(page)).name).toBe('Ambient °C');
    await page.keyboard.press('Control+A');
    await page.keyboard.type('24.5');
    await page.keyboard.press('Enter');
    await page.getByTestId('open-session').waitFor();
    await expect.poll(async () => (await focused(page)).name).toBe('hFE');
    const recorded = page.getByRole('table', { name: 'Readings recorded in this sitting' }).locator('tbody tr');
    for (const [i, [hfe, vbe]] of [
      ['182', '652'],
      ['201', '648'],
      ['174', '655'],
    ].entries()) {
      await page.keyboard.type(hfe);
      await page.keyboard.press('Enter');
      expect((await focused(page)).name).toMatch(/^Vbe/);
      await page.keyboard.type(vbe);
      await page.keyboard.press('Enter');
      await expect.poll(() => recorded.count()).toBe(i + 1);
      await expect.poll(async () => (await focused(page)).name).toBe('hFE');
    }
    await page.screenshot({ path: `${SHOTS}/keyboard-bench.png` });

    // Bins: from the top bar; the container scan field has the focus; Enter opens the container.
    await tabTo(page, 'the Bins link', link('Bins'), 60);
    await page.keyboard.press('Enter');
    await expect.poll(async () => (await focused(page)).id).toBe('container-scan');
    await page.keyboard.type(containerCode);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: `Container ${containerCode}` }).waitFor();
    await page.screenshot({ path: `${SHOTS}/keyboard-container.png` });
    await page.close();
  });
});
