import type { Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { SHOTS, signIn, startE2e, stopE2e, type E2eContext } from './helpers.ts';

let ctx: E2eContext;
beforeAll(async () => {
  ctx = await startE2e();
});
afterAll(async () => {
  await stopE2e(ctx);
});

// Pages are closed even when a test fails half-way, so the next test starts clean.
const opened: Page[] = [];
afterEach(async () => {
  for (const p of opened.splice(0)) if (!p.isClosed()) await p.close();
});
async function open(email: string): Promise<Page> {
  const page = await signIn(ctx, email);
  opened.push(page);
  return page;
}

describe('Catalog in Chromium', () => {
  it('the quality engineer creates a part type, defines a gain-bin scheme and sees it as version 1', async () => {
    const page = await open('quality@harrowpoint.test');
    await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: 'Catalog' }).click();
    await page.getByRole('link', { name: 'HPA-N201' }).waitFor();
    expect(await page.getByRole('link', { name: 'HPA-P581' }).isVisible()).toBe(true);
    await page.screenshot({ path: `${SHOTS}/catalog-part-types.png`, fullPage: true });

    // Sorting happens on the server: sort by hFE max, descending, and read the column back.
    const header = page.getByRole('columnheader', { name: /hFE max/ });
    for (let i = 0; i < 3 && (await header.getAttribute('aria-sort')) !== 'descending'; i++) {
      await header.getByRole('button').click();
      await page.waitForTimeout(150);
    }
    const maxColumn = async () => (await page.locator('tbody tr td:nth-child(7)').allTextContents()).map(Number).filter(Number.isFinite);
    await expect.poll(async () => (await maxColumn())[0]).toBe(Math.max(...(await maxColumn())));
    const values = await maxColumn();
    expect(values.length).toBeGreaterThan(3);
    expect(values).toEqual([...values].sort((a, b) => b - a));

    await page.getByRole('button', { name: 'New part type' }).click();
    const form = page.getByRole('form', { name: 'New part type' });
    await form.waitFor();
    const partNumber = `E2E-N${Date.now() % 1_000_000}`;
    await form.getByLabel('Our part number').fill(partNumber);
    await form.getByLabel('Description').fill('End-to-end test NPN');
    await form.getByLabel('Package').fill('TO-92');
    await form.getByLabel('hFE at IC (mA)').fill('2');
    await form.getByLabel('hFE at VCE (V)').fill('5');
    await form.getByLabel('Vbe at IC (mA)').fill('2');
    await form.getByLabel('hFE min', { exact: true }).fill('100');
    await form.getByLabel('hFE max', { exact: true }).fill('50');
    await form.getByRole('button', { name: 'Create part type' }).click();
    await form.getByText('hfeMax must be greater than hfeMin (100)').waitFor();
    expect(await form.getByLabel('Our part number').inputValue()).toBe(partNumber);
    await form.getByLabel('hFE max', { exact: true }).fill('300');
    await form.getByRole('button', { name: 'Create part type' }).click();

    await page.getByRole('heading', { name: partNumber }).waitFor();
    const editor = page.getByRole('form', { name: 'Gain-bin scheme editor' });
    await editor.getByLabel('Bin 1 Code').fill('A');
    await editor.getByLabel('Bin 1 Label').fill('Low gain');
    await editor.getByLabel('Bin 1 hFE min').fill('100');
    await editor.getByLabel('Bin 1 hFE max').fill('200');
    await editor.getByRole('button', { name: '+ Add bin' }).click();
    expect(await editor.getByLabel('Bin 2 hFE min').inputValue()).toBe('200');
    await editor.getByLabel('Bin 2 Code').fill('B');
    await editor.getByLabel('Bin 2 Label').fill('High gain');
    await editor.getByLabel('Bin 2 hFE min').fill('190');
    await editor.getByLabel('Bin 2 hFE max').fill('300');
    await editor.getByTestId('bin-2-errors').getByText(/overlaps the previous bin \("A"\)/).waitFor();
    await page.screenshot({ path: `${SHOTS}/catalog-scheme-error.png`, fullPage: true });
    await editor.getByLabel('Bin 2 hFE min').fill('200');
    await editor.getByText('The bins pass the checks', { exact: false }).waitFor();
    await editor.getByRole('button', { name: 'Save as version 1' }).click();

    await page.getByText('Saved as version 1; new lots use it.').waitFor();
    const history = page.getByRole('list', { name: 'Scheme versions' });
    await history.getByText('Version 1').waitFor();
    expect(await history.getByText('Current').isVisible()).toBe(true);
    expect(await history.getByRole('list', { name: 'Bins of version 1' }).textContent()).toMatch(/A\s*100–200.*B\s*200–300/);
    await page.screenshot({ path: `${SHOTS}/catalog-part-detail.png`, fullPage: true });
  });

  it('a version used by the bench shows its locked badge and the editor offers only a new version', async () => {
    const page = await open('quality@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/catalog`);
    await page.getByRole('link', { name: 'HPA-N580' }).click();
    const history = page.getByRole('list', { name: 'Scheme versions' });
    await history.getByText('Version 2').waitFor();
    await history.getByText(/Locked/).waitFor();
    await history.locator('li', { hasText: 'Version 1' }).first().getByRole('button', { name: 'Start from this version' }).click();
    const editor = page.getByRole('form', { name: 'Gain-bin scheme editor' });
    await editor.getByText(/Starting from version 1, which is locked/).waitFor();
    expect(await editor.getByRole('button', { name: /Save changes to version/ }).count()).toBe(0);
    await page.screenshot({ path: `${SHOTS}/catalog-part-locked.png`, fullPage: true });
  });

  it('the quality engineer sees the suppliers, creates one and marks it not approved after confirming', async () => {
    const page = await open('quality@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/catalog/suppliers`);
    await page.getByRole('link', { name: 'Kestrel Lane Components' }).waitFor();
    expect(await page.getByRole('link', { name: 'Brightwater Parts Exchange' }).isVisible()).toBe(true);
    await page.screenshot({ path: `${SHOTS}/catalog-suppliers.png`, fullPage: true });

    await page.getByRole('link', { name: 'Kestrel Lane Components' }).click();
    await page.getByRole('heading', { name: 'Kestrel Lane Components' }).waitFor();
    await page.getByText('mira.holt@kestrel-lane.example.test').waitFor();
    await page.getByRole('cell', { name: 'KL-2201-T92', exact: true }).waitFor();
    await page.screenshot({ path: `${SHOTS}/catalog-supplier-detail.png`, fullPage: true });

    await page.getByRole('navigation', { name: 'Catalog sections' }).getByRole('link', { name: 'Suppliers' }).click();
    await page.getByRole('button', { name: 'New supplier' }).click();
    const form = page.getByRole('form', { name: 'New supplier' });
    const code = `E2E${Date.now() % 100000}`;
    await form.getByLabel('Code').fill(code);
    await form.getByLabel('Name').fill('Fictional Test Supply');
    await form.getByRole('button', { name: 'Create supplier' }).click();
    await page.getByRole('heading', { name: 'Fictional Test Supply' }).waitFor();

    const contact = page.getByRole('form', { name: 'New contact' });
    await contact.getByLabel('Name').fill('Rowan Example');
    await contact.getByLabel('E-mail').fill('not-an-address');
    await contact.getByRole('button', { name: 'Add contact' }).click();
    await contact.getByText('email must be an e-mail address').waitFor();
    await contact.getByLabel('E-mail').fill('rowan@fictional.example.test');
    await contact.getByRole('button', { name: 'Add contact' }).click();
    await page.getByRole('list', { name: 'Contacts' }).getByText('rowan@fictional.example.test').waitFor();

    const approval = page.getByRole('form', { name: 'Change approval' });
    await approval.getByLabel('New status').selectOption('not-approved');
    await approval.getByLabel(/Reason/).fill('failed audit');
    await approval.getByRole('button', { name: 'Change approval…' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByText('Mark Fictional Test Supply as not approved?').waitFor();
    await dialog.getByRole('button', { name: 'Mark not approved' }).click();
    await dialog.waitFor({ state: 'detached' });
    await page.getByRole('form', { name: 'Change approval' }).getByRole('button', { name: 'Change approval…' }).isDisabled();
    const note = async () =>
      ((await ctx.ds.query(
        `SELECT a.note FROM audit_entry a JOIN supplier s ON a.entity_id = s.id::text WHERE s.code = $1 AND a.action = 'supplier.approval-change'`,
        [code],
      )) as { note: string }[])[0]?.note;
    await expect.poll(note).toBe('Approved → Not approved: failed audit');
    await page.screenshot({ path: `${SHOTS}/catalog-supplier-not-approved.png`, fullPage: true });
  });

  it('an inspector sees the catalog read-only', async () => {
    const page = await open('inspector@harrowpoint.test');
    await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: 'Catalog' }).click();
    await page.getByRole('link', { name: 'HPA-N201' }).waitFor();
    await page.getByText('quality engineers maintain it').waitFor();
    expect(await page.getByRole('button', { name: 'New part type' }).count()).toBe(0);

    await page.getByRole('link', { name: 'HPA-N201' }).click();
    await page.getByRole('heading', { name: 'HPA-N201' }).waitFor();
    await page.getByRole('table', { name: 'Bins of the current scheme version' }).waitFor();
    expect(await page.getByRole('form', { name: 'Gain-bin scheme editor' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Edit specification' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Start from this version' }).count()).toBe(0);
    await page.getByText('ESD-protected workstation', { exact: false }).waitFor();
    await page.screenshot({ path: `${SHOTS}/catalog-inspector-part.png`, fullPage: true });

    await page.getByRole('navigation', { name: 'Catalog sections' }).getByRole('link', { name: 'Suppliers' }).click();
    await page.getByRole('link', { name: 'Northmoor Electronic Supply' }).click();
    await page.getByRole('heading', { name: 'Northmoor Electronic Supply' }).waitFor();
    expect(await page.getByRole('form', { name: 'Change approval' }).count()).toBe(0);
    expect(await page.getByRole('form', { name: 'New contact' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Remove/ }).count()).toBe(0);
  });
});
