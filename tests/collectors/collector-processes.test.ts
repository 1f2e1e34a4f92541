import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { nextScrapeAt, scrapeOffsetMs } from '../../collectors/schedule';
import { createTestDatabase, type TestDatabase } from '../setup/database';
import { addSketch } from './fleet-fixture';
import { startLoopbackTargets, type LoopbackTargets } from './loopback-targets';

const INTERVAL_S = 5;
const SKETCHES = 40;
const INSTANCES = 5;
const RUN_MS = 17_000;

interface Collector {
  child: ChildProcess;
  output: string[];
  metricsPort: Promise<number>;
  exited: Promise<number | null>;
}

/** Runs the real collectors process, as `npm start` does, against the test database. */
function startCollector(name: string, databaseUrl: string): Collector {
  const child = spawn(process.execPath, ['--import', 'tsx', 'collectors/main.ts'], {
    cwd: path.resolve('.'),
    env: { ...process.env, NODE_ENV: 'test', DATABASE_URL: databaseUrl, COLLECTOR_METRICS_PORT: '0', COLLECTOR_ID: name, TMPDIR: path.resolve('.data') },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const output: string[] = [];
  const metricsPort = new Promise<number>((resolve, reject) => {
    child.stdout?.on('data', (chunk: Buffer) => {
      output.push(chunk.toString());
      const port = /metrics on http:\/\/[^:]+:(\d+)\/metrics/.exec(output.join(''))?.[1];
      if (port) resolve(Number(port));
    });
    child.once('exit', () => reject(new Error(`collector ${name} exited early:\n${output.join('')}`)));
  });
  child.stderr?.on('data', (chunk: Buffer) => output.push(chunk.toString()));
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  return { child, output, metricsPort, exited };
}

describe('two collector processes sharing one fleet', () => {
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

  it('when two collectors run for several rounds over 200 targets, then every target is scraped once per round, never twice, and every scrape is stored', async () => {
    const idOfPath = new Map<string, number>();
    for (let s = 0; s < SKETCHES; s++) {
      const paths = Array.from({ length: INSTANCES }, (_, i) => `/s${s}/i${i}`);
      paths.forEach((p, i) => targets.behaviours.set(p, { kind: 'sketch', label: 'limiter', figures: { width: 1000, depth: 2, streamTotal: 1000 * (s + 1) + i, nonzeroCells: [400, 410] } }));
      const { targetIds } = await addSketch(t.db, paths.map(targets.url), { intervalSeconds: INTERVAL_S });
      paths.forEach((p, i) => idOfPath.set(p, targetIds[i]));
    }

    const collectors = [startCollector('alpha', t.url), startCollector('beta', t.url)];
    const ports = await Promise.all(collectors.map((c) => c.metricsPort));
    await new Promise((resolve) => setTimeout(resolve, RUN_MS));
    const metrics = await (await fetch(`http://127.0.0.1:${ports[0]}/metrics`)).text();
    const stopAt = Date.now();
    collectors.forEach((c) => c.child.kill('SIGTERM'));
    const codes = await Promise.all(collectors.map((c) => c.exited));
    expect(Date.now() - stopAt).toBeLessThan(10_000);
    expect(codes).toEqual([0, 0]);
    expect(metrics).toMatch(/brimwatch_collector_scrapes_total\{result="ok"\} \d+/);

    // Every request a target received is a stored reading: none lost, none stored twice.
    const hitsOf = new Map<number, number>();
    for (const hit of targets.hits) {
      const id = idOfPath.get(hit.path);
      if (id !== undefined) hitsOf.set(id, (hitsOf.get(id) ?? 0) + 1);
    }
    const readings: { target_id: number; taken_at: Date }[] = await t.db('readings').where({ ok: true }).orderBy('taken_at').select('target_id', 'taken_at');
    const takenOf = new Map<number, number[]>();
    for (const r of readings) takenOf.set(r.target_id, [...(takenOf.get(r.target_id) ?? []), r.taken_at.getTime()]);
    expect(takenOf.size).toBe(SKETCHES * INSTANCES);
    expect([...takenOf].map(([id, times]) => [id, times.length])).toEqual([...takenOf].map(([id]) => [id, hitsOf.get(id)]));

    // Rounds are the target's slots (its offset within the interval). Replaying the schedule from each
    // target's registration: every scrape starts at or after the slot it was due in (never early, so
    // never twice in a round), and the next slot is the very next round unless the scrape itself began
    // more than an interval late (the collector skips a round it missed rather than cramming it in).
    const intervalMs = INTERVAL_S * 1000;
    const created = new Map<number, number>((await t.db('targets').select('id', 'created_at')).map((r) => [Number(r.id), r.created_at.getTime()]));
    let roundsChecked = 0;
    for (const [id, times] of takenOf) {
      const offset = scrapeOffsetMs(id, INTERVAL_S);
      const slots = times.map((at) => Math.floor((at - offset) / intervalMs));
      expect(new Set(slots).size).toBe(slots.length);
      let due = created.get(id) as number;
      for (let i = 0; i < times.length; i++) {
        expect(times[i]).toBeGreaterThanOrEqual(due);
        const next = nextScrapeAt(id, INTERVAL_S, Math.max(times[i], due + intervalMs / 2));
        if (i > 0 && times[i] - due < intervalMs) {
          expect(next - due).toBe(intervalMs);
          roundsChecked++;
        }
        due = next;
      }
      // Still on its rounds when the collectors stopped: nothing was dropped along the way.
      expect(stopAt - times[times.length - 1]).toBeLessThan(3 * intervalMs);
    }
    expect(roundsChecked).toBeGreaterThanOrEqual(SKETCHES * INSTANCES * 2);

    const byAgent = (name: string) => targets.hits.filter((h) => h.agent === `brimwatch-collector/${name}`).length;
    expect(byAgent('alpha')).toBeGreaterThan(targets.hits.length * 0.1);
    expect(byAgent('beta')).toBeGreaterThan(targets.hits.length * 0.1);
  }, 60_000);

  it('when a collector is told to stop while scrapes hang, then it exits within 10 s and gives their leases back at once', async () => {
    const paths = ['/stuck/0', '/stuck/1', '/stuck/2'];
    paths.forEach((p) => targets.behaviours.set(p, { kind: 'hang' }));
    // A 30-second interval gives a 10-second scrape timeout, longer than the stop's grace.
    const { targetIds } = await addSketch(t.db, paths.map(targets.url), { intervalSeconds: 30 });
    const collector = startCollector('gamma', t.url);
    await collector.metricsPort;
    const seen = async () => paths.every((p) => targets.hits.some((h) => h.path === p));
    while (!(await seen())) await new Promise((resolve) => setTimeout(resolve, 100));
    const leased = await t.db('targets').whereIn('id', targetIds).pluck('lease_owner');
    expect(leased).toEqual(['gamma', 'gamma', 'gamma']);

    const stopAt = Date.now();
    collector.child.kill('SIGTERM');
    expect(await collector.exited).toBe(0);
    expect(Date.now() - stopAt).toBeLessThan(10_000);
    const after = await t.db('targets').whereIn('id', targetIds).select('lease_owner', 'lease_expires_at');
    expect(after).toEqual(targetIds.map(() => ({ lease_owner: null, lease_expires_at: null })));
    expect(collector.output.join('')).toContain('SIGTERM: stopped; 3 unfinished leases given back');
  }, 60_000);
});
