import http from 'node:http';
import type { AddressInfo } from 'node:net';
import client from 'prom-client';
import type { Knex } from 'knex';
import { HEALTH_LEVELS_WORST_FIRST } from '../backend/src/maths';

/** The collector's own health, for whatever metrics system watches Brimwatch itself. */
export function createCollectorMetrics(db: Knex) {
  const registry = new client.Registry();
  client.collectDefaultMetrics({ register: registry, prefix: 'brimwatch_collector_' });
  const scrapes = new client.Counter({ name: 'brimwatch_collector_scrapes_total', help: 'Scrapes finished, by result (ok or failed).', labelNames: ['result'], registers: [registry] });
  const failures = new client.Counter({ name: 'brimwatch_collector_scrape_failures_total', help: 'Failed scrapes by kind of failure.', labelNames: ['kind'], registers: [registry] });
  const scrapeSeconds = new client.Histogram({
    name: 'brimwatch_collector_scrape_duration_seconds',
    help: 'Time from the safety check to the read sketch, per scrape.',
    buckets: [0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10],
    registers: [registry],
  });
  const cycleSeconds = new client.Histogram({
    name: 'brimwatch_collector_cycle_duration_seconds',
    help: 'Time to judge and store one batch of finished scrapes, in one transaction.',
    buckets: [0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5],
    registers: [registry],
  });
  const lagSeconds = new client.Histogram({
    name: 'brimwatch_collector_start_lag_seconds',
    help: 'How long after its slot a scrape started; growing lag means too few collectors.',
    buckets: [0.1, 0.25, 0.5, 1, 2, 5, 10, 30],
    registers: [registry],
  });
  const leaseConflicts = new client.Counter({ name: 'brimwatch_collector_lease_conflicts_total', help: 'Finished scrapes not stored because their lease had passed to another collector.', registers: [registry] });
  const roundErrors = new client.Counter({ name: 'brimwatch_collector_round_errors_total', help: 'Claims or stores that failed (database unreachable, …), retried on the next poll.', labelNames: ['stage'], registers: [registry] });
  const inFlight = new client.Gauge({ name: 'brimwatch_collector_scrapes_in_flight', help: 'Scrapes running now in this process.', registers: [registry] });
  new client.Gauge({
    name: 'brimwatch_collector_targets',
    help: 'Targets (sketch instances) in the fleet by level, from target_status.',
    labelNames: ['level'],
    registers: [registry],
    async collect() {
      try {
        const rows: { level: string; count: string }[] = await db('target_status').select('level').count('* as count').groupBy('level');
        for (const level of HEALTH_LEVELS_WORST_FIRST) this.set({ level }, Number(rows.find((r) => r.level === level)?.count ?? 0));
      } catch {
        // The database is away; the gauge keeps its last values and the round errors say why.
      }
    },
  });
  return { registry, scrapes, failures, scrapeSeconds, cycleSeconds, lagSeconds, leaseConflicts, roundErrors, inFlight };
}

export type CollectorMetrics = ReturnType<typeof createCollectorMetrics>;

/** Serves /metrics on loopback by default; port 0 picks a free port (tests, several collectors on one host). */
export async function serveMetrics(registry: client.Registry, host: string, port: number): Promise<{ port: number; close(): Promise<void> }> {
  const server = http.createServer(async (req, res) => {
    if (req.method !== 'GET' || (req.url ?? '').split('?')[0] !== '/metrics') return res.writeHead(404).end('Only GET /metrics is served here.\n');
    try {
      const body = await registry.metrics();
      res.writeHead(200, { 'content-type': registry.contentType }).end(body);
    } catch (err) {
      res.writeHead(500).end(`metrics failed: ${err instanceof Error ? err.message : String(err)}\n`);
    }
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, resolve);
  });
  return {
    port: (server.address() as AddressInfo).port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
