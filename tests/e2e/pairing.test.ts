import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SHOTS, signIn, startE2e, stopE2e, type E2eContext } from './helpers.ts';
import { makePairingPartType, makeStockLot, setLocation, type StockLot } from '../server/pairing-fixtures.ts';

let ctx: E2eContext;
let stock: StockLot;

// Twelve screened NPN parts: six clean pairs (1 % hFE, 0.2 mV apart), pairs far from each other.
const PARTS = [100, 130, 160, 190, 220, 250].flatMap((h, i) => [
  { hfe: h, vbeMv: 640 + i * 4 },
  { hfe: Math.round(h * 1.01 * 10) / 10, vbeMv: 640.2 + i * 4 },
]);

beforeAll(async () => {
  ctx = await startE2e();
  const pt = await makePairingPartType(ctx.ds, { matchHfePct: 3, matchVbeMv: 1, prefix: 'PAIR-E2E' });
  stock = await makeStockLot(ctx.ds, pt, PARTS, { capacity: 6, location: 'Cabinet 12, drawer 1' });
  await setLocation(ctx.ds, stock.containers[1]!.id, 'Cabinet 3, drawer 2');
});

afterAll(async () => {
  await stopE2e(ctx);
});

describe('Pairing in Chromium', () => {
  it('the assembler plans and reserves a kit from screened stock, pulls it by scanning, and sees the kit complete', async () => {
    const page = await signIn(ctx, 'assembler@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: 'Pairing' }).click();
    await page.getByRole('heading', { name: 'Pairing', exact: true }).waitFor();

    const form = page.getByRole('form', { name: 'Matched-set request' });
    await form.getByLabel('Part type').selectOption({ label: `${stock.partNumber} — NPN, 12 in stock` });
    // Defaults from the part type, with the definition stated.
    expect(await form.getByLabel('hFE tolerance t (%)').inputValue()).toBe('3');
    expect(await form.getByLabel('Vbe tolerance v (mV)').inputValue()).toBe('1');
    await form.getByText('|h1 − h2| / min(h1, h2) ≤ t').waitFor();
    await form.getByLabel('Sets wanted').fill('3');
    await form.getByRole('button', { name: 'Plan' }).click();

    await page.getByTestId('sets-possible').getByText('6 pairs possible').waitFor();
    const plan = page.getByRole('region', { name: 'Plan' });
    await plan.getByRole('table', { name: 'Planned sets' }).waitFor();
    expect(await plan.getByRole('table', { name: 'Planned sets' }).locator('tbody tr').count()).toBe(3);
    await plan.getByText('Current mirror').first().waitFor();
    await plan.getByText('Differential pair').first().waitFor();
    const stops = plan.getByRole('list', { name: 'Containers and positions to pull' }).getByRole('listitem');
    expect(await stops.count()).toBeGreaterThan(0);
    // Storage order: cabinet 3 before cabinet 12.
    expect((await stops.first().textContent()) ?? '').toMatch(/^Cabinet/);
    await page.screenshot({ path: `${SHOTS}/pairing-plan.png`, fullPage: true });
    // Planning changed nothing.
    const [{ reserved }] = (await ctx.ds.query(
      `SELECT count(*)::int AS reserved FROM container_position cp JOIN container c ON c.id = cp.container_id WHERE c.lot_id = $1 AND cp.state = 'reserved'`,
      [stock.lotId],
    )) as { reserved: number }[];
    expect(reserved).toBe(0);

    await page.getByRole('form', { name: 'Reserve the plan' }).getByLabel('Note (optional)').fill('Input pairs, amplifier batch 7');
    await page.getByRole('button', { name: 'Reserve 3 pairs' }).click();
    const heading = page.getByRole('heading', { name: /^Kit KIT-\d{8}-\d{4}$/ });
    await heading.waitFor();
    const kitCode = ((await heading.textContent()) ?? '').replace('Kit ', '');
    await page.getByTestId('pull-progress').getByText('0 of 6 pulled').waitFor();
    // The scan field has focus on arrival.
    await expect.poll(() => page.evaluate('document.activeElement?.id')).toBe('pull-scan');
    const pick = page.getByRole('table', { name: 'Pick list' });
    expect(await pick.locator('tbody tr').count()).toBe(6);
    const firstRow = (await pick.locator('tbody tr').first().textContent()) ?? '';
    expect(firstRow).toContain('Cabinet 3, drawer 2');
    await page.screenshot({ path: `${SHOTS}/pairing-kit.png`, fullPage: true });

    // A wrong scan: a container code that is not in the kit, typed like a scanner.
    await page.keyboard.type('C-20200101-0001');
    await page.keyboard.press('Enter');
    await page.keyboard.type('1');
    await page.keyboard.press('Enter');
    const refusal = page.getByRole('alert').filter({ hasText: 'Not pulled' });
    await refusal.waitFor();
    expect(await refusal.textContent()).toContain('Wrong container: C-20200101-0001 holds no part of this kit');
    await page.screenshot({ path: `${SHOTS}/pairing-wrong-scan.png`, fullPage: false });
    // The scan field is selected again for the next try.
    await expect.poll(() => page.evaluate('document.activeElement?.id')).toBe('pull-scan');

    for (let i = 1; i <= 6; i++) {
      const next = page.getByTestId('next-pick');
      const text = (await next.textContent()) ?? '';
      const m = /(C-\d{8}-\d{4}) position (\d+)/.exec(text);
      expect(m, text).not.toBeNull();
      await page.locator('#pull-scan').fill('');
      await page.locator('#pull-scan').focus();
      await page.keyboard.type(m![1]!.toLowerCase());
      await page.keyboard.press('Enter');
      await expect.poll(() => page.evaluate('document.activeElement?.id')).toBe('pull-position');
      await page.keyboard.type(m![2]!);
      await page.keyboard.press('Enter');
      await page.getByTestId('pull-progress').getByText(`${i} of 6 pulled`).waitFor();
      if (i === 3) await page.screenshot({ path: `${SHOTS}/pairing-picking.png`, fullPage: true });
    }
    await page.getByText('Kit complete').waitFor();
    // The pick list and the kit label open as PDFs.
    for (const name of ['Print pick list', 'Print kit label']) {
      const href = (await page.getByRole('link', { name }).getAttribute('href')) as string;
      const pdf = await page.request.get(`${ctx.baseUrl}${href}`);
      expect(pdf.status()).toBe(200);
      expect(pdf.headers()['content-type']).toMatch(/application\/pdf/);
    }
    await page.screenshot({ path: `${SHOTS}/pairing-complete.png`, fullPage: true });

    const [kit] = (await ctx.ds.query(`SELECT id, status FROM kit_request WHERE code = $1`, [kitCode])) as { id: number; status: string }[];
    expect(kit?.status).toBe('pulled');
    const [{ pulled }] = (await ctx.ds.query(
      `SELECT count(*)::int AS pulled FROM container_position cp JOIN container c ON c.id = cp.container_id WHERE c.lot_id = $1 AND cp.state = 'pulled'`,
      [stock.lotId],
    )) as { pulled: number }[];
    expect(pulled).toBe(6);

    // The kits table lists it as pulled.
    await page.getByRole('link', { name: '← Pairing' }).click();
    const table = page.getByRole('table', { name: 'Kits' });
    await table.getByRole('link', { name: kitCode }).waitFor();
    await table.locator('tbody tr').filter({ hasText: kitCode }).filter({ hasText: '6 of 6' }).filter({ hasText: 'Pulled' }).waitFor();
    await page.close();
  });

  it('loose parts: the assembler types hand-measured parts and sees the matched pairs with their meaning', async () => {
    const page = await signIn(ctx, 'assembler@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/pairing/loose-parts`);
    const form = page.getByRole('form', { name: 'Loose parts' });
    await form.waitFor();
    const values = [
      ['201', '652.1'],
      ['205', '652.6'],
      ['150', '640'],
      ['151', '640.3'],
    ];
    for (const [i, [h, v]] of values.entries()) {
      await form.getByLabel(`Part ${i + 1} hFE`).fill(h!);
      await form.getByLabel(`Part ${i + 1} Vbe`).fill(v!);
    }
    await form.getByRole('button', { name: 'Find matched sets' }).click();
    await page.getByTestId('loose-sets').getByText('2 pairs within tolerance').waitFor();
    await page.getByText('Every part is in a set.').waitFor();
    await page.screenshot({ path: `${SHOTS}/pairing-loose.png`, fullPage: true });
    // A bad reading is named next to its row.
    await form.getByLabel('Part 2 hFE').fill('-3');
    await form.getByRole('button', { name: 'Find matched sets' }).click();
    await form.getByRole('alert').filter({ hasText: 'hfe must be greater than 0' }).waitFor();
    expect(await form.getByLabel('Part 2 hFE').inputValue()).toBe('-3');
    await page.close();
  });

  it('fit-for-use: a stage against the lot shows the spreads, the share saturating and the VCE histogram with the caution', async () => {
    const page = await signIn(ctx, 'quality@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/pairing/fit-for-use`);
    const form = page.getByRole('form', { name: 'Stage' });
    await form.getByLabel('Part type').selectOption({ label: `${stock.partNumber} — NPN, 12 measured` });
    await form.getByLabel('Lot').selectOption({ index: 1 });
    await form.getByLabel('VCC (V)').fill('12');
    await form.getByLabel('R1 (kΩ)').fill('470');
    await form.getByLabel('R2 (kΩ)').fill('47');
    await form.getByLabel('RE (kΩ)').fill('0');
    await form.getByLabel('RC (kΩ)').fill('6.8');
    await form.getByRole('button', { name: 'Run the check' }).click();
    await page.getByTestId('saturated-share').waitFor();
    expect((await page.getByTestId('saturated-share').textContent()) ?? '').toMatch(/^\d+ of 12 parts \([\d.]+ %\) would saturate$/);
    await page.getByRole('figure', { name: 'VCE over 12 parts' }).waitFor();
    await page.getByText('A design aid, not a qualification').waitFor();
    await page.screenshot({ path: `${SHOTS}/pairing-fit-for-use.png`, fullPage: true });
    await page.close();
  });

  it('an inspector, whose role has no Pairing area, is told so', async () => {
    const page = await signIn(ctx, 'inspector@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/pairing`);
    await page.getByText('Pairing is not part of your role').waitFor();
    await page.close();
  });
});
