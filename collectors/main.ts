import os from 'node:os';
import { randomBytes } from 'node:crypto';
import cron from 'node-cron';
import { loadConfig } from '../backend/src/config';
import { createDb } from '../backend/src/db';
import { startAlertJobs } from '../backend/src/alerts/alert-jobs';
import { recordHeartbeat, type CollectorIdentity } from './heartbeat';
import { createCollectorLoop } from './loop';
import { createMaintenance } from './maintenance/runner';
import { createCollectorMetrics, serveMetrics } from './metrics';
import { resignScheduler } from './scheduler-election';
import { alertsHookWith } from './sketch-level';
import { parseAllowlist } from './target-safety';

/** The collectors process: the scrape loop, and node-cron for heartbeats and maintenance, sharing the database with the web server. */
const config = loadConfig();
const log = (message: string) => console.log(`[collectors] ${message}`);
try {
  parseAllowlist(config.TARGET_ALLOWLIST);
} catch (err) {
  console.error(`Brimwatch collectors cannot start: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
}
const db = createDb(config.databaseUrl, { max: 6 });
const id = config.COLLECTOR_ID ?? `${os.hostname()}-${process.pid}-${randomBytes(3).toString('hex')}`;
const me: CollectorIdentity = { id, host: os.hostname(), pid: process.pid, startedAt: new Date() };
const alertsHook = alertsHookWith();

const metrics = createCollectorMetrics(db);
const metricsServer = await serveMetrics(metrics.registry, config.HOST, config.COLLECTOR_METRICS_PORT);
const loop = createCollectorLoop(db, {
  concurrency: config.COLLECTOR_CONCURRENCY,
  batchSize: config.COLLECTOR_BATCH_SIZE,
  flushAfterMs: 200,
  pollMs: 250,
  leaseMarginSeconds: config.COLLECTOR_LEASE_MARGIN_SECONDS,
  scrape: { allowlist: config.TARGET_ALLOWLIST, maxBytes: config.SCRAPE_MAX_BYTES, userAgent: `brimwatch-collector/${id}` },
  store: { owner: id, historyReadings: config.COLLECTOR_HISTORY_READINGS, alertsHook, log },
  metrics,
});
const maintain = createMaintenance(db, { owner: id, rawRetentionDays: config.RAW_RETENTION_DAYS, rollupRetentionDays: config.ROLLUP_RETENTION_DAYS, leaseSeconds: 30, alertsHook, log });

const beat = async () => {
  try {
    await recordHeartbeat(db, me);
  } catch (err) {
    log(`heartbeat not recorded: ${err instanceof Error ? err.message : String(err)}`);
  }
};

process.on('unhandledRejection', (err) => log(`unexpected failure, carrying on: ${err instanceof Error ? err.stack : String(err)}`));
await beat();
const tasks = [
  cron.schedule('*/10 * * * * *', beat, { name: 'heartbeat', noOverlap: true }),
  cron.schedule('*/10 * * * * *', () => maintain().then(() => undefined), { name: 'maintenance', noOverlap: true }),
];
loop.start();
void maintain();
// Alert mail: the outbox sender, the alert review and the daily digest.
const alertJobs = startAlertJobs(db, config, (message) => log(`alerts: ${message}`));
log(`${id} started; metrics on http://${config.HOST}:${metricsServer.port}/metrics`);

let stopping = false;
const shutdown = async (signal: string) => {
  if (stopping) return;
  stopping = true;
  // SIGTERM must end within 10 s even if the database hangs.
  setTimeout(() => process.exit(1), 10_000).unref();
  for (const task of tasks) await task.destroy();
  await alertJobs.stop();
  const { released } = await loop.stop(7_000);
  log(`${signal}: stopped; ${released} unfinished leases given back`);
  await resignScheduler(db, id).catch(() => undefined);
  await metricsServer.close();
  await db.destroy();
  process.exit(0);
};
process.on('SIGINT', () => void shutdown('SIGINT'));
process.on('SIGTERM', () => void shutdown('SIGTERM'));
