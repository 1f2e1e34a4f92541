import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { start, type RunningServer } from '../../backend/src/server';
import { scrapeOffsetMs } from '../../collectors/schedule';
import { testConfig } from '../setup/database';
import { addSketch } from '../collectors/fleet-fixture';
import { startLoopbackTargets, type LoopbackTargets } from '../collectors/loopback-targets';
import { endChild, startCollectorChild, type CollectorChild } from './collector-child';
import { eventually, sleep } from './deadline';
import { startOwnCluster, type OwnCluster } from './own-cluster';

const INTERVAL_S = 5;
const TARGETS = 60;
const PORT = Number(process.env.FAULTS_PGPORT ?? 54379);

describe('PostgreSQL restarted in the middle of a collection round', () => {
  let pg: OwnCluster;
  let targets: LoopbackTargets;
  let web: RunningServer;
  let collector: CollectorChild | undefined;
  beforeAll(async () => {
    pg = await startOwnCluster('faults-restart-pg', PORT);
    targets = await startLoopbackTargets();
    web = await start(testConfig(pg.url));
  });
  afterAll(async () => {
    await endChild(collector);
    await web?.stop();
    await targets?.close();
    if (pg) {
      pg.cluster.start();
      await pg.close();
    }
  });

  it('when the server stops and starts again, then health answers 503 meanwhile and 200 after, the collector resumes within a round, and no reading is half-written', async () => {
    const paths = Array.from({ length: TARGETS }, (_, i) => `/restart/${i}`);
    paths.forEach((p, i) => targets.behaviours.set(p, { kind: 'sketch', label: 'limiter', figures: { width: 2719, depth: 5, streamTotal: 10_000 + i, nonzeroCells: [900, 901, 902, 903, 904] } }));
    for (let s = 0; s < TARGETS; s += 5) await addSketch(pg.db, paths.slice(s, s + 5).map(targets.url), { intervalSeconds: INTERVAL_S });
    const health = async () => (await fetch(`${web.url}/api/health`)).status;
    expect(await health()).toBe(200);

    collector = startCollectorChild('through-restart', pg.url);
    await collector.metricsPort;
    const readTargets = async (since: Date) => Number((await pg.db('readings').where('taken_at', '>', since).countDistinct('target_id as n').first())?.n);
    await eventually('every target has a reading', 30_000, async () => (await readTargets(new Date(0))) === TARGETS);
    // Targets are spread over the interval, so some scrape or store is always under way: this is mid-round.
    await sleep(1200);
    pg.cluster.stop();
    const down = await eventually('health answers 503', 10_000, async () => {
      const res = await fetch(`${web.url}/api/health`);
      return res.status === 503 ? ((await res.json()) as { reason: string }) : false;
    });
    expect(down.reason).toMatch(/^the database does not answer/);
    await sleep(3000);
    expect(await health()).toBe(503);
    pg.cluster.start();
    const restarted = new Date();
    await eventually('health answers 200 again', 15_000, async () => (await health()) === 200);

    // Within one round (one interval, plus the time to notice the server is back) readings flow again …
    await eventually('a reading is stored after the restart', (INTERVAL_S + 5) * 1000, async () => (await readTargets(restarted)) > 0);
    // … and every target is read again once the leases of the batch lost at the stop have run out (one lease: 4 s + 1 s margin).
    await eventually('every target is read after the restart', (2 * INTERVAL_S + 5) * 1000, async () => (await readTargets(restarted)) === TARGETS);
    expect(collector.child.exitCode).toBeNull();

    // Whole readings only: each good one has its figures and judgement, and each target's status is its latest reading.
    const partial = await pg.db('readings').where({ ok: true }).where((q) => q.whereNull('judgement').orWhereNull('nonzero_cells').orWhereNull('stream_total')).count('* as n').first();
    expect(Number(partial?.n)).toBe(0);
    const mismatched = await pg.db.raw(
      `select s.target_id from target_status s
       join lateral (select max(taken_at) as latest from readings r where r.target_id = s.target_id) r on true
       where s.taken_at is distinct from r.latest`,
    );
    expect(mismatched.rows).toEqual([]);
    // A store cut short left nothing to store twice: every reading has a slot of its target's own (a late
    // scrape after the restart counts in the slot it was taken in).
    const rows: { target_id: number; taken_at: Date }[] = await pg.db('readings').select('target_id', 'taken_at');
    const slots = rows.map((r) => `${r.target_id}:${Math.floor((r.taken_at.getTime() - scrapeOffsetMs(r.target_id, INTERVAL_S)) / (INTERVAL_S * 1000))}`);
    expect(new Set(slots).size).toBe(slots.length);
  }, 120_000);
});
