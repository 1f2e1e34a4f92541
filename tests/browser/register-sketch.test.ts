import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { Registry, type RegistryContentType } from 'prom-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page, Request } from 'playwright-core';
import { sketchExporter } from '../../collectors/exporter';
import { CountMinSketch } from '../../backend/src/maths/sketch';
import { createZipfSampler, mulberry32 } from '../../backend/src/maths/random';
import { startBrowserStack, type BrowserStack } from './stack';

const THIN = '\u2009';

/** The message Quasar shows under the field whose input has this id (while a message fades out, both are read). */
async function messageBeside(page: Page, id: string): Promise<string> {
  return (await page.locator(`.q-field:has(#${id}) .q-field__messages`).allInnerTexts()).join(' | ');
}

/** A service on loopback exposing one real sketch, fed a seeded skewed stream, through the exporter services use. */
async function startService(): Promise<{ url: string; sketch: CountMinSketch; close(): Promise<void> }> {
  const sketch = new CountMinSketch({ width: 272, depth: 5, seed: 11 });
  const random = mulberry32(11);
  const nextKey = createZipfSampler(3000, 1.1, random);
  for (let i = 0; i < 12_000; i++) sketch.update(`card-${nextKey()}`, 1);
  const registry = new Registry<RegistryContentType>();
  sketchExporter(registry).add('new-card-limiter', sketch);
  const server = http.createServer(async (_req, res) => {
    res.writeHead(200, { 'content-type': registry.contentType }).end(await registry.metrics());
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return { url: `http://127.0.0.1:${port}/metrics`, sketch, close: () => new Promise((resolve) => server.close(() => resolve())) };
}

async function fillRegistration(page: Page, targetUrl: string): Promise<void> {
  await page.locator('#sketch-team').click();
  await page.getByRole('option', { name: /Payments/ }).click();
  await page.fill('#sketch-service', 'checkout');
  await page.fill('#sketch-label', 'new-card-limiter');
  await page.fill('#sketch-target-url', targetUrl);
  await page.fill('#sketch-errorBudget', '500');
}

describe('registering a sketch in a real browser', () => {
  let stack: BrowserStack;
  let service: Awaited<ReturnType<typeof startService>>;
  /** An SRE signed in once for the file. */
  let page: Page;
  beforeAll(async () => {
    [stack, service] = await Promise.all([startBrowserStack(), startService()]);
    page = await stack.newPage();
    await stack.signIn(page, 'sre');
  });
  afterAll(async () => {
    await service?.close();
    await stack?.close();
  });

  it('when the address is one the collectors may not scrape, then the server\'s message shows beside the address field', async () => {
    await page.getByText('Register a sketch', { exact: true }).first().click();
    await page.waitForURL(/\/sketches\/new$/);
    expect(await page.title()).toBe('Register a sketch · Brimwatch');
    await fillRegistration(page, 'http://10.0.4.7:9100/metrics');
    const [answer] = await Promise.all([
      page.waitForResponse((r) => r.url().endsWith('/api/v1/sketches') && r.request().method() === 'POST'),
      page.getByRole('button', { name: 'Register the sketch' }).click(),
    ]);
    const body = await answer.json();
    expect(answer.status()).toBe(400);
    expect(body.error.field).toBe('targetUrl');
    await expect.poll(() => messageBeside(page, 'sketch-target-url')).toBe(body.error.message);
    expect(body.error.message).toMatch(/^targetUrl is not allowed/);
    await stack.shot(page, 'register-refused-address');
    expect(stack.offLoopback).toEqual([]);
  });

  it('when a value breaks the server\'s rule, then the form refuses it before sending, in the server\'s own words', async () => {
    await page.goto(`${stack.world.appUrl}/sketches/new`);
    await fillRegistration(page, 'ftp://10.0.4.7/metrics');
    await page.fill('#sketch-confidence', '1.5');
    let posted = false;
    const watchPosts = (r: Request) => {
      if (r.url().endsWith('/api/v1/sketches') && r.method() === 'POST') posted = true;
    };
    page.on('request', watchPosts);
    await page.getByRole('button', { name: 'Register the sketch' }).click();
    await expect.poll(() => messageBeside(page, 'sketch-confidence')).toMatch(/confidence must be/);
    page.off('request', watchPosts);
    expect(posted).toBe(false);
    const server = await page.evaluate(async () => {
      const response = await fetch('/api/v1/sketches', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json' },
        body: JSON.stringify({ team: 'payments', service: 'checkout', sketch: 'new-card-limiter', targetUrl: 'ftp://10.0.4.7/metrics', errorBudget: 500, confidence: 0.99 }),
      });
      return ((await response.json()) as { error: { message: string } }).error.message;
    });
    await expect.poll(() => messageBeside(page, 'sketch-target-url')).toBe(server);
  });

  it('when the target is tested, then the page shows what Brimwatch reads there, or exactly why it could not', async () => {
    const owner = await stack.newPage();
    await stack.signIn(owner, 'owner');
    await owner.goto(`${stack.world.appUrl}/sketches/new`);
    // The owner belongs to payments only, so the team is chosen already.
    await expect.poll(() => owner.locator('.q-field:has(#sketch-team)').innerText()).toMatch(/Payments/);
    await owner.fill('#sketch-service', 'checkout');
    await owner.fill('#sketch-label', 'new-card-limiter');
    await owner.fill('#sketch-target-url', 'http://127.0.0.1:9/metrics');
    await owner.locator('[data-action=test-target]').click();
    await expect.poll(() => owner.locator('[data-outcome]').getAttribute('data-outcome')).toBe('failed');
    expect(await owner.locator('[data-outcome=failed]').innerText()).toMatch(/refused/);

    await owner.fill('#sketch-target-url', service.url);
    await owner.fill('#sketch-errorBudget', '500');
    await owner.locator('[data-action=test-target]').click();
    await owner.locator('[data-outcome=ok]').waitFor();
    const shown = await owner.locator('[data-outcome=ok]').innerText();
    expect(shown).toContain('272 × 5');
    const total = String(service.sketch.streamTotal).replace(/\B(?=(\d{3})+(?!\d))/g, THIN);
    expect(shown).toContain(total);
    await stack.shot(owner, 'register-target-tested');

    await owner.getByRole('button', { name: 'Register the sketch' }).click();
    await owner.waitForURL(/\/sketches\/\d+$/);
    await owner.locator('h1', { hasText: 'checkout / new-card-limiter' }).waitFor();
    expect(stack.offLoopback).toEqual([]);
  });

  it('when an owner changes the budget of their team\'s sketch, then the page shows it and an admin sees the change in its entries', async () => {
    const owner = await stack.newPage();
    await stack.signIn(owner, 'owner');
    const id = await owner.evaluate(async (url) => {
      const response = await fetch('/api/v1/sketches', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json' },
        body: JSON.stringify({ team: 'payments', service: 'checkout', sketch: 'refund-attempts', targetUrl: url, errorBudget: 400, confidence: 0.99 }),
      });
      return ((await response.json()) as { id: number }).id;
    }, service.url);
    await owner.goto(`${stack.world.appUrl}/sketches/${id}`);
    await owner.locator('[data-action=edit]').first().click();
    await owner.waitForURL(new RegExp(`/sketches/${id}/edit$`));
    expect(await owner.inputValue('#sketch-errorBudget')).toBe('400');
    await owner.fill('#sketch-errorBudget', '650');
    await owner.getByRole('button', { name: 'Save changes' }).click();
    await owner.waitForURL(new RegExp(`/sketches/${id}$`));
    await expect.poll(() => owner.locator('section[aria-label=Settings]').innerText()).toMatch(/error budget E\s+650/);

    const admin = await stack.newPage();
    await stack.signIn(admin, 'admin');
    await admin.goto(`${stack.world.appUrl}/sketches/${id}`);
    const changes = admin.locator('section[aria-label="Audit entries"]');
    await expect.poll(() => changes.innerText()).toMatch(/sketch\.updated[\s\S]*errorBudget: 400 → 650/);
    expect(await changes.innerText()).toMatch(/sketch\.registered/);
    await stack.shot(admin, 'sketch-changes-admin');
  });
});
