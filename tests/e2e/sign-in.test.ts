import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AREAS_BY_ROLE, AREA_LABELS, AREAS, type Role } from '../../shared/api/roles.ts';
import { DEMO_USERS } from '../../seed/demo-users.ts';
import { SHOTS, signIn, startE2e, stopE2e, type E2eContext } from './helpers.ts';

let ctx: E2eContext;
beforeAll(async () => {
  ctx = await startE2e();
});
afterAll(async () => {
  await stopE2e(ctx);
});

describe('sign-in in Chromium', () => {
  it('the sign-in page shows the product name and the form', async () => {
    await ctx.browser.clearCookies();
    const page = await ctx.browser.newPage();
    await page.goto(`${ctx.baseUrl}/`);
    await page.waitForURL(/\/sign-in/);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(await page.getByText('Binwright', { exact: true }).isVisible()).toBe(true);
    await page.screenshot({ path: `${SHOTS}/sign-in.png` });
    await page.close();
  });

  it('a wrong password shows an error and keeps the e-mail typed', async () => {
    const page = await signIn(ctx, 'inspector@harrowpoint.test', 'not-the-password');
    const alert = page.getByRole('alert').filter({ hasText: 'Sign-in failed' });
    await alert.waitFor();
    expect(await alert.textContent()).toMatch(/e-mail or password is not right/);
    expect(await page.getByLabel('E-mail').inputValue()).toBe('inspector@harrowpoint.test');
    await page.screenshot({ path: `${SHOTS}/sign-in-error.png` });
    await page.close();
  });

  for (const demo of DEMO_USERS) {
    it(`${demo.role} signs in and sees exactly the navigation of that role`, async () => {
      const page = await signIn(ctx, demo.email);
      const nav = page.getByRole('navigation', { name: 'Areas' });
      await nav.waitFor();
      await page.getByTestId('user-name').waitFor();
      const links = (await nav.getByRole('link').allTextContents()).map((t) => t.trim());
      expect(links).toEqual(AREAS_BY_ROLE[demo.role as Role].map((a) => AREA_LABELS[a]));
      for (const area of AREAS.filter((a) => !AREAS_BY_ROLE[demo.role as Role].includes(a))) {
        expect(links).not.toContain(AREA_LABELS[area]);
      }
      expect(await page.getByTestId('user-name').textContent()).toBe(demo.name);
      await page.screenshot({ path: `${SHOTS}/home-${demo.role}.png`, fullPage: true });
      await page.getByRole('button', { name: 'Sign out' }).click();
      await page.waitForURL(/\/sign-in/);
      await page.close();
    });
  }

  it('a buyer who opens the admin address is told it is not part of the role', async () => {
    const page = await signIn(ctx, 'buyer@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/admin/users`);
    await page.getByText('Admin is not part of your role').waitFor();
    await page.close();
  });

  it('a quality engineer creates a user on the Admin page and sees it in the table', async () => {
    const page = await signIn(ctx, 'quality@harrowpoint.test');
    await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: 'Admin' }).click();
    const form = page.getByRole('form', { name: 'New user' });
    await form.waitFor();
    const email = `e2e-${Date.now()}@example.test`;
    await form.getByLabel('Name').fill('Eve Tester');
    await form.getByLabel('E-mail').fill(email);
    await form.getByLabel('Role').selectOption('assembler');
    await form.getByLabel('Initial password').fill('short');
    await form.getByRole('button', { name: 'Create user' }).click();
    await form.getByText('password must have at least 10 characters').waitFor();
    expect(await form.getByLabel('Name').inputValue()).toBe('Eve Tester');
    await form.getByLabel('Initial password').fill('long-enough-password');
    await form.getByRole('button', { name: 'Create user' }).click();
    await form.getByText('User created').waitFor();
    await page.getByRole('cell', { name: email }).waitFor();
    await page.screenshot({ path: `${SHOTS}/admin-users.png`, fullPage: true });
    await page.close();
  });
});

describe('admin outgoing mail in Chromium', () => {
  it('a quality engineer opens the Outgoing mail tab and sees the outbox and the sink', async () => {
    const page = await signIn(ctx, 'quality@harrowpoint.test');
    await page.getByTestId('user-name').waitFor();
    await page.goto(`${ctx.baseUrl}/admin/mail`);
    await page.getByRole('heading', { name: 'Received by the local sink' }).waitFor();
    await page.getByRole('table', { name: 'Outgoing mail' }).waitFor();
    await page.screenshot({ path: `${SHOTS}/admin-mail.png`, fullPage: true });
    await page.close();
  });
});
