import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { fontSizeOf, inkOf } from './page-measures';
import { demoSketchId } from './demo-sketches';
import { addWatchedSketch } from './watched-sketches';
import { startBrowserStack, type BrowserStack } from './stack';

// The palette of LOOK.md: the series in deep teal, the brim in brass.
const TEAL = '#0d5c63';
const BRASS = '#a8741a';

const DAY = 86_400_000;

/** The demo has no resize: a sketch of two replicas whose width and depth grew three days into the week. */
function addResizedSketch(db: Parameters<typeof addWatchedSketch>[0]): Promise<number> {
  const start = Date.now() - 7 * DAY;
  return addWatchedSketch(db, {
    team: 'discovery',
    service: 'search',
    sketch: 'suggest-heavy-hitters',
    width: 1360,
    depth: 4,
    errorBudget: 5000,
    resize: { at: start + 3 * DAY, width: 2719, depth: 5 },
    instances: ['suggest-1', 'suggest-2'],
    totalAt: (t) => Math.round(1_200_000 + (150_000 * (t - start)) / DAY),
  });
}

describe('the Sketch page in a real browser', () => {
  let stack: BrowserStack;
  let ids: { nearing: number; overflowing: number; restarting: number; resized: number };
  /** Signed in once for the file; each test starts from its own address. */
  let page: Page;
  beforeAll(async () => {
    stack = await startBrowserStack();
    const db = stack.world.tdb.db;
    ids = {
      nearing: await demoSketchId(db, 'checkout', 'per-card-limiter'),
      overflowing: await demoSketchId(db, 'ads-ranking', 'frequency-cap'),
      restarting: await demoSketchId(db, 'api-gateway', 'per-key-quota'),
      resized: await addResizedSketch(db),
    };
    page = await stack.newPage();
    await stack.signIn(page, 'sre');
  });
  afterAll(async () => {
    await stack?.close();
  });

  it('when an SRE opens a sketch nearing its brim, then the load leads the page and every chart draws its series and brim', async () => {
    await page.goto(`${stack.world.appUrl}/sketches/${ids.nearing}`);
    await page.locator('[data-chart=risk] canvas').waitFor();
    expect(await page.title()).toBe('checkout / per-card-limiter · Brimwatch');
    expect(await page.locator('[data-figure=load]').innerText()).toMatch(/^\d+\s%$/);
    // The most important figure is the largest thing on the page (LOOK.md).
    expect(await fontSizeOf(page, '[data-figure=load]')).toBeGreaterThan(await fontSizeOf(page, 'h1'));

    for (const chart of ['total', 'load', 'risk']) {
      const ink = await inkOf(page, `[data-chart=${chart}]`, [TEAL, BRASS]);
      expect(ink.near[TEAL], `${chart}: teal series pixels`).toBeGreaterThan(200);
      expect(ink.near[BRASS], `${chart}: brass brim pixels`).toBeGreaterThan(100);
    }
    expect(await page.getByText(/times in /).first().innerText()).toMatch(/times in \S+/);
    expect(await page.locator('[data-figure=proposed-width]').count()).toBe(1);
    const alerts = page.locator('section[aria-labelledby=timeline-heading]');
    await expect.poll(() => alerts.innerText()).toMatch(/No alert has been raised|opened/);
    await stack.shot(page, 'sketch-nearing-sre');
    expect(stack.offLoopback).toEqual([]);
  });

  it('when another range is chosen, then the readings are asked for again over that range', async () => {
    await page.goto(`${stack.world.appUrl}/sketches/${ids.overflowing}`);
    await page.locator('[data-chart=total] canvas').waitFor();
    const [request] = await Promise.all([
      page.waitForRequest((r) => r.url().includes(`/api/v1/sketches/${ids.overflowing}/readings`)),
      page.getByRole('button', { name: '24 h' }).click(),
    ]);
    const asked = new URL(request.url());
    const hours = (Date.parse(asked.searchParams.get('to')!) - Date.parse(asked.searchParams.get('from')!)) / 3_600_000;
    expect(Math.round(hours)).toBe(24);
    await page.locator('[data-chart=total] canvas').waitFor();
    expect((await inkOf(page, '[data-chart=total]', [TEAL])).near[TEAL]).toBeGreaterThan(200);
    await stack.shot(page, 'sketch-brimmed-24h');
  });

  it('when the sketch was resized and runs two replicas, then both instances and the resize show', async () => {
    const [readings] = await Promise.all([
      page.waitForResponse((r) => r.url().includes(`/api/v1/sketches/${ids.resized}/readings`)),
      page.goto(`${stack.world.appUrl}/sketches/${ids.resized}`),
    ]);
    expect((await readings.json()).markers).toEqual(expect.arrayContaining([expect.objectContaining({ kind: 'resize', width: 2719, depth: 5 })]));
    await page.locator('[data-chart=total] canvas').waitFor();
    const instances = page.locator('section[aria-label=Instances] tbody');
    expect(await instances.innerText()).toMatch(/suggest-1[\s\S]*suggest-2/);
    // Two replicas fill their own rows: occupancy over time waits for one to be chosen.
    await page.getByText('choose one above to see its rows').waitFor();
    await stack.shot(page, 'sketch-resized');

    const [one] = await Promise.all([
      page.waitForRequest((r) => r.url().includes(`/api/v1/sketches/${ids.resized}/readings`) && r.url().includes('instance=suggest-2')),
      (async () => {
        await page.getByRole('combobox', { name: 'Instance' }).click();
        await page.getByRole('option', { name: 'suggest-2' }).click();
      })(),
    ]);
    expect(new URL(one.url()).searchParams.get('instance')).toBe('suggest-2');
    await page.locator('[data-chart=occupancy] canvas').waitFor();
    const ink = await inkOf(page, '[data-chart=occupancy]', [TEAL, BRASS]);
    expect(ink.near[TEAL], 'occupancy: teal row pixels').toBeGreaterThan(200);
    expect(ink.near[BRASS], 'occupancy: brass "full" line pixels').toBeGreaterThan(100);
    await page.locator('[data-chart=occupancy]').scrollIntoViewIfNeeded();
    await stack.shot(page, 'sketch-resized-one-instance');
  });

  it('when replicas restart, then the page lists each with its own figures and the restarts are marked', async () => {
    const [readings] = await Promise.all([
      page.waitForResponse((r) => r.url().includes(`/api/v1/sketches/${ids.restarting}/readings`)),
      page.goto(`${stack.world.appUrl}/sketches/${ids.restarting}`),
    ]);
    expect((await readings.json()).markers.filter((m: { kind: string }) => m.kind === 'reset').length).toBeGreaterThan(0);
    await page.locator('[data-chart=total] canvas').waitFor();
    expect(await page.locator('section[aria-label=Instances] tbody').innerText()).toMatch(/gw-1[\s\S]*gw-2|gw-2[\s\S]*gw-1/);
    await stack.shot(page, 'sketch-restarts');
  });

  it('when "Open in Planner" is followed, then the Planner opens with the sketch\'s budget, confidence and counter size', async () => {
    await page.goto(`${stack.world.appUrl}/sketches/${ids.nearing}`);
    const sketch = await page.evaluate(async (id) => (await fetch(`/api/v1/sketches/${id}`)).json() as Promise<Record<string, number>>, ids.nearing);
    await page.locator('[data-action=planner]').click();
    await page.waitForURL(/\/planner\?/);
    const query = new URL(page.url()).searchParams;
    expect(query.get('errorBudget')).toBe(String(sketch.errorBudget));
    expect(query.get('confidence')).toBe(String(sketch.confidence));
    expect(query.get('counterBytes')).toBe(String(sketch.counterBytes));
    expect(Number(query.get('sizedTotal'))).toBeGreaterThan(0);
    expect(await page.inputValue('#planner-error-budget')).toBe(String(sketch.errorBudget));
  });

  it('when a viewer opens a sketch, then no change button shows and a forced change is refused with 403', async () => {
    const viewer = await stack.newPage();
    await stack.signIn(viewer, 'viewer');
    await viewer.goto(`${stack.world.appUrl}/sketches/${ids.nearing}`);
    await viewer.locator('[data-chart=total] canvas').waitFor();
    await expect.poll(() => viewer.getByRole('banner').innerText()).toMatch(/viewer/i);
    expect(await viewer.locator('[data-action=edit]').count()).toBe(0);
    const status = await viewer.evaluate(async (id) => {
      const response = await fetch(`/api/v1/sketches/${id}`, {
        method: 'PATCH',
        credentials: 'same-origin',
        headers: { 'Content-Type': 'application/json' },
        body: JSON.stringify({ errorBudget: 5 }),
      });
      return { status: response.status, body: (await response.json()) as { error: { code: string } } };
    }, ids.nearing);
    expect(status.status).toBe(403);
    expect(status.body.error.code).toBe('forbidden');
    await stack.shot(viewer, 'sketch-viewer');
    expect(stack.offLoopback).toEqual([]);
  });
});
