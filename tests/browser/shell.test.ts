import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserStack, type BrowserStack } from './stack';

describe('the app shell in a real browser', () => {
  let stack: BrowserStack;
  beforeAll(async () => {
    stack = await startBrowserStack();
  });
  afterAll(async () => {
    await stack?.close();
  });

  it('when a visitor opens Brimwatch, then the sign-in page shows with no request leaving loopback and no console error', async () => {
    const page = await stack.newPage();
    await page.goto(`${stack.world.appUrl}/`);
    await page.getByRole('link', { name: /sign in/i }).first().waitFor();
    await stack.shot(page, 'shell-signed-out');
    expect(await page.title()).toMatch(/Brimwatch/);
    expect(stack.offLoopback).toEqual([]);
    expect(stack.consoleErrors.filter((e) => !/401/.test(e))).toEqual([]);
  });

  it('when the viewer signs in, then the shell shows their name, role, the rail in working-day order and the health', async () => {
    const page = await stack.newPage();
    await stack.signIn(page, 'viewer');
    await page.waitForURL(/\/fleet/);
    const rail = page.locator('nav a');
    await rail.first().waitFor();
    const labels = (await rail.allInnerTexts()).map((t) => t.trim()).filter(Boolean);
    expect(labels.join(' | ')).toMatch(/Fleet.*Alerts.*History.*Planner.*Uploads.*Admin/s);
    await expect.poll(async () => page.getByRole('banner').innerText()).toMatch(/viewer/i);
    await stack.shot(page, 'shell-fleet-viewer');
    expect(stack.offLoopback).toEqual([]);
  });
});
