import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dropOldReadings, dropOldRollups, ensureDailyPartitions } from '../../collectors/maintenance/retention';
import { rollUpHours } from '../../collectors/maintenance/rollups';
import { markStaleTargets } from '../../collectors/maintenance/stale';
import { holdSchedulerLease, resignScheduler } from '../../collectors/scheduler-election';
import { createTestDatabase, type TestDatabase } from '../setup/database';
import { addSketch } from './fleet-fixture';

const DAY = 86_400_000;

describe('maintenance', () => {
  let t: TestDatabase;
  beforeAll(async () => {
    t = await createTestDatabase();
  });
  afterAll(() => t.drop());

  it('when one collector holds the scheduler lease, then another is refused until it resigns or the lease runs out', async () => {
    expect(await holdSchedulerLease(t.db, 'a', 30)).toBe(true);
    expect(await holdSchedulerLease(t.db, 'b', 30)).toBe(false);
    expect(await holdSchedulerLease(t.db, 'a', 30)).toBe(true);
    await resignScheduler(t.db, 'a');
    expect(await holdSchedulerLease(t.db, 'b', 30)).toBe(true);
    await t.db('collector_scheduler').update({ expires_at: t.db.raw("now() - interval '1 second'") });
    expect(await holdSchedulerLease(t.db, 'a', 30)).toBe(true);
  });

  it('when a target has had no good reading for three intervals, then it turns stale, but an unreachable one stays unreachable', async () => {
    const { sketchId, targetIds } = await addSketch(t.db, ['http://127.0.0.1:9/a', 'http://127.0.0.1:9/b', 'http://127.0.0.1:9/c', 'http://127.0.0.1:9/d'], { intervalSeconds: 30 });
    const [quiet, fresh, failing] = targetIds;
    const ago = (s: number) => t.db.raw(`now() - interval '${s} seconds'`);
    await t.db('target_status').insert([
      { target_id: quiet, sketch_id: sketchId, level: 'clear', last_ok_at: ago(91) },
      { target_id: fresh, sketch_id: sketchId, level: 'watch', last_ok_at: ago(80) },
      { target_id: failing, sketch_id: sketchId, level: 'unreachable', last_ok_at: ago(500) },
    ]);
    const heard: unknown[] = [];
    const changed = await markStaleTargets(t.db, async (_trx, judged) => void heard.push(...judged), () => undefined);
    expect(changed).toBe(1);
    const levels = Object.fromEntries((await t.db('target_status').whereIn('target_id', targetIds)).map((s) => [s.target_id, s.level]));
    // The fourth target was never read: it gets a status row, stale from the start.
    expect(levels).toEqual({ [quiet]: 'stale', [fresh]: 'watch', [failing]: 'unreachable', [targetIds[3]]: 'stale' });
    expect(heard).toMatchObject([{ sketchId, level: 'unreachable' }]);
  });

  it('when the scheduler has only just started watching, then nothing turns stale before three intervals have passed on its watch', async () => {
    const { sketchId, targetIds } = await addSketch(t.db, ['http://127.0.0.1:9/after-restart'], { intervalSeconds: 30 });
    await t.db('target_status').insert({ target_id: targetIds[0], sketch_id: sketchId, level: 'clear', last_ok_at: t.db.raw(`now() - interval '1 hour'`) });
    const justStarted = new Date(Date.now() - 10_000);
    expect(await markStaleTargets(t.db, async () => undefined, () => undefined, justStarted)).toBe(0);
    const longAgo = new Date(Date.now() - 91_000);
    expect(await markStaleTargets(t.db, async () => undefined, () => undefined, longAgo)).toBe(1);
  });

  it('when readings span hours, then each hour rolls up to its min, max, last, level and peak load, and re-running changes nothing', async () => {
    const { sketchId, targetIds } = await addSketch(t.db, ['http://127.0.0.1:9/r']);
    const hour = Math.floor(Date.now() / 3_600_000) * 3_600_000 - 2 * 3_600_000;
    const reading = (minute: number, total: number | null, level?: string, load?: number) => ({
      target_id: targetIds[0],
      sketch_id: sketchId,
      taken_at: new Date(hour + minute * 60_000),
      ok: total !== null,
      failure_reason: total === null ? 'HTTP status 500' : null,
      stream_total: total,
      width: total === null ? null : 100,
      depth: total === null ? null : 2,
      is_reset: minute === 40,
      judgement: level ? JSON.stringify({ level, load }) : null,
    });
    await t.db('readings').insert([reading(5, 500, 'clear', 0.5), reading(30, 900, 'watch', 0.9), reading(40, 100, 'clear', 0.1), reading(50, null), reading(70, 300, 'clear', 0.3)]);
    await rollUpHours(t.db);
    await rollUpHours(t.db);
    const rows = await t.db('reading_rollups_hourly').where({ target_id: targetIds[0] }).orderBy('hour');
    expect(rows).toHaveLength(2);
    expect(rows[0]).toMatchObject({ readings: 4, failures: 1, min_stream_total: 100, max_stream_total: 900, last_stream_total: 100, last_level: 'clear', max_load: 0.9, resets: 1 });
    expect(rows[0].max_at.getTime()).toBe(hour + 30 * 60_000);
    expect(rows[1]).toMatchObject({ readings: 1, failures: 0, max_stream_total: 300 });
  });

  it('when readings age past the retention, then old daily partitions are dropped and old rows in the default partition deleted', async () => {
    const now = Date.now();
    const created = await ensureDailyPartitions(t.db, now, 2, () => undefined);
    expect(created).toHaveLength(2);
    const { sketchId, targetIds } = await addSketch(t.db, ['http://127.0.0.1:9/old']);
    const row = (at: number) => ({ target_id: targetIds[0], sketch_id: sketchId, taken_at: new Date(at), ok: false, failure_reason: 'connection refused' });
    // One reading 20 days back (default partition), one now (default), one tomorrow (its own partition).
    await t.db('readings').insert([row(now - 20 * DAY), row(now), row(now + DAY)]);
    const tomorrow = created[0];
    expect((await t.db(tomorrow).count('* as n').first())?.n).toBe(1);

    const first = await dropOldReadings(t.db, now, 14);
    expect(first).toEqual({ droppedPartitions: [], deletedRows: 1 });
    // Three weeks on, tomorrow's partition is past a 14-day retention as a whole.
    const later = await dropOldReadings(t.db, now + 21 * DAY, 14);
    expect(later.droppedPartitions).toEqual(created);
    expect(later.deletedRows).toBeGreaterThanOrEqual(1);
    expect(await t.db('readings').where({ target_id: targetIds[0] }).count('* as n').first()).toEqual({ n: 0 });
  });

  it('when hourly rollups age past their own retention, then they are deleted and younger ones kept', async () => {
    const now = Date.now();
    const { sketchId, targetIds } = await addSketch(t.db, ['http://127.0.0.1:9/rolled']);
    const hourAgo = (days: number) => new Date(Math.floor((now - days * DAY) / 3_600_000) * 3_600_000);
    const rollup = (days: number) => ({ target_id: targetIds[0], sketch_id: sketchId, hour: hourAgo(days), readings: 120, failures: 0 });
    await t.db('reading_rollups_hourly').insert([rollup(500), rollup(401), rollup(399), rollup(1)]);
    expect(await dropOldRollups(t.db, now, 400)).toBe(2);
    const left = await t.db('reading_rollups_hourly').where({ target_id: targetIds[0] }).orderBy('hour').pluck('hour');
    expect(left.map((h: Date) => h.getTime())).toEqual([hourAgo(399).getTime(), hourAgo(1).getTime()]);
  });
});
