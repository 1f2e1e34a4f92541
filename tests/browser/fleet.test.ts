import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { demoSketchId } from './demo-sketches';
import { startBrowserStack, type BrowserStack } from './stack';

/** The sketch names in the table's rows, top to bottom. */
async function sketchNames(page: Page): Promise<string[]> {
  return (await page.locator('.fleet-table tbody tr a').allInnerTexts()).map((t) => t.trim());
}

// The demo scenario (ops/demo-fleet/scenario.ts, seeded with a back-filled week): frequency-cap brimmed,
// per-ip-burst unreachable, signup-screen stale, per-card-limiter and per-key-quota watch, the rest clear.
describe('the Fleet page in a real browser', () => {
  let stack: BrowserStack;
  /** Signed in once for the file; each test starts from its own address. */
  let page: Page;
  beforeAll(async () => {
    stack = await startBrowserStack();
    page = await stack.newPage();
    await stack.signIn(page, 'sre');
  });
  afterAll(async () => {
    await stack?.close();
  });

  it('when an SRE opens the fleet, then every sketch shows worst first with its level, load bar and summary', async () => {
    await page.waitForURL(/\/fleet/);
    await page.locator('.fleet-table tbody tr a', { hasText: 'frequency-cap' }).waitFor();
    const names = await sketchNames(page);
    // Severity order of DESIGN.md / health-levels.ts: brimmed, unreachable, stale, watch, clear.
    const order = ['frequency-cap', 'per-ip-burst', 'signup-screen', 'per-card-limiter', 'heavy-query-detector'];
    expect(order.map((name) => names.indexOf(name))).toEqual([...order.map((name) => names.indexOf(name))].sort((a, b) => a - b));
    expect(names).toEqual(expect.arrayContaining(order));
    const firstRow = page.locator('.fleet-table tbody tr').first();
    expect(await firstRow.locator('.level-badge').innerText()).toMatch(/brimmed/);
    expect(await firstRow.locator('[role=meter]').getAttribute('aria-valuenow')).not.toBeNull();
    expect(await page.locator('[data-count=brimmed]').innerText()).toMatch(/^[1-9]/);
    await expect.poll(() => page.getByText('Register a sketch', { exact: true }).count()).toBe(1);
    expect(await page.title()).toBe('Fleet · Brimwatch');
    await stack.shot(page, 'fleet-sre');
    expect(stack.offLoopback).toEqual([]);
  });

  it('when the level filter and a search are set, then the rows narrow, the address keeps them and a reload restores them', async () => {
    await page.goto(`${stack.world.appUrl}/fleet`);
    await page.locator('.fleet-table tbody tr a').first().waitFor();

    await page.locator('button[aria-pressed]', { hasText: 'watch' }).click();
    await page.waitForURL(/level=watch/);
    await expect.poll(() => sketchNames(page)).toEqual(expect.arrayContaining(['per-card-limiter', 'per-key-quota']));
    for (const badge of await page.locator('.fleet-table tbody .level-badge').allInnerTexts()) expect(badge).toMatch(/watch/);

    await page.locator('button[aria-pressed]', { hasText: 'watch' }).click();
    await page.waitForURL((url) => !url.search.includes('level='));
    await page.fill('#fleet-search', 'heavy-q');
    await page.waitForURL(/q=heavy-q/);
    await expect.poll(() => sketchNames(page)).toEqual(['heavy-query-detector']);
    await stack.shot(page, 'fleet-search');

    await page.reload();
    await expect.poll(() => sketchNames(page)).toEqual(['heavy-query-detector']);
    expect(await page.inputValue('#fleet-search')).toBe('heavy-q');

    await page.locator('.fleet-table tbody tr a', { hasText: 'heavy-query-detector' }).click();
    await page.waitForURL(new RegExp(`/sketches/${await demoSketchId(stack.world.tdb.db, 'search', 'heavy-query-detector')}$`));
    expect(stack.offLoopback).toEqual([]);
  });

  it('when a column header is clicked, then the server sorts by it and the address says so', async () => {
    await page.goto(`${stack.world.appUrl}/fleet?sort=service`);
    await expect.poll(async () => (await sketchNames(page)).length).toBeGreaterThan(3);
    const services = await page.locator('.fleet-table tbody tr td:nth-child(2)').allInnerTexts();
    expect(services).toEqual([...services].sort());
    await page.locator('.fleet-table thead th', { hasText: 'Load' }).click();
    await page.waitForURL(/sort=load/);
    const loads = async () => (await page.locator('.fleet-table tbody tr td:nth-child(5)').allInnerTexts()).map((t) => parseInt(t, 10)).filter(Number.isFinite);
    // The first click on a figure sorts it highest first, like the fleet's own worst-first order.
    await expect.poll(async () => {
      const shown = await loads();
      return shown.length > 3 && shown.every((v, i) => i === 0 || shown[i - 1] >= v);
    }).toBe(true);
  });

  it('when a viewer opens the fleet, then there is no register button, and the register page says which roles may', async () => {
    const viewer = await stack.newPage();
    await stack.signIn(viewer, 'viewer');
    await viewer.waitForURL(/\/fleet/);
    await viewer.locator('.fleet-table tbody tr a').first().waitFor();
    await expect.poll(() => viewer.getByRole('banner').innerText()).toMatch(/viewer/i);
    expect(await viewer.getByText('Register a sketch', { exact: true }).count()).toBe(0);
    await stack.shot(viewer, 'fleet-viewer');
    await viewer.goto(`${stack.world.appUrl}/sketches/new`);
    await viewer.getByText('Registering sketches is for owners, SREs and admins').waitFor();
    expect(await viewer.locator('form').count()).toBe(0);
  });
});
