import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { inkOf } from './page-measures';
import { startBrowserStack, type BrowserStack } from './stack';

const TEAL = '#0d5c63';
const BRASS = '#a8741a';
const HEADER = 'service,sketch,team,targetUrl,errorBudget,confidence';

describe('the Uploads page in a real browser', () => {
  let stack: BrowserStack;
  let page: Page;
  beforeAll(async () => {
    stack = await startBrowserStack();
    page = await stack.newPage();
    await stack.signIn(page, 'sre');
    await page.goto(`${stack.world.appUrl}/uploads`);
    await page.locator('#inventory-title').waitFor();
  });
  afterAll(async () => {
    await stack?.close();
  });

  it('when an inventory has a bad row, then the preview shows the server message beside it; fixed, it imports', async () => {
    const card = page.locator('[aria-labelledby="inventory-title"]');
    const bad = `${HEADER}\nbrowser-checks,good-one,payments,http://127.0.0.1:9599/metrics,500,0.99\nbrowser-checks,bad-one,payments,gopher://127.0.0.1/x,500,0.99\n`;
    await card.locator('input[type=file]').setInputFiles({ name: 'inventory.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) });
    await card.getByRole('button', { name: 'Preview' }).click();
    const problemRow = card.locator('tr[data-line="3"]');
    await problemRow.waitFor();
    expect(await problemRow.innerText()).toMatch(/targetUrl must be the http:\/\/ or https:\/\//);
    expect(await card.getByRole('button', { name: /^Import/ }).isDisabled()).toBe(true);
    await stack.shot(page, 'uploads-inventory-preview');

    const good = `${HEADER}\nbrowser-checks,good-one,payments,http://127.0.0.1:9599/metrics,500,0.99\nbrowser-checks,other-one,payments,http://127.0.0.1:9598/metrics,250,0.995\n`;
    await card.locator('input[type=file]').setInputFiles({ name: 'inventory.csv', mimeType: 'text/csv', buffer: Buffer.from(good) });
    await card.getByRole('button', { name: 'Preview' }).click();
    await card.getByRole('button', { name: 'Import 2 sketches' }).click();
    await card.locator('.inventory__summary').waitFor();
    expect(await card.locator('.inventory__summary').innerText()).toMatch(/Imported\s*2\s*sketches/);
    const rows = await stack.world.tdb.db('sketches as s').join('services as sv', 'sv.id', 's.service_id').where('sv.name', 'browser-checks').orderBy('s.name').pluck('s.name');
    expect(rows).toEqual(['good-one', 'other-one']);
  });

  it('when a counter dump is uploaded, then its report shows with the histogram drawn and it joins the list', async () => {
    const card = page.locator('[aria-labelledby="dump-check-title"]');
    const rows = Array.from({ length: 4 }, (_, r) => Array.from({ length: 256 }, (_, c) => ((c * 7 + r * 13) % 23 === 0 ? 900 + c : (c + r) % 5)).join(','));
    await page.fill('#dump-budget', '500');
    await card.locator('input[type=file]').setInputFiles({ name: 'limiter-dump.csv', mimeType: 'text/csv', buffer: Buffer.from(rows.join('\n')) });
    await card.getByRole('button', { name: 'Check the dump' }).click();
    const report = page.locator('[aria-label^="Dump report"]');
    await report.waitFor();
    expect(await report.locator('[data-test=verdict]').innerText()).toMatch(/error budget/);
    await expect.poll(async () => (await inkOf(page, '[data-chart=histogram]', [TEAL, BRASS])).near[TEAL]).toBeGreaterThan(100);
    expect((await inkOf(page, '[data-chart=histogram]', [TEAL, BRASS])).near[BRASS]).toBeGreaterThan(20);
    await expect.poll(() => page.locator('[aria-labelledby="dump-list-title"]').innerText()).toMatch(/limiter-dump\.csv/);
    expect(page.url()).toMatch(/report=\d+/);
    await stack.shot(page, 'uploads-dump-report');
    expect(stack.offLoopback).toEqual([]);
  });

  it('when a viewer opens Uploads, then the forms are replaced by what role they need', async () => {
    const viewer = await stack.newPage();
    await stack.signIn(viewer, 'viewer');
    await viewer.goto(`${stack.world.appUrl}/uploads`);
    await viewer.getByText('needs the responder role or higher').waitFor();
    expect(await viewer.locator('#dump-check-title').count()).toBe(0);
    expect(await viewer.title()).toBe('Uploads · Brimwatch');
    await stack.shot(viewer, 'uploads-viewer');
  });
});
