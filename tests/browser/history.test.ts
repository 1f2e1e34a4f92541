import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { startBrowserStack, type BrowserStack } from './stack';

describe('the History page in a real browser', () => {
  let stack: BrowserStack;
  let page: Page;
  beforeAll(async () => {
    stack = await startBrowserStack();
    page = await stack.newPage();
    await stack.signIn(page, 'responder');
  });
  afterAll(async () => {
    await stack?.close();
  });

  it('when the demo week is shown, then every sketch has a bar of levels and the brimmed one has time brimmed', async () => {
    await page.goto(`${stack.world.appUrl}/history`);
    await page.locator('.history-bar').first().waitFor();
    expect(await page.title()).toBe('History · Brimwatch');
    expect(await page.locator('.history-bar__piece').count()).toBeGreaterThan(5);
    const capRow = page.locator('tbody tr', { hasText: 'frequency-cap' });
    expect(await capRow.locator('[data-figure=brimmed]').innerText()).not.toBe('0');
    expect(await capRow.locator('.history-bar__piece--brimmed').count()).toBeGreaterThan(0);
    await stack.shot(page, 'history-week');
    expect(stack.offLoopback).toEqual([]);
  });

  it('when Export CSV is clicked, then a CSV file downloads with the header row', async () => {
    await page.goto(`${stack.world.appUrl}/history?period=24h&team=payments`);
    await page.locator('.history-bar').first().waitFor();
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByText('Export CSV').click()]);
    expect(download.suggestedFilename()).toMatch(/^brimwatch-history-\d{8}-\d{4}-to-\d{8}-\d{4}\.csv$/);
    const text = fs.readFileSync((await download.path())!, 'utf8');
    expect(text.split('\r\n')[0]).toBe('sketch_id,service,sketch,team,record,level,start,end,seconds,alert_event,actor,note');
    expect(text).toMatch(/,payments,level,/);
  });
});
