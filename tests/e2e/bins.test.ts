import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { SHOTS, signIn, startE2e, stopE2e, type E2eContext } from './helpers.ts';

let ctx: E2eContext;
let lotId: number;
let partNumber: string;
let lotCode: string;
const u = Date.now().toString(36).toUpperCase();

// Ten parts, five per bin: A is [100, 200), B is [200, 300] (half-open, the last bin closed).
const HFES = [120, 210, 135, 250, 199.9, 200, 160, 280, 110, 300];

beforeAll(async () => {
  ctx = await startE2e();
  partNumber = `BINS-E2E-${u}`;
  lotCode = `L-BE2E-${u}`;
  const [supplier] = (await ctx.ds.query(`INSERT INTO supplier (code, name) VALUES ($1, $2) RETURNING id`, [`BN${u}`.slice(0, 20), `Fernhill Test Components ${u}`])) as { id: number }[];
  const [part] = (await ctx.ds.query(
    `INSERT INTO part_type (part_number, description, polarity, package, hfe_ic_ma, hfe_vce_v, vbe_ic_ma, hfe_min, hfe_max, vbe_min_mv, vbe_max_mv, esd_hbm_class)
     VALUES ($1, 'Invented NPN for the Bins test', 'NPN', 'TO-92', 2, 5, 2, 100, 300, 550, 750, '1B') RETURNING id`,
    [partNumber],
  )) as { id: number }[];
  const [scheme] = (await ctx.ds.query(`INSERT INTO gain_bin_scheme (part_type_id, version) VALUES ($1, 1) RETURNING id`, [part?.id])) as { id: number }[];
  await ctx.ds.query(`INSERT INTO gain_bin (scheme_id, position, code, label, hfe_min, hfe_max) VALUES ($1, 0, 'A', 'Gain group A', 100, 200), ($1, 1, 'B', 'Gain group B', 200, 300)`, [scheme?.id]);
  const [receiver] = (await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'inspector@harrowpoint.test'`)) as { id: number }[];
  const [lot] = (await ctx.ds.query(
    `INSERT INTO lot (code, supplier_id, part_type_id, quantity, supplier_lot, received_by) VALUES ($1, $2, $3, 10, $4, $5) RETURNING id`,
    [lotCode, supplier?.id, part?.id, `SL-${u}`, receiver?.id],
  )) as { id: number }[];
  lotId = lot?.id as number;
});

afterAll(async () => {
  await stopE2e(ctx);
});

/** Ten parts screened at the Bench with the keyboard: a screening session, hFE Enter Vbe Enter, the bin shown in large type. */
async function screenTenParts(page: Page): Promise<void> {
  await page.goto(`${ctx.baseUrl}/bench/lots/${lotId}`);
  const form = page.getByRole('form', { name: 'Start a measurement session' });
  await form.getByLabel('Instrument').fill('Bench tester 2');
  await form.getByLabel('Ambient °C').fill('25');
  await form.getByLabel('Mode').selectOption('screen');
  await form.getByRole('button', { name: 'Start session' }).click();
  await page.getByTestId('open-session').waitFor();
  await expect.poll(() => page.locator(':focus').getAttribute('aria-label')).toBe('hFE');
  const recorded = page.getByRole('table', { name: 'Readings recorded in this sitting' }).locator('tbody tr');
  const callout = page.getByTestId('screening-callout');
  for (const [i, hfe] of HFES.entries()) {
    await page.keyboard.type(String(hfe));
    await page.keyboard.press('Enter');
    await page.keyboard.type(String(652 + i));
    await page.keyboard.press('Enter');
    await expect.poll(() => recorded.count()).toBe(i + 1);
    // The bin of the part just measured, in large type, before the next one is typed.
    await expect.poll(async () => (await callout.textContent()) ?? '', { timeout: 10_000 }).toContain(`Part ${i + 1} goes to`);
    expect(await callout.getByTestId('big-bin-code').textContent()).toBe(hfe < 200 ? 'A' : 'B');
    if (i === 0) await page.screenshot({ path: `${SHOTS}/bins-bench-callout.png`, fullPage: false });
  }
  expect(await callout.textContent()).toMatch(/position 5 of 50/);
  await page.getByTestId('lot-screening').getByText('50.0 %').first().waitFor();
  await page.screenshot({ path: `${SHOTS}/bins-bench-screened.png`, fullPage: true });
}

describe('Bins in Chromium', () => {
  it('screens ten parts into two bins, shows stock per bin, opens a container by scan, moves it, and prints the bin labels', async () => {
    const page = await signIn(ctx, 'inspector@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await screenTenParts(page);

    await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: 'Bins' }).click();
    await page.getByRole('heading', { name: 'Bins', exact: true }).waitFor();
    // The scan field has focus on arrival.
    expect(await page.evaluate('document.activeElement?.id')).toBe('container-scan');

    const chart = page.getByRole('figure', { name: `Stock of ${partNumber} per gain bin` });
    await chart.waitFor();
    await chart.getByText('A · 5').waitFor();
    await chart.getByText('B · 5').waitFor();

    await page.getByLabel('Search').fill(lotCode);
    const table = page.getByRole('table', { name: 'Containers' });
    // The search is applied after a short pause in typing: wait for the filtered rows (header + 2).
    await expect.poll(() => table.getByRole('row').count(), { timeout: 10_000 }).toBe(3);
    await page.screenshot({ path: `${SHOTS}/bins-page.png`, fullPage: true });

    const codes = (await ctx.ds.query(`SELECT code, bin_code, quantity FROM container WHERE lot_id = $1 ORDER BY bin_code`, [lotId])) as { code: string; bin_code: string; quantity: number }[];
    expect(codes.map((c) => [c.bin_code, c.quantity])).toEqual([
      ['A', 5],
      ['B', 5],
    ]);

    // A scanner types the code and Enter: the container opens.
    await page.locator('#container-scan').fill(codes[1]?.code.toLowerCase() as string);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: `Container ${codes[1]?.code}` }).waitFor();
    await page.getByTestId('big-bin-code').getByText('B').waitFor();
    const grid = page.getByRole('list', { name: `Positions of ${codes[1]?.code}` });
    await grid.getByText('hFE 210.0', { exact: false }).first().waitFor();
    expect(await grid.getByRole('listitem').filter({ hasText: 'in stock' }).count()).toBe(5);

    await page.getByRole('button', { name: 'Move…' }).click();
    const move = page.getByRole('form', { name: 'Move container' });
    await move.getByLabel('New location').fill('Cabinet 3, drawer 1');
    await move.getByRole('button', { name: 'Move' }).click();
    await page.getByTestId('container-location').getByText('Cabinet 3, drawer 1').waitFor();
    await page.getByRole('cell', { name: 'Bench → Cabinet 3, drawer 1' }).waitFor();
    await page.screenshot({ path: `${SHOTS}/bins-container.png`, fullPage: true });

    // Back on the Bins page: select both containers of the lot and print their labels on an A4 sheet from cell 3.
    await page.getByRole('link', { name: '← Bins' }).click();
    await page.getByLabel('Search').fill(lotCode);
    await table.getByRole('row').nth(2).waitFor();
    await page.getByRole('checkbox', { name: 'Select all containers on this page' }).check();
    await page.getByRole('group', { name: 'Print bin labels' }).getByLabel('Label stock').selectOption('a4-2x7');
    await page.getByRole('button', { name: 'Start at label 3' }).click();
    const popup = page.waitForEvent('popup');
    await page.getByRole('button', { name: 'Print 2 labels' }).click();
    const tab = await popup;
    await page.getByText('2 labels ready').waitFor();
    const href = await page.getByRole('link', { name: 'Open the label PDF' }).getAttribute('href');
    expect(href).toMatch(/^blob:/);
    // The PDF opens in the tab opened by the click (a blob: address of the answer).
    await tab.waitForURL(/^blob:/, { timeout: 10_000 }).catch(() => undefined);
    expect(tab.url()).toBe(href);
    await tab.close();
    const prints = (await ctx.ds.query(`SELECT lp.stock, lp.cell, c.code FROM label_print lp JOIN container c ON c.id = lp.container_id WHERE c.lot_id = $1 ORDER BY lp.id`, [lotId])) as {
      stock: string;
      cell: number;
    }[];
    expect(prints.map((p) => [p.stock, p.cell])).toEqual([
      ['a4-2x7', 2],
      ['a4-2x7', 3],
    ]);
    await page.screenshot({ path: `${SHOTS}/bins-print.png`, fullPage: true });
    await page.close();
  });

  it('scanning a container code in the Dock scan field opens the container', async () => {
    const [c] = (await ctx.ds.query(`SELECT code FROM container WHERE lot_id = $1 AND bin_code = 'A'`, [lotId])) as { code: string }[];
    const page = await signIn(ctx, 'inspector@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/dock`);
    const scan = page.locator('#scan-field');
    await scan.waitFor();
    await scan.fill(c?.code as string);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: `Container ${c?.code}` }).waitFor();
    await page.getByTestId('big-bin-code').getByText('A').waitFor();
    await page.close();
  });

  it('an assembler reads the Bins page and the containers but gets no actions', async () => {
    const page = await signIn(ctx, 'assembler@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/bins`);
    await page.getByRole('figure', { name: `Stock of ${partNumber} per gain bin` }).waitFor();
    await page.getByLabel('Search').fill(lotCode);
    await page.getByRole('table', { name: 'Containers' }).getByRole('row').nth(2).waitFor();
    expect(await page.getByRole('button', { name: /^Move / }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Print/ }).count()).toBe(0);
    await page.close();
  });
});
