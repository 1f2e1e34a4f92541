import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { startBrowserStack, type BrowserStack } from './stack';

/** Every page of the router, with an address to open it at (sketch pages use a demo sketch). */
const PAGES = ['/fleet', '/alerts', '/history', '/planner', '/uploads', '/admin', '/sketches/new', '/sketches/:id', '/sketches/:id/edit', '/sign-in', '/no-such-page'];

interface Violation {
  directive: string;
  blocked: string;
  source: string;
}

describe('the Content-Security-Policy in a real browser', () => {
  let stack: BrowserStack;
  let page: Page;
  let sketchId: number;
  beforeAll(async () => {
    stack = await startBrowserStack();
    sketchId = Number((await stack.world.tdb.db('sketches').orderBy('id').first('id')).id);
    page = await stack.newPage();
    // Recorded in the page itself, from its first script on: a blocked resource, inline script or eval.
    await page.addInitScript({
      content: `window.cspViolations = [];
        document.addEventListener('securitypolicyviolation', (e) =>
          window.cspViolations.push({ directive: e.violatedDirective, blocked: e.blockedURI, source: e.sourceFile + ':' + e.lineNumber }));`,
    });
    await stack.signIn(page, 'admin');
  });
  afterAll(async () => {
    await stack?.close();
  });

  it('when the page table is compared with the router, then every page the router knows is opened below', () => {
    const routes = fs.readFileSync(path.resolve('frontend/src/router/routes.ts'), 'utf8');
    const paths = [...routes.matchAll(/path: '([^']+)'/g)].map((m) => m[1].replace(/\(\\\\d\+\)/g, '')).filter((p) => p !== '/' && !p.startsWith('/:path'));
    expect(paths.filter((p) => !PAGES.includes(p))).toEqual([]);
  });

  it('when the admin opens every page, then the browser reports no CSP violation and no CSP error in the console', async () => {
    const found: string[] = [];
    for (const address of PAGES.map((p) => p.replace(':id', String(sketchId)))) {
      await page.goto(`${stack.world.appUrl}${address}`);
      await page.waitForLoadState('networkidle');
      // Charts and lazy pages draw after their data arrives; give them their frame before reading.
      await page.waitForTimeout(300);
      const violations = (await page.evaluate('window.cspViolations.splice(0)')) as Violation[];
      found.push(...violations.map((v) => `${address}: ${v.directive} blocked ${v.blocked} (${v.source})`));
    }
    expect(found).toEqual([]);
    expect(stack.consoleErrors.filter((e) => /Content Security Policy|Refused to/i.test(e))).toEqual([]);
    expect(stack.offLoopback).toEqual([]);
  }, 120_000);
});
