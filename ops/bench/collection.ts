import http from 'node:http';
import { loadConfig } from '../../backend/src/config';
import { createDb } from '../../backend/src/db';
import { createCollectorLoop } from '../../collectors/loop';
import { createCollectorMetrics } from '../../collectors/metrics';
import { alertsHookWith } from '../../collectors/sketch-level';
import { doneSince, makeDue } from './collection-fleet';
import type { BenchRow } from './report';

/** One GET with a fresh connection and the whole body read, as the collector's fetch does it (agent: false). */
function bareGet(url: string): Promise<number> {
  return new Promise((resolve, reject) => {
    http
      .get(url, { agent: false }, (res) => {
        let size = 0;
        res.on('data', (chunk: Buffer) => (size += chunk.length));
        res.on('end', () => resolve(size));
        res.on('error', reject);
      })
      .on('error', reject);
  });
}

/** The baseline: a bare fetch loop over the same URLs with `concurrency` requests at once. Returns targets per second. */
export async function bareFetchRate(urls: string[], concurrency: number): Promise<number> {
  let next = 0;
  const started = performance.now();
  const worker = async () => {
    while (next < urls.length) await bareGet(urls[next++]);
  };
  await Promise.all(Array.from({ length: concurrency }, worker));
  return urls.length / ((performance.now() - started) / 1000);
}

/**
 * The collector's whole pipeline in this process, set up as collectors/main.ts
 * sets it up (the configuration's defaults, the real alerts hook, a poll
 * every 250 ms): claim, fetch, parse, judge and store `count` due targets. Returns
 * targets per second, from the first tick until the last one is stored.
 */
export async function pipelineRate(url: string, targetIds: number[], count: number): Promise<number> {
  const config = loadConfig({ DATABASE_URL: url });
  const db = createDb(url, { max: 6 });
  const watcher = createDb(url, { max: 1 });
  await makeDue(db, targetIds, count);
  const metrics = createCollectorMetrics(db);
  const loop = createCollectorLoop(db, {
    concurrency: config.COLLECTOR_CONCURRENCY,
    batchSize: config.COLLECTOR_BATCH_SIZE,
    flushAfterMs: 200,
    pollMs: 250,
    leaseMarginSeconds: config.COLLECTOR_LEASE_MARGIN_SECONDS,
    scrape: { allowlist: config.TARGET_ALLOWLIST, maxBytes: config.SCRAPE_MAX_BYTES, userAgent: 'brimwatch-bench' },
    store: { owner: 'bench-collector', historyReadings: config.COLLECTOR_HISTORY_READINGS, alertsHook: alertsHookWith(), log: (m) => console.log(`  [collector] ${m}`) },
    metrics,
  });
  const since = new Date(Date.now() - 1);
  const started = performance.now();
  loop.start();
  let elapsed = 0;
  try {
    for (;;) {
      await new Promise((r) => setTimeout(r, 20));
      if ((await doneSince(watcher, since)) >= count) {
        elapsed = (performance.now() - started) / 1000;
        break;
      }
      if (performance.now() - started > 120_000) throw new Error(`the pipeline stored fewer than ${count} targets in 120 s`);
    }
  } finally {
    await loop.stop(1000);
    if (process.env.BENCH_DEBUG) {
      const m = await metrics.registry.getMetricsAsJSON();
      for (const name of ['brimwatch_collector_cycle_duration_seconds', 'brimwatch_collector_scrape_duration_seconds', 'brimwatch_collector_start_lag_seconds']) {
        const values = m.find((x) => x.name === name)?.values ?? [];
        const named = (suffix: string) => (values as { metricName?: string; value: number }[]).find((v) => v.metricName?.endsWith(suffix))?.value ?? 0;
        const [sum, count] = [named('_sum'), named('_count')];
        console.log(`  ${name}: ${count} × mean ${((1000 * sum) / Math.max(1, count)).toFixed(1)} ms`);
      }
    }
    await watcher.destroy();
    await db.destroy();
  }
  return count / elapsed;
}

export async function collectionRows(url: string, fleetUrl: (t: number) => string, targetIds: number[], sizes: number[]): Promise<BenchRow[]> {
  const concurrency = loadConfig({}).COLLECTOR_CONCURRENCY;
  // Warms the simulated fleet and both code paths once, unmeasured.
  await bareFetchRate(Array.from({ length: 500 }, (_, t) => fleetUrl(t)), concurrency);
  const rows: BenchRow[] = [];
  for (const n of sizes) {
    const urls = Array.from({ length: n }, (_, t) => fleetUrl(t));
    const bare = await bareFetchRate(urls, concurrency);
    const pipeline = await pipelineRate(url, targetIds, n);
    const ratio = pipeline / bare;
    rows.push({
      figure: `collection, ${n.toLocaleString('en-GB')} targets`,
      measured: pipeline,
      baseline: bare,
      baselineName: `bare fetch loop, ${concurrency} at once`,
      unit: 'targets/s',
      ratio,
      goal: '≥ 0.5× bare and ≥ 1,000/s',
      met: ratio >= 0.5 && pipeline >= 1000,
    });
  }
  return rows;
}

