import http from 'node:http';
import { loadConfig } from '../../backend/src/config';
import { createDb } from '../../backend/src/db';
import { createCollectorLoop } from '../../collectors/loop';
import { createCollectorMetrics } from '../../collectors/metrics';
import { alertsHookWith } from '../../collectors/sketch-level';
import { doneCount, makeDue } from './collection-fleet';
import type { CpuSplit } from './cpu-time';
import type { BenchRow } from './report';

type CpuMeter = { start(): () => CpuSplit };

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
export async function bareFetchRate(urls: string[], concurrency: number, meter?: CpuMeter): Promise<{ rate: number; cpu?: CpuSplit }> {
  let next = 0;
  const stopMeter = meter?.start();
  const started = performance.now();
  const worker = async () => {
    while (next < urls.length) await bareGet(urls[next++]);
  };
  await Promise.all(Array.from({ length: concurrency }, worker));
  const rate = urls.length / ((performance.now() - started) / 1000);
  return { rate, cpu: stopMeter?.() };
}

/**
 * The collector's whole pipeline in this process, set up as collectors/main.ts
 * sets it up (the configuration's defaults, the real alerts hook, a poll
 * every 250 ms): claim, fetch, parse, judge and store `count` due targets.
 * A first round warms it as a running collector is warm (compiled code, its
 * history cache); the second is the figure, timed from making the targets due
 * until the last one is stored. Returns both rounds' targets per second.
 */
export async function pipelineRate(url: string, targetIds: number[], count: number, meter?: CpuMeter): Promise<{ warm: number; cold: number; cpu?: CpuSplit }> {
  const config = loadConfig({ DATABASE_URL: url });
  const db = createDb(url, { max: 6 });
  const watcher = createDb(url, { max: 1 });
  const loop = createCollectorLoop(db, {
    concurrency: config.COLLECTOR_CONCURRENCY,
    batchSize: config.COLLECTOR_BATCH_SIZE,
    flushAfterMs: 200,
    pollMs: 250,
    leaseMarginSeconds: config.COLLECTOR_LEASE_MARGIN_SECONDS,
    scrape: { allowlist: config.TARGET_ALLOWLIST, maxBytes: config.SCRAPE_MAX_BYTES, userAgent: 'brimwatch-bench' },
    store: { owner: 'bench-collector', historyReadings: config.COLLECTOR_HISTORY_READINGS, alertsHook: alertsHookWith(), log: (m) => console.log(`  [collector] ${m}`) },
    metrics: createCollectorMetrics(db),
  });
  let cpu: CpuSplit | undefined;
  const round = async (measured: boolean) => {
    await makeDue(db, targetIds, count);
    const stopMeter = measured ? meter?.start() : undefined;
    const started = performance.now();
    while ((await doneCount(watcher)) < count) {
      if (performance.now() - started > 120_000) throw new Error(`the pipeline stored fewer than ${count} targets in 120 s`);
      await new Promise((r) => setTimeout(r, 20));
    }
    const seconds = (performance.now() - started) / 1000;
    cpu = stopMeter?.() ?? cpu;
    return seconds;
  };
  loop.start();
  try {
    const cold = count / (await round(false));
    const warm = count / (await round(true));
    return { cold, warm, cpu };
  } finally {
    await loop.stop(1000);
    await watcher.destroy();
    await db.destroy();
  }
}

/** Milliseconds of CPU per target, by part, e.g. "collector 0.52 + PostgreSQL 0.31 + simulated fleet 0.18 = 1.01 ms". */
function cpuPerTarget(cpu: CpuSplit | undefined, n: number, own: string): string {
  if (!cpu) return 'not measured';
  const ms = (s: number) => ((s * 1000) / n).toFixed(2);
  return `${own} ${ms(cpu.own)} + PostgreSQL ${ms(cpu.postgres)} + simulated fleet ${ms(cpu.fleet)} = ${ms(cpu.own + cpu.postgres + cpu.fleet)} ms`;
}

export async function collectionRows(url: string, fleetUrl: (t: number) => string, targetIds: number[], sizes: number[], meter?: CpuMeter): Promise<BenchRow[]> {
  const concurrency = loadConfig({}).COLLECTOR_CONCURRENCY;
  // Warms the simulated fleet and both code paths once, unmeasured.
  await bareFetchRate(Array.from({ length: 500 }, (_, t) => fleetUrl(t)), concurrency);
  const rows: BenchRow[] = [];
  for (const n of sizes) {
    const urls = Array.from({ length: n }, (_, t) => fleetUrl(t));
    // The baseline before and after the pipeline, averaged: the machine's other load moves both alike.
    const before = await bareFetchRate(urls, concurrency, meter);
    const { warm: pipeline, cold, cpu } = await pipelineRate(url, targetIds, n, meter);
    const bare = (before.rate + (await bareFetchRate(urls, concurrency)).rate) / 2;
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
      note:
        `a running collector's round; its first round after start (cold code, empty history cache, alerts opening) ran at ${Math.round(cold)} targets/s. ` +
        `CPU per target — bare loop: ${cpuPerTarget(before.cpu, n, 'loop')}; pipeline: ${cpuPerTarget(cpu, n, 'collector')}`,
    });
  }
  return rows;
}

