import net from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../backend/src/db';
import { createCollectorLoop } from '../../collectors/loop';
import { createCollectorMetrics } from '../../collectors/metrics';
import { createTestDatabase, type TestDatabase } from '../setup/database';
import { TEST_PG } from '../setup/test-pg';
import { addSketch, noAlerts } from './fleet-fixture';
import { startLoopbackTargets, type LoopbackTargets } from './loopback-targets';

/** A TCP relay in front of PostgreSQL that the test can cut, as a database restart would, without touching the shared server. */
async function startRelay() {
  const open = new Set<net.Socket>();
  let down = false;
  const server = net.createServer((client) => {
    if (down) return client.destroy();
    const upstream = net.connect(TEST_PG.port, TEST_PG.host);
    for (const s of [client, upstream]) {
      open.add(s);
      s.on('close', () => open.delete(s));
      s.on('error', () => undefined);
    }
    client.pipe(upstream).pipe(client);
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    port: (server.address() as net.AddressInfo).port,
    cut() {
      down = true;
      for (const s of open) s.destroy();
    },
    restore() {
      down = false;
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

const until = async (check: () => Promise<boolean>, ms: number) => {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    if (await check()) return true;
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  return false;
};

describe('when PostgreSQL goes away in the middle of collecting', () => {
  let t: TestDatabase;
  let targets: LoopbackTargets;
  beforeAll(async () => {
    t = await createTestDatabase();
    targets = await startLoopbackTargets();
  });
  afterAll(async () => {
    await targets.close();
    await t.drop();
  });

  it('when the connection is cut and comes back, then the loop logs, keeps running, and resumes storing whole readings', async () => {
    const relay = await startRelay();
    const db = createDb(`postgres://${TEST_PG.user}@127.0.0.1:${relay.port}/${t.name}`, { max: 4 });
    const paths = Array.from({ length: 10 }, (_, i) => `/outage/${i}`);
    paths.forEach((p) => targets.behaviours.set(p, { kind: 'sketch', label: 'limiter', figures: { width: 100, depth: 2, streamTotal: 500, nonzeroCells: [40, 41] } }));
    await addSketch(t.db, paths.map(targets.url), { intervalSeconds: 5 });
    const logs: string[] = [];
    const metrics = createCollectorMetrics(db);
    const loop = createCollectorLoop(db, {
      concurrency: 8,
      batchSize: 50,
      flushAfterMs: 100,
      pollMs: 100,
      leaseMarginSeconds: 1,
      scrape: { allowlist: '127.0.0.0/8', maxBytes: 65536, userAgent: 'brimwatch-test' },
      store: { owner: 'outage-test', historyReadings: 60, alertsHook: noAlerts, log: (m) => logs.push(m) },
      metrics,
    });
    const readings = async (after = 0) => Number((await t.db('readings').where('taken_at', '>', new Date(after)).countDistinct('target_id as n').first())?.n);
    try {
      loop.start();
      expect(await until(async () => (await readings()) === 10, 15_000)).toBe(true);
      relay.cut();
      await new Promise((resolve) => setTimeout(resolve, 3000));
      relay.restore();
      const back = Date.now();
      expect(await until(async () => (await readings(back)) === 10, 20_000)).toBe(true);

      const errors = (await metrics.roundErrors.get()).values.reduce((sum, v) => sum + v.value, 0);
      expect(errors).toBeGreaterThan(0);
      expect(logs.some((m) => /^(claim failed|storing \d+ readings failed)/.test(m))).toBe(true);
      // Whole readings only: every good one has its figures and its judgement.
      const partial = await t.db('readings').where({ ok: true }).where((q) => q.whereNull('judgement').orWhereNull('nonzero_cells')).count('* as n').first();
      expect(Number(partial?.n)).toBe(0);
    } finally {
      await loop.stop(2000);
      await db.destroy();
      await relay.close();
    }
  }, 60_000);
});
