import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS } from '../../ops/oidc-provider/demo-accounts';
import { startBrowserStack, type BrowserStack } from './stack';

const cardHeadings = async (page: Page) => (await page.locator('main h2, .q-page h2').allInnerTexts()).map((t) => t.trim());

describe('signing in as each demo account in a real browser', () => {
  let stack: BrowserStack;
  beforeAll(async () => {
    stack = await startBrowserStack();
  });
  afterAll(async () => {
    await stack?.close();
  });

  it('when a wrong password is typed on the provider\'s page, then it is refused with a message and the user stays there', async () => {
    const page = await stack.newPage();
    await page.goto(`${stack.world.appUrl}/api/auth/login`);
    await page.fill('#login', 'sre');
    await page.fill('#password', 'not-demo');
    await page.click('button[type=submit]:not(.quiet)');
    await expect.poll(() => page.locator('[role=alert]').innerText()).toMatch(/Wrong login or password/);
    expect(page.url().startsWith(stack.world.issuer)).toBe(true);
  });

  for (const account of DEMO_ACCOUNTS) {
    it(`when ${account.login} signs in, then the shell shows their name and role, and the Admin page only what ${account.role} may do`, async () => {
      const page = await stack.newPage();
      await stack.signIn(page, account.login);
      await expect.poll(() => page.getByRole('banner').innerText()).toContain(account.name);
      await page.goto(`${stack.world.appUrl}/admin`);
      await page.getByRole('heading', { name: 'API tokens' }).waitFor();
      const headings = await cardHeadings(page);
      if (account.role === 'admin') expect(headings).toEqual(expect.arrayContaining(['Users and roles', 'Teams', 'API tokens', 'Audit log']));
      else expect(headings.filter((h) => h === 'Users and roles' || h === 'Audit log')).toEqual([]);

      const saveButtons = page.getByRole('button', { name: 'Save addresses' });
      if (account.role === 'owner') {
        // The owner belongs to payments only.
        await expect.poll(() => saveButtons.count()).toBe(1);
        expect(await page.locator('[data-team="payments"]').getByRole('button', { name: 'Save addresses' }).count()).toBe(1);
      } else if (account.role === 'viewer' || account.role === 'responder') {
        expect(await saveButtons.count()).toBe(0);
      } else {
        await expect.poll(() => saveButtons.count()).toBeGreaterThan(1);
      }
      await stack.shot(page, `admin-${account.login}`);
    });
  }

  it('when a user signs out, then the next sign-in asks again and can be another account', async () => {
    const page = await stack.newPage();
    await stack.signIn(page, 'responder');
    await expect.poll(() => page.getByRole('banner').innerText()).toMatch(/responder/);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    await stack.signIn(page, 'owner');
    await expect.poll(() => page.getByRole('banner').innerText()).toMatch(/owner/);
    expect(stack.offLoopback).toEqual([]);
  });
});
