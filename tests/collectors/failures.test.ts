import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SketchJudged } from '../../backend/src/alerts/evaluate';
import { alertsHookWith } from '../../collectors/sketch-level';
import { createTestDatabase, type TestDatabase } from '../setup/database';
import { addSketch, collectRound, makeAllDue } from './fleet-fixture';
import { startLoopbackTargets, type LoopbackTargets } from './loopback-targets';

const GOOD = { width: 2719, depth: 5, streamTotal: 50_000, nonzeroCells: [1500, 1500, 1500, 1500, 1500] };

describe('failed scrapes', () => {
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

  it('when targets fail in every way, then each failure is stored with its reason and no figures, the good target is stored, and two failures make a target unreachable', async () => {
    targets.behaviours.set('/good', { kind: 'sketch', label: 'limiter', figures: GOOD });
    targets.behaviours.set('/error', { kind: 'status', status: 500 });
    targets.behaviours.set('/moved', { kind: 'status', status: 301, location: '/good' });
    targets.behaviours.set('/hang', { kind: 'hang' });
    targets.behaviours.set('/reset', { kind: 'reset' });
    targets.behaviours.set('/huge', { kind: 'huge' });
    targets.behaviours.set('/garbage', { kind: 'body', body: 'countmin_width{sketch="limiter"} ten\n', contentType: 'text/plain' });
    const withTotal = (total: string) =>
      `countmin_width{sketch="limiter"} 8\ncountmin_depth{sketch="limiter"} 1\ncountmin_stream_total{sketch="limiter"} ${total}\ncountmin_nonzero_cells{sketch="limiter",row="0"} 1\ncountmin_counter_bytes{sketch="limiter"} 4\ncountmin_window_seconds{sketch="limiter"} 0\ncountmin_conservative{sketch="limiter"} 0\n`;
    targets.behaviours.set('/nan', { kind: 'body', body: withTotal('NaN'), contentType: 'text/plain' });
    targets.behaviours.set('/inf', { kind: 'body', body: withTotal('+Inf'), contentType: 'text/plain' });
    const paths = ['/good', '/error', '/moved', '/hang', '/reset', '/huge', '/garbage', '/nan', '/inf'];
    const sketches = await Promise.all(paths.map((p) => addSketch(t.db, [targets.url(p)], { intervalSeconds: 5 })));
    const refused = await addSketch(t.db, ['http://127.0.0.1:1/metrics'], { intervalSeconds: 5 });
    const outside = await addSketch(t.db, ['http://10.0.0.1/metrics'], { intervalSeconds: 5 });
    const idOf = (i: number) => sketches[i].targetIds[0];

    await collectRound(t.db);
    const reasons = async () =>
      Object.fromEntries((await t.db('readings').orderBy('taken_at')).map((r) => [r.target_id, r]));
    const byTarget = await reasons();
    expect(byTarget[idOf(0)]).toMatchObject({ ok: true, stream_total: 50_000 });
    const expected: [number, string | RegExp][] = [
      [idOf(1), 'HTTP status 500'],
      [idOf(2), 'redirect refused: HTTP status 301 to /good; register the final URL instead'],
      [idOf(3), 'timeout after 4 s (no response)'],
      [idOf(4), 'connection reset by the target'],
      [idOf(5), `too large: the response exceeds SCRAPE_MAX_BYTES (${64 * 1024} bytes)`],
      [idOf(6), 'parse error at line 1: countmin_width has a value that is not a number: "ten"'],
      [idOf(7), 'countmin_stream_total is NaN for sketch="limiter" (line 3)'],
      [idOf(8), 'countmin_stream_total is +Inf for sketch="limiter" (line 3)'],
      [refused.targetIds[0], 'connection refused'],
      [outside.targetIds[0], /^not allowed: address 10\.0\.0\.1 is outside TARGET_ALLOWLIST/],
    ];
    for (const [id, reason] of expected) {
      const r = byTarget[id];
      expect(r.ok).toBe(false);
      if (typeof reason === 'string') expect(r.failure_reason).toBe(reason);
      else expect(r.failure_reason).toMatch(reason);
      // Never a zero in place of a figure.
      expect([r.stream_total, r.width, r.depth, r.nonzero_cells, r.judgement]).toEqual([null, null, null, null, null]);
    }
    const first = await t.db('target_status').whereIn('target_id', expected.map(([id]) => id));
    expect(first.every((s) => s.level === 'stale' && s.failures_in_row === 1 && s.last_error)).toBe(true);

    await makeAllDue(t.db);
    await collectRound(t.db);
    const second = await t.db('target_status').whereIn('target_id', expected.map(([id]) => id));
    expect(second.map((s) => [s.level, s.failures_in_row])).toEqual(expected.map(() => ['unreachable', 2]));
    const good = await t.db('target_status').where({ target_id: idOf(0) }).first();
    expect(good).toMatchObject({ level: 'clear', failures_in_row: 0 });
    expect(await t.db('readings').where({ target_id: idOf(0), ok: true }).count('* as n').first()).toEqual({ n: 2 });
    // Every target, failing or not, has one reading per round.
    const perTarget = await t.db('readings').select('target_id').count('* as n').groupBy('target_id');
    expect(perTarget).toHaveLength(11);
    expect(perTarget.every((row) => Number(row.n) === 2)).toBe(true);
  }, 20_000);

  it('when one instance of a sketch fails once and then twice while another is clear, then the alerts hear stale and then unreachable', async () => {
    targets.behaviours.set('/replica-ok', { kind: 'sketch', label: 'limiter', figures: GOOD });
    targets.behaviours.set('/replica-down', { kind: 'status', status: 503 });
    await t.db('targets').delete();
    const { sketchId } = await addSketch(t.db, [targets.url('/replica-ok'), targets.url('/replica-down')]);
    const heard: SketchJudged[][] = [];
    const alertsHook = async (_trx: unknown, judged: SketchJudged[]) => void heard.push(judged);
    await collectRound(t.db, { alertsHook });
    await makeAllDue(t.db);
    await collectRound(t.db, { alertsHook });
    expect(heard.map((round) => round.map((j) => [j.sketchId, j.level]))).toEqual([[[sketchId, 'stale']], [[sketchId, 'unreachable']]]);
  });

  it('when the alerts fail inside their savepoint, then the fault is logged and the readings are stored all the same', async () => {
    targets.behaviours.set('/brimmed-too', { kind: 'sketch', label: 'limiter', figures: { ...GOOD, streamTotal: 200_000 } });
    await t.db('targets').delete();
    const { targetIds } = await addSketch(t.db, [targets.url('/brimmed-too')]);
    // A fault in the database, as the alerts engine would meet it: inside its own savepoint.
    const failingAlerts = (trx: Knex.Transaction) => trx.transaction((savepoint) => savepoint.raw('select 1 / 0'));
    const { stored, logs } = await collectRound(t.db, { alertsHook: failingAlerts });
    expect(stored.stored).toBe(1);
    expect(logs.some((line) => /^alerts not evaluated for sketches \d+: .*division by zero/.test(line))).toBe(true);
    expect(await t.db('readings').where({ target_id: targetIds[0], ok: true }).count('* as n').first()).toEqual({ n: 1 });
    expect((await t.db('target_status').where({ target_id: targetIds[0] }).first()).level).toBe('brimmed');
  });

  it('when a sketch brims, then the real alerts hook opens an alert in the same transaction as the reading', async () => {
    targets.behaviours.set('/brimmed', { kind: 'sketch', label: 'limiter', figures: { ...GOOD, streamTotal: 200_000 } });
    await t.db('targets').delete();
    const { sketchId } = await addSketch(t.db, [targets.url('/brimmed')]);
    await collectRound(t.db, { alertsHook: alertsHookWith() });
    const alert = await t.db('alerts').where({ sketch_id: sketchId }).first();
    expect(alert).toMatchObject({ state: 'open', level: 'brimmed' });
  });
});
