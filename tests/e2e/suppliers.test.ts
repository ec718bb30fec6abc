import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readConfig } from '../../server/config.ts';
import { startSmtpSink, type SmtpSink } from '../../server/modules/mail/smtp-sink.ts';
import { SHOTS, signIn, startE2e, stopE2e, type E2eContext } from './helpers.ts';

let ctx: E2eContext;
let sink: SmtpSink;

beforeAll(async () => {
  ctx = await startE2e();
  // The local SMTP sink the app is configured for (its port and folder come from the environment).
  const config = readConfig();
  sink = await startSmtpSink({ port: config.smtp.port, folder: config.smtp.sinkFolder });
});

afterAll(async () => {
  await sink?.close();
  await stopE2e(ctx);
});

describe('the Suppliers area in Chromium', () => {
  it('a buyer reads the scorecards, finds the mixed-stock alert, raises an NCR from it and sends it; the quality engineer sees it in the Outbox', async () => {
    const page = await signIn(ctx, 'buyer@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: 'Suppliers' }).click();

    // Scorecards of the demo history.
    const table = page.getByRole('table', { name: 'Supplier scorecards' });
    await table.getByRole('link', { name: 'Northmoor Electronic Supply' }).waitFor();
    expect(await table.locator('tbody tr').count()).toBeGreaterThanOrEqual(3);
    const kestrel = table.locator('tbody tr', { hasText: 'Kestrel Lane Components' });
    expect(await kestrel.textContent()).toMatch(/100 %/);

    // The alert on Northmoor's recent HPA-N201 lot: two gain groups.
    const alert = page.getByTestId('drift-alert').filter({ hasText: 'Northmoor Electronic Supply' }).filter({ hasText: 'Two groups' }).first();
    await alert.waitFor();
    expect(await alert.textContent()).toMatch(/HPA-N201/);
    expect(await alert.textContent()).toMatch(/not a finding/);
    await page.screenshot({ path: `${SHOTS}/suppliers-scorecards.png`, fullPage: true });

    // The supplier's scorecard with its charts.
    await table.getByRole('link', { name: 'Northmoor Electronic Supply' }).click();
    await page.getByRole('heading', { name: 'Northmoor Electronic Supply', exact: true }).waitFor();
    await page.getByRole('heading', { name: /^HPA-N201/ }).waitFor();
    await page.locator('figure[aria-label^="Lot mean hFE with control limits"] .recharts-line-curve').first().waitFor({ state: 'attached' });
    await page.locator('figure[aria-label^="hFE distribution of the last"] .recharts-line-curve').first().waitFor({ state: 'attached' });
    await page.screenshot({ path: `${SHOTS}/suppliers-detail.png`, fullPage: true });
    await page.goBack();

    // Raise an NCR from the alert.
    const fresh = page.getByTestId('drift-alert').filter({ hasText: 'Northmoor Electronic Supply' }).filter({ hasText: 'Two groups' }).first();
    await fresh.getByRole('link', { name: 'Raise NCR…' }).click();
    const form = page.getByRole('form', { name: 'Raise a nonconformance report' });
    await form.waitFor();
    expect(await form.getByLabel("Findings (filled from the lot's figures)").inputValue()).toMatch(/bimodality coefficient/);
    await form.getByLabel('Corrective action requested').fill('Explain the two gain groups in this lot, state the date codes shipped, and sort the remaining stock.');
    await page.screenshot({ path: `${SHOTS}/suppliers-ncr-form.png`, fullPage: true });
    await form.getByRole('button', { name: 'Raise NCR' }).click();
    const heading = page.getByRole('heading', { name: /^NCR-\d{4}-\d{4}$/ });
    await heading.waitFor();
    const code = (await heading.textContent())!;

    // Send it, after the confirmation.
    await page.getByRole('button', { name: 'Send to supplier…' }).click();
    const dialog = page.getByRole('dialog');
    expect(await dialog.textContent()).toMatch(/priya\.anand@northmoor\.example\.test/);
    await dialog.getByRole('button', { name: 'Send e-mail' }).click();
    const mail = page.getByTestId('ncr-mail');
    await mail.waitFor();
    await expect.poll(async () => (await mail.textContent()) ?? '').toMatch(/E-mail delivered/);
    await page.screenshot({ path: `${SHOTS}/suppliers-ncr-sent.png`, fullPage: true });

    // Order planning while we are here: progress, then the answer with its curve.
    await page.getByRole('link', { name: 'Order planning' }).click();
    const plan = page.getByRole('form', { name: 'Order-quantity plan' });
    await plan.getByLabel('Supplier').selectOption({ label: 'Kestrel Lane Components (KLC)' });
    await plan.getByLabel('Part type').selectOption({ label: 'HPA-N201 — NPN, Small-signal NPN for matched input pairs' });
    await plan.getByLabel('Matched sets needed (N)').fill('40');
    await plan.getByRole('button', { name: 'Plan the order' }).click();
    await page.getByTestId('plan-result').waitFor({ timeout: 45_000 });
    expect(await page.getByTestId('plan-result').textContent()).toMatch(/Buy \d+ parts/);
    await page.locator('[data-testid="plan-result"] .recharts-line-curve').first().waitFor({ state: 'attached' });
    await page.screenshot({ path: `${SHOTS}/suppliers-planning.png`, fullPage: true });
    await page.close();

    // The quality engineer's Outbox holds the message with the PDF; the sink received it.
    const qe = await signIn(ctx, 'quality@harrowpoint.test');
    await qe.getByTestId('user-name').waitFor();
    await qe.goto(`${ctx.baseUrl}/admin/mail`);
    const row = qe.getByRole('table', { name: 'Outgoing mail' }).locator('tbody tr', { hasText: code });
    await row.waitFor();
    expect(await row.textContent()).toMatch(new RegExp(`${code}\\.pdf`));
    expect(await row.textContent()).toMatch(/Sent/);
    await qe.getByText(new RegExp(`${code}: nonconformance report`)).first().waitFor();
    await qe.screenshot({ path: `${SHOTS}/suppliers-outbox.png`, fullPage: true });
    const files = fs.readdirSync(readConfig().smtp.sinkFolder);
    expect(files.length).toBeGreaterThan(0);
    await qe.close();
  });

  it('an inspector sees that Suppliers is not part of the role', async () => {
    const page = await signIn(ctx, 'inspector@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/suppliers`);
    await page.getByText('Suppliers is not part of your role').waitFor();
    await page.close();
  });
});
