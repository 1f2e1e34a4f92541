import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../setup/database';
import { addSketch } from '../collectors/fleet-fixture';
import { expositionOf } from '../collectors/loopback-targets';
import { endChild, startCollectorChild, type CollectorChild } from './collector-child';
import { eventually } from './deadline';

const SLOW_MS = 3000;

/** /slow/* answers after three seconds; /stuck/* never answers. Records when each request arrived. */
async function startSlowFleet() {
  const arrived = new Map<string, number>();
  const server = http.createServer((req, res) => {
    arrived.set(req.url ?? '', Date.now());
    if (!req.url?.startsWith('/slow/')) return;
    setTimeout(() => {
      res.writeHead(200, { 'content-type': 'application/openmetrics-text; version=1.0.0' });
      res.end(expositionOf('limiter', { width: 2719, depth: 5, streamTotal: 12_345, nonzeroCells: [900, 901, 902, 903, 904] }));
    }, SLOW_MS);
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const port = (server.address() as AddressInfo).port;
  return {
    arrived,
    url: (path: string) => `http://127.0.0.1:${port}${path}`,
    close: () => new Promise<void>((resolve) => {
      server.closeAllConnections();
      server.close(() => resolve());
    }),
  };
}

describe('graceful shutdown', () => {
  let t: TestDatabase;
  let fleet: Awaited<ReturnType<typeof startSlowFleet>>;
  let collector: CollectorChild | undefined;
  beforeAll(async () => {
    t = await createTestDatabase();
    fleet = await startSlowFleet();
  });
  afterAll(async () => {
    await endChild(collector);
    await fleet?.close();
    await t?.drop();
  });

  it('when SIGTERM comes with scrapes in flight, then within 10 s those that finish are stored and those that cannot are handed back, due at once', async () => {
    const slow = ['/slow/0', '/slow/1', '/slow/2', '/slow/3'];
    const stuck = ['/stuck/0', '/stuck/1'];
    // A 30-second interval gives a 10-second scrape timeout: the stuck scrapes outlast the stop's grace.
    const finishing = await addSketch(t.db, slow.map(fleet.url), { intervalSeconds: 30 });
    const handedBack = await addSketch(t.db, stuck.map(fleet.url), { intervalSeconds: 30 });
    collector = startCollectorChild('stopping', t.url);
    await collector.metricsPort;
    await eventually('every target has been asked', 30_000, async () => [...slow, ...stuck].every((p) => fleet.arrived.has(p)));

    const stopAt = Date.now();
    collector.child.kill('SIGTERM');
    const { code } = await collector.exited;
    const took = Date.now() - stopAt;
    expect(code).toBe(0);
    expect(took).toBeLessThan(10_000);

    // The slow scrapes finished inside the grace period and were stored, whole, before the process left.
    const stored = await t.db('readings').whereIn('target_id', finishing.targetIds).select('target_id', 'ok', 'stream_total');
    expect(stored.map((r) => r.target_id).sort()).toEqual([...finishing.targetIds].sort());
    expect(stored.every((r) => r.ok && r.stream_total === 12_345)).toBe(true);
    const slowTargets = await t.db('targets').whereIn('id', finishing.targetIds).select('lease_owner', 'next_scrape_at');
    expect(slowTargets.every((r) => r.lease_owner === null && new Date(r.next_scrape_at).getTime() > stopAt)).toBe(true);

    // The stuck ones were handed back: no reading, no lease, still due, so another collector takes them at once.
    expect(await t.db('readings').whereIn('target_id', handedBack.targetIds)).toEqual([]);
    const stuckTargets = await t.db('targets').whereIn('id', handedBack.targetIds).select('lease_owner', 'lease_expires_at', 'next_scrape_at');
    expect(stuckTargets.every((r) => r.lease_owner === null && r.lease_expires_at === null && new Date(r.next_scrape_at).getTime() <= Date.now())).toBe(true);
    expect(collector.output.join('')).toMatch(/SIGTERM: stopped; 2 unfinished leases given back/);
  }, 60_000);
});
