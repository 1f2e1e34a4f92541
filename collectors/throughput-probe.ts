import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { CountMinSketch } from '../backend/src/maths';
import { createDb } from '../backend/src/db';
import { openCluster } from '../ops/postgres/cluster';
import { createCollectorLoop } from './loop';
import { createCollectorMetrics } from './metrics';
import { alertsHookWith } from './sketch-level';

/**
 * A first figure for one collector process: N targets on a loopback server,
 * all due at once, and the time the real loop (claim, fetch, parse, judge,
 * store, alerts hook) takes to store a reading for each. Not a test and not
 * the benchmark; run it with `npx tsx collectors/throughput-probe.ts [N] [rounds]`
 * (PROBE_NO_ALERTS=1 leaves the alerts hook out, to see its share).
 */
const targets = Number(process.argv[2] ?? 1000);
const rounds = Number(process.argv[3] ?? 3);
const cluster = openCluster({ dataDir: path.resolve('.data'), name: 'probe-pg', host: '127.0.0.1', port: 54359, user: 'brimwatch', extraSettings: ['fsync=off', 'synchronous_commit=off'], log: () => undefined });
cluster.start();
cluster.createDatabase('probe');
const db = createDb('postgres://brimwatch@127.0.0.1:54359/probe', { max: 8 });
await db.migrate.latest();
await db.raw('truncate teams, readings, reading_rollups_hourly, alerts cascade');

// An 8-row sketch with real counters; target i serves it under the label limiter-i.
const sketch = new CountMinSketch({ width: 2719, depth: 8, seed: 3 });
for (let i = 0; i < 20_000; i++) sketch.update(`key-${i % 1500}`);
const bodies = Array.from({ length: targets }, (_, i) => sketch.toExposition(`limiter-${i}`, { openMetrics: true }));
const server = http.createServer((req, res) => {
  const body = bodies[Number((req.url ?? '').split('/').pop())] ?? '';
  res.writeHead(200, { 'content-type': 'application/openmetrics-text; version=1.0.0' }).end(body);
});
await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
const port = (server.address() as AddressInfo).port;

const [team] = await db('teams').insert({ slug: 'probe', name: 'Probe' }).returning('id');
const [service] = await db('services').insert({ team_id: team.id, name: 'probe-service' }).returning('id');
const sketches = await db('sketches')
  .insert(Array.from({ length: targets }, (_, i) => ({ service_id: service.id, team_id: team.id, name: `limiter-${i}`, error_budget: 100, confidence: 0.99, scrape_interval_seconds: 30 })))
  .returning('id');
await db('targets').insert(sketches.map((s: { id: number }, i: number) => ({ sketch_id: s.id, url: `http://127.0.0.1:${port}/t/${i}`, instance: 'a' })));

const log = (m: string) => console.log(`[probe] ${m}`);
const loop = createCollectorLoop(db, {
  concurrency: 64,
  batchSize: 200,
  flushAfterMs: 200,
  pollMs: 250,
  leaseMarginSeconds: 20,
  scrape: { allowlist: '127.0.0.0/8', maxBytes: 1 << 20, userAgent: 'brimwatch-probe' },
  store: { owner: 'probe', historyReadings: 60, alertsHook: process.env.PROBE_NO_ALERTS ? async () => undefined : alertsHookWith(), log },
  metrics: createCollectorMetrics(db),
});

console.log(`${targets} targets, ${os.cpus().length} cores, load average ${os.loadavg()[0].toFixed(1)}, loopback target server in the same process`);

// Baseline: the same requests with the same concurrency and nothing else done with the answers.
async function bareFetches(): Promise<number> {
  const started = Date.now();
  let next = 0;
  const worker = async () => {
    while (next < targets) {
      const i = next++;
      await new Promise<void>((resolve, reject) => {
        http.get({ host: '127.0.0.1', port, path: `/t/${i}`, agent: false }, (res) => res.resume().on('end', resolve)).on('error', reject);
      });
    }
  };
  await Promise.all(Array.from({ length: 64 }, worker));
  return targets / ((Date.now() - started) / 1000);
}
console.log(`bare fetch baseline: ${Math.round(await bareFetches())} targets/s`);
loop.start();
for (let round = 1; round <= rounds; round++) {
  await db('targets').update({ next_scrape_at: db.raw('now()') });
  const before = Number((await db('readings').count('* as n').first())?.n);
  const started = Date.now();
  for (;;) {
    await new Promise((resolve) => setTimeout(resolve, 50));
    const stored = Number((await db('readings').count('* as n').first())?.n) - before;
    if (stored >= targets) break;
  }
  const seconds = (Date.now() - started) / 1000;
  console.log(`round ${round}: ${targets} readings stored in ${seconds.toFixed(2)} s = ${Math.round(targets / seconds)} targets/s`);
}
await loop.stop(5000);
server.close();
await db.destroy();
cluster.stop();
