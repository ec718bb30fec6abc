import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GainBinRow, GainBinSchemeVersion } from '../../server/modules/catalog/gain-bin-scheme.entity.ts';
import { PartType } from '../../server/modules/catalog/part-type.entity.ts';
import { Lot } from '../../server/modules/lots/lot.entity.ts';
import { Supplier } from '../../server/modules/suppliers/supplier.entity.ts';
import { User } from '../../server/modules/users/user.entity.ts';
import { SHOTS, signIn, startE2e, stopE2e, type E2eContext } from './helpers.ts';
import { inventedBenchNpn } from '../../scripts/lib/bench-fixtures.ts';

let ctx: E2eContext;
let lot: Lot;
const u = Date.now().toString(36).toUpperCase();

beforeAll(async () => {
  ctx = await startE2e();
  const part = await ctx.ds.getRepository(PartType).save(
    ctx.ds.getRepository(PartType).create({
      ...inventedBenchNpn(`BENCH-E2E-${u}`, 'Invented NPN small-signal for the bench test'),
      hfeMin: 100,
      hfeMax: 300,
    }),
  );
  const supplier = await ctx.ds.getRepository(Supplier).save(ctx.ds.getRepository(Supplier).create({ code: `BE${u}`.slice(0, 20), name: `Larkspur Test Distribution ${u}`, approval: 'approved', notes: null }));
  const scheme = await ctx.ds.getRepository(GainBinSchemeVersion).save(ctx.ds.getRepository(GainBinSchemeVersion).create({ partTypeId: part.id, version: 1, note: null, lockedAt: null, createdBy: null }));
  await ctx.ds.getRepository(GainBinRow).save(
    [
      ['A', 100, 200],
      ['B', 200, 300],
    ].map(([code, lo, hi], i) => ctx.ds.getRepository(GainBinRow).create({ schemeId: scheme.id, position: i + 1, code: String(code), label: `Gain ${code}`, hfeMin: Number(lo), hfeMax: Number(hi), vbeMinMv: null, vbeMaxMv: null, gapBeforeIntended: false })),
  );
  const receiver = await ctx.ds.getRepository(User).findOneByOrFail({ email: 'inspector@harrowpoint.test' });
  // Lot of 20, level II, AQL 1.0: C → arrow down to E, n 13, Ac 0 / Re 1 (ISO 2859-1 Table 1 + Table 2-A).
  lot = await ctx.ds.getRepository(Lot).save(
    ctx.ds.getRepository(Lot).create({
      code: `L-E2E-${u}`,
      supplierId: supplier.id,
      partTypeId: part.id,
      quantity: 20,
      status: 'received',
      receivedBy: receiver.id,
      dryBag: 'not-applicable',
      binSchemeId: scheme.id,
      dateCode: '2547',
      supplierLot: `SL-${u}`,
    }),
  );
});

afterAll(async () => {
  await stopE2e(ctx);
});

describe('the Bench in Chromium', () => {
  it('an inspector measures with the keyboard, sees an out-of-limit flag, imports a CSV and proposes; a quality engineer signs; the report is a PDF', async () => {
    const page = await signIn(ctx, 'inspector@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: 'Bench' }).click();
    await page.getByRole('link', { name: lot.code }).click();
    await page.getByRole('heading', { name: new RegExp(lot.code) }).waitFor();
    expect(await page.getByTestId('remaining').textContent()).toMatch(/13 of 13 still to measure/);

    // Start a session.
    const form = page.getByRole('form', { name: 'Start a measurement session' });
    await form.getByLabel('Instrument').fill('Bench meter 1');
    await form.getByLabel('Ambient °C').fill('25');
    await form.getByRole('button', { name: 'Start session' }).click();
    await page.getByTestId('open-session').waitFor();

    // Keyboard only from here: the hFE cell has the focus; Enter moves on and records.
    const hfe = page.getByRole('textbox', { name: 'hFE', exact: true });
    await expect.poll(() => page.locator(':focus').getAttribute('aria-label')).toBe('hFE');
    const recorded = page.getByRole('table', { name: 'Readings recorded in this sitting' }).locator('tbody tr');
    await page.keyboard.type('182');
    await page.keyboard.press('Enter');
    await page.keyboard.type('652');
    await page.keyboard.press('Enter');
    await expect.poll(() => recorded.count()).toBe(1);
    // Out of limits: flagged at once, before Vbe is typed, in colour and in words.
    await page.keyboard.type('95');
    const flag = page.getByTestId('limit-flag');
    await flag.waitFor();
    expect(await flag.textContent()).toMatch(/hFE below 100/);
    expect(await hfe.getAttribute('aria-invalid')).toBe('true');
    await page.screenshot({ path: `${SHOTS}/bench-flag.png`, fullPage: false });
    await page.keyboard.press('Enter');
    await page.keyboard.type('650');
    await page.keyboard.press('Enter');
    await page.keyboard.type('214');
    await page.keyboard.press('Enter');
    await page.keyboard.type('655');
    await page.keyboard.press('Enter');
    await expect.poll(() => recorded.count()).toBe(3);
    expect(await recorded.first().textContent()).toMatch(/^3/);
    await expect.poll(async () => (await page.getByTestId('remaining').textContent()) ?? '').toMatch(/10 of 13 still to measure/);
    expect(await page.getByRole('table', { name: 'Readings recorded in this sitting' }).textContent()).toMatch(/hFE below 100/);

    // Import the other ten parts from a tester file (Vbe in volts).
    await page.getByRole('tab', { name: 'Tester CSV import' }).click();
    const csv = ['Pos,HFE,VBE (V)', ...Array.from({ length: 10 }, (_, i) => `${i + 4},${150 + 10 * i},0.6${40 + i}`)].join('\n');
    const file = path.join(SHOTS, 'bench-tester.csv');
    fs.writeFileSync(file, `${csv}\n`);
    await page.getByLabel('Tester CSV file').setInputFiles(file);
    await page.getByRole('table', { name: 'Preview of the first rows' }).waitFor();
    expect(await page.getByLabel('Vbe unit').inputValue()).toBe('V');
    await page.getByRole('button', { name: /^Import bench-tester\.csv/ }).click();
    await page.getByText('Import complete').waitFor();
    await expect.poll(async () => (await page.getByTestId('remaining').textContent()) ?? '').toMatch(/Sample complete \(13 measured\)/);

    // Results and the recommendation: one part outside the limits with Ac 0 / Re 1 → reject.
    await page.getByTestId('lot-summary').waitFor();
    await expect.poll(async () => (await page.getByTestId('recommendation').textContent()) ?? '').toMatch(/reject.*1 nonconforming in 13 measured/);
    const propose = page.getByRole('form', { name: 'Propose a disposition' });
    await propose.getByLabel('Decision').selectOption('reject');
    await propose.getByLabel('Reason').fill('Position 2 reads hFE 95, below the minimum of 100; Ac 0.');
    await propose.getByRole('button', { name: 'Propose' }).click();
    await page.getByTestId('proposal').waitFor();
    await page.locator('.recharts-reference-area').first().waitFor();
    await page.screenshot({ path: `${SHOTS}/bench-lot-inspector.png`, fullPage: true });
    await page.close();

    // The quality engineer signs.
    const qe = await signIn(ctx, 'quality@harrowpoint.test');
    await qe.getByTestId('user-name').waitFor();
    await qe.goto(`${ctx.baseUrl}/bench/lots/${lot.id}`);
    const signForm = qe.getByRole('form', { name: 'Sign the disposition' });
    await signForm.waitFor();
    expect(await signForm.getByLabel('Decision').inputValue()).toBe('reject');
    await signForm.getByLabel('Reason').fill('Agree: gain below the minimum in the sample. Return to supplier under NCR.');
    await signForm.getByRole('button', { name: 'Sign…' }).click();
    await qe.getByRole('dialog').getByRole('button', { name: 'Sign', exact: true }).click();
    const signature = qe.getByTestId('signature');
    await signature.waitFor();
    expect(await signature.textContent()).toMatch(/Reject.*Signed by Quentin Marsh/);
    expect(await qe.getByText('Measurements are closed').isVisible()).toBe(true);
    await qe.screenshot({ path: `${SHOTS}/bench-lot-signed.png`, fullPage: true });

    const pdf = await qe.request.get(`${ctx.baseUrl}/api/lots/${lot.id}/report.pdf`);
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()['content-type']).toBe('application/pdf');
    const body = await pdf.body();
    expect(body.subarray(0, 5).toString()).toBe('%PDF-');
    fs.writeFileSync(path.join(SHOTS, 'bench-report.pdf'), body);
    const csvExport = await qe.request.get(`${ctx.baseUrl}/api/lots/${lot.id}/measurements.csv`);
    expect((await csvExport.text()).trim().split('\n')).toHaveLength(14);
    await qe.close();
  });

  it('the bench queue lists lots to inspect and is sorted on the server', async () => {
    const page = await signIn(ctx, 'inspector@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/bench`);
    await page.getByRole('table', { name: 'Lots at the bench' }).waitFor();
    await page.getByRole('button', { name: 'Disposed' }).click();
    // Other tests share the database: find this lot by searching, as an inspector would.
    await page.getByRole('searchbox').fill(lot.code);
    await page.getByRole('link', { name: lot.code }).waitFor();
    await page.screenshot({ path: `${SHOTS}/bench-queue.png`, fullPage: true });
    await page.close();
  });
});
