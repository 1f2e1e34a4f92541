import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../setup/database';
import { addSketch } from '../collectors/fleet-fixture';
import { expositionOf, startLoopbackTargets, type LoopbackTargets, type TargetFigures } from '../collectors/loopback-targets';
import { endChild, startCollectorChild, type CollectorChild } from './collector-child';
import { eventually, sleep } from './deadline';

const INTERVAL_S = 5;
const GOOD: TargetFigures = { width: 2719, depth: 5, streamTotal: 40_000, nonzeroCells: [1500, 1490, 1510, 1502, 1497] };
const withValues = (total: string, width = '2719') =>
  [`countmin_width{sketch="limiter"} ${width}`, 'countmin_depth{sketch="limiter"} 2', `countmin_stream_total{sketch="limiter"} ${total}`,
    'countmin_nonzero_cells{sketch="limiter",row="0"} 10', 'countmin_nonzero_cells{sketch="limiter",row="1"} 11',
    'countmin_counter_bytes{sketch="limiter"} 4', 'countmin_window_seconds{sketch="limiter"} 0', 'countmin_conservative{sketch="limiter"} 0', ''].join('\n');

/** Each faulty target, how it misbehaves, and the reason its failed readings must carry (the collector's own words). */
const FAULTS: { path: string; reason: RegExp; set(targets: LoopbackTargets): void }[] = [
  { path: '/times-out', reason: /^timeout after 4 s \(no response\)$/, set: (t) => t.behaviours.set('/times-out', { kind: 'hang' }) },
  { path: '/hangs-after-headers', reason: /^timeout after 4 s \(the body did not finish\)$/, set: (t) => t.behaviours.set('/hangs-after-headers', { kind: 'stall' }) },
  { path: '/answers-500', reason: /^HTTP status 500$/, set: (t) => t.behaviours.set('/answers-500', { kind: 'status', status: 500 }) },
  { path: '/resets', reason: /^connection reset/, set: (t) => t.behaviours.set('/resets', { kind: 'reset' }) },
  { path: '/sends-50-mib', reason: /^too large: the response exceeds SCRAPE_MAX_BYTES \(1048576 bytes\)$/, set: (t) => t.behaviours.set('/sends-50-mib', { kind: 'huge' }) },
  { path: '/sends-garbage', reason: /^parse error at line 1: /, set: (t) => t.behaviours.set('/sends-garbage', { kind: 'body', body: '\u0000\u0001<html>not metrics</html>\n', contentType: 'text/plain' }) },
  { path: '/total-nan', reason: /countmin_stream_total is NaN/, set: (t) => t.behaviours.set('/total-nan', { kind: 'body', body: withValues('NaN'), contentType: 'text/plain' }) },
  { path: '/width-inf', reason: /countmin_width is \+Inf/, set: (t) => t.behaviours.set('/width-inf', { kind: 'body', body: withValues('100', '+Inf'), contentType: 'text/plain' }) },
  { path: '/total-negative', reason: /countmin_stream_total is negative \(-5\)/, set: (t) => t.behaviours.set('/total-negative', { kind: 'body', body: withValues('-5'), contentType: 'text/plain' }) },
];

/** A service that can go away (its port refuses connections) and come back on the same port. */
async function startLeavingService(figures: TargetFigures) {
  const server = http.createServer((_req, res) => {
    res.writeHead(200, { 'content-type': 'application/openmetrics-text; version=1.0.0' }).end(expositionOf('limiter', figures));
  });
  server.keepAliveTimeout = 1;
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const port = (server.address() as AddressInfo).port;
  return {
    url: `http://127.0.0.1:${port}/metrics`,
    leave: () => new Promise<void>((resolve) => {
      server.closeAllConnections();
      server.close(() => resolve());
    }),
    comeBack: () => new Promise<void>((resolve) => server.listen(port, '127.0.0.1', resolve)),
    close: () => new Promise<void>((resolve) => (server.listening ? server.close(() => resolve()) : resolve())),
  };
}

describe('targets that misbehave, under a real collector process', () => {
  let t: TestDatabase;
  let targets: LoopbackTargets;
  let leaving: Awaited<ReturnType<typeof startLeavingService>>;
  let collector: CollectorChild | undefined;
  beforeAll(async () => {
    t = await createTestDatabase();
    targets = await startLoopbackTargets();
    leaving = await startLeavingService(GOOD);
  });
  afterAll(async () => {
    await endChild(collector);
    await leaving?.close();
    await targets?.close();
    await t?.drop();
  });

  it('when targets time out, hang, fail, reset, flood, send garbage or impossible values, resize, or go away and come back, then each is recorded with its reason, the others read every round, nothing is stored as zero and the collector keeps running', async () => {
    for (const fault of FAULTS) fault.set(targets);
    const goodPaths = Array.from({ length: 12 }, (_, i) => `/good/${i}`);
    goodPaths.forEach((p, i) => targets.behaviours.set(p, { kind: 'sketch', label: 'limiter', figures: { ...GOOD, streamTotal: GOOD.streamTotal + i } }));
    targets.behaviours.set('/resizes', { kind: 'sketch', label: 'limiter', figures: GOOD });
    const ids = new Map<string, number>();
    for (const path of [...FAULTS.map((f) => f.path), '/resizes']) ids.set(path, (await addSketch(t.db, [targets.url(path)], { intervalSeconds: INTERVAL_S })).targetIds[0]);
    const good = await addSketch(t.db, goodPaths.map(targets.url), { intervalSeconds: INTERVAL_S });
    const away = (await addSketch(t.db, [leaving.url], { intervalSeconds: INTERVAL_S })).targetIds[0];

    collector = startCollectorChild('faulty-fleet', t.url);
    const metricsPort = await collector.metricsPort;
    const readingsOf = (targetId: number) => t.db('readings').where({ target_id: targetId }).orderBy('taken_at');
    const statusOf = (targetId: number) => t.db('target_status').where({ target_id: targetId }).first();

    // Every faulty target fails twice in a row (so it is unreachable) while the resizing one gives its first reading.
    await eventually('every faulty target has failed twice', 40_000, async () => {
      for (const id of [...FAULTS.map((f) => ids.get(f.path)!)]) if ((await statusOf(id))?.failures_in_row < 2) return false;
      return (await readingsOf(ids.get('/resizes')!)).length > 0;
    });
    const faultsOnRecordAt = Date.now();
    targets.behaviours.set('/resizes', { kind: 'sketch', label: 'limiter', figures: { ...GOOD, width: 5437, nonzeroCells: [800, 790, 810, 802, 797] } });

    // The leaving service goes away for longer than the three intervals that make a target stale, and comes back.
    const lastGoodBefore = (await statusOf(away)).last_ok_at as Date;
    await leaving.leave();
    await eventually('the service that left is unreachable', 30_000, async () => (await statusOf(away))?.level === 'unreachable');
    await eventually('three intervals and a second have passed since its last good reading', 30_000, async () => Date.now() - lastGoodBefore.getTime() > 3 * INTERVAL_S * 1000 + 1000);
    expect((await statusOf(away)).level).toBe('unreachable');
    await leaving.comeBack();
    const cameBack = Date.now();
    await eventually('the service that came back reads clear again', 30_000, async () => (await statusOf(away))?.level === 'clear');
    await eventually('the resizing target has a reading at its new width', 20_000, async () => (await readingsOf(ids.get('/resizes')!)).some((r) => r.width === 5437));

    // Each fault is recorded with its reason, and no figure is stored in place of one it did not send.
    for (const fault of FAULTS) {
      const rows = await readingsOf(ids.get(fault.path)!);
      expect(rows.length, fault.path).toBeGreaterThanOrEqual(2);
      for (const r of rows) {
        expect(r.ok, fault.path).toBe(false);
        expect(r.failure_reason, fault.path).toMatch(fault.reason);
        expect([r.stream_total, r.width, r.depth, r.nonzero_cells, r.judgement], fault.path).toEqual([null, null, null, null, null]);
      }
      const status = await statusOf(ids.get(fault.path)!);
      expect(status.level, fault.path).toBe('unreachable');
      expect(status.last_error, fault.path).toMatch(fault.reason);
      expect(status.stream_total, fault.path).toBeNull();
    }
    // The absence is on record as failed readings with their reason, and the return as good readings again.
    const awayRows = await readingsOf(away);
    const absent = awayRows.filter((r) => !r.ok);
    expect(absent.length).toBeGreaterThanOrEqual(3);
    expect(absent.every((r) => r.failure_reason === 'connection refused' && r.stream_total === null)).toBe(true);
    expect(awayRows.some((r) => r.ok && new Date(r.taken_at).getTime() >= cameBack - 1000)).toBe(true);

    // A width change is a resize, a new sizing epoch, not a failure.
    const resized = (await readingsOf(ids.get('/resizes')!)).filter((r) => r.width === 5437);
    expect(resized[0]).toMatchObject({ ok: true, is_resize: true, stream_total: GOOD.streamTotal });

    // The good targets read every round throughout: no gap of two intervals between their readings.
    for (const id of good.targetIds) {
      const rows = await readingsOf(id);
      expect(rows.every((r) => r.ok && r.stream_total > 0 && r.judgement !== null)).toBe(true);
      const times = rows.map((r) => new Date(r.taken_at).getTime());
      const gaps = times.slice(1).map((at, i) => at - times[i]);
      expect(Math.max(...gaps)).toBeLessThan(2 * INTERVAL_S * 1000);
      // They read from before the first fault was on record until just now, about once an interval
      // (a quarter of an interval's slack per round for scheduling and a loaded machine).
      expect(times[0]).toBeLessThan(faultsOnRecordAt);
      expect(times.at(-1)!).toBeGreaterThan(Date.now() - 2 * INTERVAL_S * 1000);
      const span = times.at(-1)! - times[0];
      expect(rows.length).toBeGreaterThanOrEqual(Math.floor(span / (1.25 * INTERVAL_S * 1000)) + 1);
    }
    // Nowhere a zero in place of a missing figure.
    expect(Number((await t.db('readings').where({ ok: true, stream_total: 0 }).count('* as n').first())?.n)).toBe(0);
    expect(Number((await t.db('readings').where({ ok: false }).whereNotNull('stream_total').count('* as n').first())?.n)).toBe(0);

    // Still running and still answering for itself.
    await sleep(100);
    expect(collector.child.exitCode).toBeNull();
    const metrics = await (await fetch(`http://127.0.0.1:${metricsPort}/metrics`)).text();
    expect(metrics).toMatch(/brimwatch_collector_scrape_failures_total\{kind="timeout"\} [1-9]/);
    expect(metrics).toMatch(/brimwatch_collector_scrape_failures_total\{kind="too large"\} [1-9]/);
  }, 150_000);
});
