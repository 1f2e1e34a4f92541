import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { buildFrontendIfStale } from '../../ops/run/frontend-build';
import { runSeeds } from '../../ops/run/database';
import { startSignInWorld, type SignInWorld } from '../api/auth/sign-in-harness';

/**
 * What a browser test runs against: the built front end served by the real
 * server, the real database with the demo scenario, the real sign-in provider
 * fake, and Debian's chromium. Screenshots land in tests/browser/screenshots/
 * (git-ignored) for a person to look at.
 */
export const screenshotDir = path.resolve('tests/browser/screenshots');

export interface BrowserStack {
  world: SignInWorld;
  browser: Browser;
  /** Requests that left loopback, and console errors, seen by any page of this stack. */
  offLoopback: string[];
  consoleErrors: string[];
  newPage(): Promise<Page>;
  signIn(page: Page, login: string): Promise<void>;
  shot(page: Page, name: string): Promise<void>;
  close(): Promise<void>;
}

export async function startBrowserStack(options: { seedDemo?: boolean } = {}): Promise<BrowserStack> {
  buildFrontendIfStale(path.resolve('.'), () => {});
  const world = await startSignInWorld();
  if (options.seedDemo !== false) await runSeeds(world.tdb.db, path.resolve('seeds'));
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  fs.mkdirSync(screenshotDir, { recursive: true });
  const offLoopback: string[] = [];
  const consoleErrors: string[] = [];
  return {
    world,
    browser,
    offLoopback,
    consoleErrors,
    async newPage() {
      const context = await browser.newContext({ viewport: { width: 1366, height: 900 }, acceptDownloads: true });
      const page = await context.newPage();
      page.on('request', (req) => {
        const url = new URL(req.url());
        if (!['127.0.0.1', 'localhost', '[::1]'].includes(url.hostname) && !['data:', 'blob:'].includes(url.protocol)) offLoopback.push(req.url());
      });
      page.on('console', (msg) => {
        if (msg.type() === 'error') consoleErrors.push(`${page.url()}: ${msg.text()}`);
      });
      page.on('pageerror', (err) => consoleErrors.push(`${page.url()}: ${err.message}`));
      return page;
    },
    async signIn(page, login) {
      await page.goto(`${world.appUrl}/api/auth/login?returnTo=/fleet`);
      await page.fill('#login', login);
      await page.fill('#password', 'demo');
      await Promise.all([page.waitForURL(`${world.appUrl}/**`), page.click('button[type=submit]:not(.quiet)')]);
    },
    async shot(page, name) {
      await page.screenshot({ path: path.join(screenshotDir, `${name}.png`), fullPage: true });
    },
    async close() {
      await browser.close();
      await world.close();
    },
  };
}
