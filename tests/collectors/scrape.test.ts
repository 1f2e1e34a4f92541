import net from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { scrapeTarget, scrapeTimeoutMs } from '../../collectors/scrape';
import { scrapeOnce } from '../../collectors/scrape-once';
import { startLoopbackTargets, type LoopbackTargets } from './loopback-targets';

const settings = { allowlist: '127.0.0.0/8', maxBytes: 64 * 1024, userAgent: 'brimwatch-test' };

/** A port nothing listens on: bound, noted, closed. */
async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((resolve) => server.close(resolve));
  return port;
}

describe('scrapeTarget', () => {
  let targets: LoopbackTargets;
  beforeAll(async () => {
    targets = await startLoopbackTargets();
    targets.behaviours.set('/good', { kind: 'sketch', label: 'limiter', figures: { width: 100, depth: 2, streamTotal: 5000, nonzeroCells: [60, 61] } });
    targets.behaviours.set('/error', { kind: 'status', status: 503 });
    targets.behaviours.set('/hang', { kind: 'hang' });
    targets.behaviours.set('/stall', { kind: 'stall' });
    targets.behaviours.set('/reset', { kind: 'reset' });
    targets.behaviours.set('/huge', { kind: 'huge' });
    targets.behaviours.set('/garbage', { kind: 'body', body: 'countmin_width{sketch="limiter"} 10\n<html>oops</html>\n', contentType: 'text/plain' });
    targets.behaviours.set('/nan', {
      kind: 'body',
      contentType: 'application/json',
      body: JSON.stringify({ sketches: { limiter: { width: 4, depth: 1, streamTotal: -3, nonzeroCells: [1], counterBytes: 4, windowSeconds: 0, conservative: false } } }),
    });
  });
  afterAll(() => targets.close());

  it('when the target answers with its sketch, then the sample and the scrape time come back', async () => {
    const outcome = await scrapeTarget(targets.url('/good'), 'limiter', 2000, settings);
    expect(outcome).toMatchObject({ ok: true, sample: { width: 100, depth: 2, streamTotal: 5000, nonzeroCells: [60, 61], counterBytes: 4, windowSeconds: 0, conservative: false } });
    expect(outcome.scrapeMs).toBeGreaterThan(0);
    expect(targets.hits.find((h) => h.path === '/good')?.agent).toBe('brimwatch-test');
  });

  it.each([
    ['/error', 'http status', 'HTTP status 503'],
    ['/hang', 'timeout', 'timeout after 0.3 s (no response)'],
    ['/stall', 'timeout', 'timeout after 0.3 s (the body did not finish)'],
    ['/reset', 'reset', 'connection reset by the target'],
    ['/huge', 'too large', 'too large: the response exceeds SCRAPE_MAX_BYTES (65536 bytes)'],
    ['/garbage', 'parse error', 'parse error at line 2: a sample must start with a metric name (got "<html>oops</html>")'],
    ['/nan', 'bad value', 'field streamTotal is negative (-3) for sketch "limiter"'],
  ])('when the target at %s misbehaves, then the failure is %s with reason %j', async (path, kind, reason) => {
    const outcome = await scrapeTarget(targets.url(path), 'limiter', 300, settings);
    expect(outcome).toMatchObject({ ok: false, kind, reason });
  });

  it('when nothing listens on the port, then the connection is refused', async () => {
    const outcome = await scrapeTarget(`http://127.0.0.1:${await closedPort()}/metrics`, 'limiter', 1000, settings);
    expect(outcome).toMatchObject({ ok: false, kind: 'refused', reason: 'connection refused' });
  });

  it('when the interval is short, then the timeout stays below it (0.8 of it), and never above 10 s', () => {
    expect(scrapeTimeoutMs(5)).toBe(4000);
    expect(scrapeTimeoutMs(30)).toBe(10_000);
  });

  it('when a target is tested once, then the sample comes with the rows\' occupancy, or the reason it failed', async () => {
    const tested = await scrapeOnce(targets.url('/good'), 'limiter', { allowlist: '127.0.0.0/8', maxBytes: 65536 });
    // Linear counting over both rows (Whang et al. 1990): V = (40 + 39) / 200, D = −100·ln V.
    expect(tested).toMatchObject({ ok: true, sample: { width: 100, depth: 2 }, occupancy: { saturated: false } });
    if (tested.ok && !tested.occupancy.saturated) expect(tested.occupancy.distinctEstimate).toBeCloseTo(-100 * Math.log(79 / 200), 9);
    expect(await scrapeOnce(targets.url('/error'), 'limiter', { allowlist: '127.0.0.0/8', maxBytes: 65536 })).toMatchObject({ ok: false, kind: 'http status', reason: 'HTTP status 503' });
  });
});
