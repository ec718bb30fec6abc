import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '../../shared/api/auth.ts';
import { PartType } from '../../server/modules/catalog/part-type.entity.ts';
import { cancelKit, reserveKit } from '../../server/modules/pairing/kits.service.ts';
import { Supplier, SupplierPart } from '../../server/modules/suppliers/supplier.entity.ts';
import { makePairingPartType, makeStockLot, type StockLot } from '../server/pairing-fixtures.ts';
import { SHOTS, startE2e, stopE2e, type E2eContext } from './helpers.ts';
import { inventedBenchNpn } from '../../scripts/lib/bench-fixtures.ts';

let ctx: E2eContext;
const u = `K${Date.now().toString(36).toUpperCase()}`;
const PART = `KBD-${u}`;
const SPN = `KBD-SPN-${u}`;
// A format-06 supplier label as a keyboard-wedge scanner types it (<GS>/<RS>/<EOT> substitutes).
const LABEL = `[)><RS>06<GS>P${PART}<GS>1P${SPN}<GS>Q200<GS>KPO-${u}<GS>1TZ${u}<GS>10D2331<GS>4LMY<RS><EOT>`;
let containerCode = '';
let stock: StockLot;

beforeAll(async () => {
  ctx = await startE2e();
  const part = await ctx.ds.getRepository(PartType).save(
    ctx.ds.getRepository(PartType).create({
      ...inventedBenchNpn(PART, 'Invented NPN small-signal for the keyboard walk'),
      hfeMin: 100,
      hfeMax: 300,
    }),
  );
  const supplier = await ctx.ds.getRepository(Supplier).save(ctx.ds.getRepository(Supplier).create({ code: `KB${u}`.slice(0, 20), name: `Keyboard Test Distribution ${u}`, approval: 'approved', notes: null }));
  await ctx.ds.getRepository(SupplierPart).save(ctx.ds.getRepository(SupplierPart).create({ supplierId: supplier.id, supplierPartNumber: SPN, partTypeId: part.id }));
  const [c] = (await ctx.ds.query(`SELECT code FROM container ORDER BY id LIMIT 1`)) as { code: string }[];
  containerCode = c?.code ?? '';
  // Screened stock for the Pairing walk: three clean pairs (1 % hFE, 0.2 mV apart), far from each other.
  const pt = await makePairingPartType(ctx.ds, { matchHfePct: 3, matchVbeMv: 1, prefix: `KBP${u}` });
  stock = await makeStockLot(
    ctx.ds,
    pt,
    [120, 180, 240].flatMap((h, i) => [
      { hfe: h, vbeMv: 645 + i * 5 },
      { hfe: h * 1.01, vbeMv: 645.2 + i * 5 },
    ]),
    { capacity: 6, location: 'Cabinet 4, drawer 2' },
  );
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
  getBoundingClientRect(): { width: number; height: number };
}
declare const document: { activeElement: FocusableEl | null; body: FocusableEl };
declare function getComputedStyle(el: FocusableEl): { outlineStyle: string; outlineWidth: string; boxShadow: string };

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

/**
 * Whether the keyboard focus can be seen: something has the focus (not the page itself), it has a
 * size, and it draws an outline or a ring (box-shadow) — the app's two focus indicators.
 */
const focusShown = (page: Page): Promise<{ shown: boolean; what: string }> =>
  page.evaluate(() => {
    const el = document.activeElement;
    if (!el || el === document.body) return { shown: false, what: 'nothing (the page has the focus)' };
    const cs = getComputedStyle(el);
    const box = el.getBoundingClientRect();
    const outline = cs.outlineStyle !== 'none' && parseFloat(cs.outlineWidth) >= 1;
    const ring = cs.boxShadow !== 'none' && cs.boxShadow !== '';
    return { shown: box.width > 0 && box.height > 0 && (outline || ring), what: `<${el.tagName.toLowerCase()} id="${el.id}"> outline ${cs.outlineStyle} ${cs.outlineWidth}, shadow ${cs.boxShadow}` };
  });

/** The focus is on `what` and can be seen. */
async function expectFocus(page: Page, what: string, match: (f: Focused) => boolean): Promise<void> {
  await expect.poll(async () => match(await focused(page)), { message: `focus should be on ${what}; it is on ${JSON.stringify(await focused(page))}` }).toBe(true);
  const seen = await focusShown(page);
  expect(seen.shown, `the focus on ${what} is not visible: ${seen.what}`).toBe(true);
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
    await expectFocus(page, 'the Dock scan field', (f) => f.id === 'scan-field');
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
    await expectFocus(page, 'the Instrument field', (f) => f.name === 'Instrument');
    await page.keyboard.press('Control+A');
    await page.keyboard.type('Bench meter K');
    await page.keyboard.press('Tab');
    expect((await focused(page)).name).toBe('Ambient °C');
    await page.keyboard.press('Control+A');
    await page.keyboard.type('24.5');
    await page.keyboard.press('Enter');
    await page.getByTestId('open-session').waitFor();
    await expectFocus(page, 'the hFE field', (f) => f.name === 'hFE');
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
    await expectFocus(page, 'the container scan field', (f) => f.id === 'container-scan');
    await page.keyboard.type(containerCode);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: `Container ${containerCode}` }).waitFor();
    await page.screenshot({ path: `${SHOTS}/keyboard-container.png` });
    await page.close();
  });
});

describe('keyboard only: Pairing', () => {
  it('an assembler plans a kit from stock, reserves it and pulls it by typing the scanned codes, and always sees where the focus is', async () => {
    await ctx.browser.clearCookies();
    const page = await ctx.browser.newPage();
    await page.setViewportSize({ width: 1366, height: 768 });
    await page.goto(`${ctx.baseUrl}/sign-in`);
    await expectFocus(page, 'the E-mail field', (f) => f.name === 'E-mail');
    await page.keyboard.type('assembler@harrowpoint.test');
    await page.keyboard.press('Tab');
    await expectFocus(page, 'the Password field', (f) => f.name === 'Password');
    await page.keyboard.type('binwright-demo');
    await page.keyboard.press('Enter');
    await page.getByTestId('user-name').waitFor();

    // Pairing from the top bar.
    await tabTo(page, 'the Pairing link', link('Pairing'));
    await expectFocus(page, 'the Pairing link', link('Pairing'));
    await page.keyboard.press('Enter');
    const form = page.getByRole('form', { name: 'Matched-set request' });
    await form.waitFor();

    // The part type: Tab to the select and type the part number (the select's own type-ahead).
    await tabTo(page, 'the Part type select', (f) => f.tag === 'select' && f.name === 'Part type', 60);
    await expectFocus(page, 'the Part type select', (f) => f.name === 'Part type');
    await page.keyboard.type(stock.partNumber);
    await expect.poll(() => form.getByLabel('Part type').inputValue()).toBe(String(stock.partTypeId));
    // Tolerances come from the part type.
    expect(await form.getByLabel('hFE tolerance t (%)').inputValue()).toBe('3');
    await tabTo(page, 'the Sets wanted field', (f) => f.tag === 'input' && f.name === 'Sets wanted');
    await expectFocus(page, 'the Sets wanted field', (f) => f.name === 'Sets wanted');
    await page.keyboard.press('Control+A');
    await page.keyboard.type('2');
    // Enter plans; the focus moves to the answer, so it is read out and Tab goes on to reserving.
    await page.keyboard.press('Enter');
    await page.getByTestId('sets-possible').getByText('3 pairs possible').waitFor();
    await expectFocus(page, 'the plan result', (f) => /3 pairs possible/.test(f.text));
    await page.screenshot({ path: `${SHOTS}/keyboard-pairing-plan.png` });

    // Reserve: Tab to the note, type it, Enter reserves; the kit page opens with the scan field focused.
    const presses = await tabTo(page, 'the reservation note', (f) => f.tag === 'input' && f.name === 'Note (optional)');
    expect(presses, 'the note is a few Tab presses after the plan result').toBeLessThanOrEqual(4);
    await expectFocus(page, 'the reservation note', (f) => f.name === 'Note (optional)');
    await page.keyboard.type('Keyboard walk');
    // Meanwhile another assembler reserves two of the three pairs: Enter is refused, and the focus
    // goes to why (not to the page, as the busy Reserve button would leave it).
    const [other] = (await ctx.ds.query(`SELECT id, email, name, role FROM app_user WHERE email = 'assembler@harrowpoint.test'`)) as SessionUser[];
    const taken = await reserveKit(ctx.ds, other!, { partTypeId: stock.partTypeId, mode: 'same', setSize: 2, setsWanted: 2, note: 'Taken meanwhile' });
    await page.keyboard.press('Enter');
    await page.getByTestId('reserve-refused').getByText('Nothing was reserved', { exact: true }).waitFor();
    await expectFocus(page, 'the refusal', (f) => /Nothing was reserved/.test(f.text) && /only 1 of the 2 sets/.test(f.text));
    await page.getByText(/at most 1 set can be made now$/).waitFor(); // the Sets wanted field says it too
    await page.screenshot({ path: `${SHOTS}/keyboard-pairing-refused.png` });
    // That kit is cancelled; Tab goes on from the refusal to the note, and Enter reserves.
    await cancelKit(ctx.ds, other!, taken.id, { reason: 'Keyboard walk: given back' });
    await tabTo(page, 'the reservation note again', (f) => f.tag === 'input' && f.name === 'Note (optional)');
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/pairing\/kits\/\d+$/);
    await page.getByRole('heading', { level: 1, name: /^Kit KIT-/ }).waitFor();
    await expectFocus(page, 'the container scan field', (f) => f.id === 'pull-scan');
    await page.getByTestId('pull-progress').getByText('0 of 4 pulled').waitFor();

    for (let i = 1; i <= 4; i++) {
      const next = (await page.getByTestId('next-pick').textContent()) ?? '';
      const m = /(C-\d{8}-\d{4}) position (\d+)/.exec(next);
      expect(m, next).not.toBeNull();
      if (i === 2) {
        // A label that carries the position too ("C-…/7") pulls in one scan.
        await page.keyboard.type(`${m![1]}/${m![2]}`);
        await page.keyboard.press('Enter');
      } else {
        // The container code as a scanner types it, Enter: the position field takes the focus.
        await page.keyboard.type(m![1]!);
        await page.keyboard.press('Enter');
        await expectFocus(page, 'the position field', (f) => f.id === 'pull-position');
        await page.keyboard.type(m![2]!);
        await page.keyboard.press('Enter');
      }
      await page.getByTestId('pull-progress').getByText(`${i} of 4 pulled`).waitFor();
      if (i < 4) await expectFocus(page, 'the container scan field, ready for the next part', (f) => f.id === 'pull-scan');
      if (i === 3) await page.screenshot({ path: `${SHOTS}/keyboard-pairing-pulling.png` });
    }

    // The last pull completes the kit: the scan field goes away and the focus moves to the news,
    // with printing the kit label the next Tab.
    await page.getByText('Kit complete').waitFor();
    await expectFocus(page, 'the kit-complete notice', (f) => /Kit complete/.test(f.text));
    await page.keyboard.press('Tab');
    await expectFocus(page, 'the kit label link', (f) => f.tag === 'a' && f.text === 'Print the kit label');
    await page.screenshot({ path: `${SHOTS}/keyboard-pairing-complete.png` });
    // The lot's kits: the one taken meanwhile, cancelled; the one reserved and pulled here.
    const kits = (await ctx.ds.query(
      `SELECT k.id, k.status FROM kit_request k WHERE EXISTS (SELECT 1 FROM kit_part kp WHERE kp.kit_id = k.id AND kp.lot_id = $1) ORDER BY k.id`,
      [stock.lotId],
    )) as { id: number; status: string }[];
    const shown = Number(/\/pairing\/kits\/(\d+)$/.exec(page.url())![1]);
    expect(kits.map((k) => [k.id === shown ? 'this walk' : 'taken meanwhile', k.status])).toEqual([
      ['taken meanwhile', 'cancelled'],
      ['this walk', 'pulled'],
    ]);
    await page.close();
  });
});
