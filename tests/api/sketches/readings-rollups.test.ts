import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { rollUpHours } from '../../../collectors/maintenance/rollups';
import { addSketch, judgementOf } from './fixtures';
import { as, startSketchWorld, type SketchWorld } from './world';

const HOUR = 3_600_000;
const DAY = 24 * HOUR;
const START = Date.parse('2026-10-01T00:00:00Z');
const STEP = 5 * 60_000;

describe('a sketch history whose old readings have aged out', () => {
  let w: SketchWorld;
  let viewer: string;
  let sketchId: number;
  // A total rising 1,000 a day with a restart at the start of day 3, read every 5 minutes for 6 days.
  const totalAt = (t: number) => (t < START + 3 * DAY ? Math.round((t - START) / 86.4) : Math.round((t - START - 3 * DAY) / 86.4));
  const times = Array.from({ length: (6 * DAY) / STEP }, (_, i) => START + i * STEP);

  beforeAll(async () => {
    w = await startSketchWorld();
    viewer = await w.tokenFor('viewer');
    const { id, targetIds } = await addSketch(w.db, { service: 'checkout', sketch: 'per-card-limiter', team: 'payments', instances: [{ instance: 'a' }] });
    sketchId = id;
    await w.db('readings').insert(
      times.map((t, i) => ({
        target_id: targetIds[0],
        sketch_id: id,
        taken_at: new Date(t),
        ok: true,
        stream_total: totalAt(t),
        width: 272,
        depth: 5,
        counter_bytes: 4,
        is_reset: i > 0 && totalAt(t) < totalAt(times[i - 1]),
        judgement: JSON.stringify(judgementOf({ width: 272, depth: 5, streamTotal: totalAt(t), errorBudget: 100, confidence: 0.99 })),
      })),
    );
    // The collectors' own rollup, then retention drops the first four days of raw readings.
    await rollUpHours(w.db);
    await w.db('readings').where({ sketch_id: id }).where('taken_at', '<', new Date(START + 4 * DAY)).delete();
  });
  afterAll(() => w.close());

  it('when the range reaches back past the raw readings, then the hourly rollups fill those buckets', async () => {
    const res = await as(w.app, viewer).get(`/api/v1/sketches/${sketchId}/readings?from=${new Date(START).toISOString()}&to=${new Date(START + 6 * DAY).toISOString()}&points=6`);
    expect(res.status).toBe(200);
    expect(res.body.points).toHaveLength(6);
    for (const [day, point] of res.body.points.entries()) {
      const inDay = times.filter((t) => t >= START + day * DAY && t < START + (day + 1) * DAY).map(totalAt);
      expect(point.readings, `day ${day}`).toBe(inDay.length);
      expect(point.totalMax, `day ${day}`).toBe(Math.max(...inDay));
      expect(point.totalMin, `day ${day}`).toBe(Math.min(...inDay));
      expect(point.totalLast, `day ${day}`).toBe(inDay[inDay.length - 1]);
    }
    // A rolled-up reset is marked at its hour, with the sizing that hour ended on.
    expect(res.body.markers).toEqual([{ t: new Date(START + 3 * DAY).toISOString(), kind: 'reset', instance: 'a', width: 272, depth: 5 }]);
  });

  it('when buckets are shorter than an hour and reach back past the raw readings, then the aged-out part shows one bucket per rolled-up hour and the rest every reading', async () => {
    const from = START + 4 * DAY - 12 * HOUR;
    const res = await as(w.app, viewer).get(`/api/v1/sketches/${sketchId}/readings?from=${new Date(from).toISOString()}&to=${new Date(from + DAY).toISOString()}&points=48`);
    expect(res.status).toBe(200);
    const rolled = res.body.points.filter((p: { t: string }) => Date.parse(p.t) < START + 4 * DAY);
    const raw = res.body.points.filter((p: { t: string }) => Date.parse(p.t) >= START + 4 * DAY);
    // Half-hour buckets: an hour's rollup lands in the bucket its start falls in, so 12 of the 24 aged-out buckets hold an hour (12 readings) each.
    expect(rolled.map((p: { t: string }) => Date.parse(p.t))).toEqual(Array.from({ length: 12 }, (_, i) => from + i * HOUR));
    expect(rolled.every((p: { readings: number }) => p.readings === 12)).toBe(true);
    // The last bucket ends at `to`, which includes the reading taken at that instant.
    expect(raw.map((p: { readings: number }) => p.readings)).toEqual([...Array.from({ length: 23 }, () => 6), 7]);
  });
});

describe('a long-range chart drawn from the hourly rollups and the latest raw readings', () => {
  let w: SketchWorld;
  let viewer: string;
  let sketchId: number;
  const FROM = Date.parse('2026-11-10T00:00:00Z');
  const HOURS = 30;
  const RESIZED_AT = FROM + 10 * HOUR;
  const RESET_AT = FROM + 29 * HOUR + 30 * 60_000;
  // Every 5 minutes for 30 hours: a rising total, resized from 272 to 544 wide at hour 10, restarted at 29:30, one failed scrape at 05:00.
  const readings = Array.from({ length: (HOURS * HOUR) / STEP }, (_, i) => {
    const t = FROM + i * STEP;
    const ok = t !== FROM + 5 * HOUR;
    const width = t < RESIZED_AT ? 272 : 544;
    const cells = [0, 1, 2, 3, 4].map((row) => (i * 3 + row * 17) % width);
    return { t, ok, total: ok ? (t < RESET_AT ? 100 * i : 7 * i) : null, width, cells, isResize: t === RESIZED_AT, isReset: t === RESET_AT };
  });
  const rowOf = (targetId: number, r: (typeof readings)[number]) => ({
    target_id: targetId,
    sketch_id: sketchId,
    taken_at: new Date(r.t),
    ok: r.ok,
    failure_reason: r.ok ? null : 'HTTP status 500',
    stream_total: r.total,
    width: r.ok ? r.width : null,
    depth: r.ok ? 5 : null,
    counter_bytes: r.ok ? 4 : null,
    nonzero_cells: r.ok ? r.cells : null,
    is_reset: r.isReset,
    is_resize: r.isResize,
    judgement: r.ok ? JSON.stringify(judgementOf({ width: r.width, depth: 5, streamTotal: r.total!, errorBudget: 100, confidence: 0.99 })) : null,
  });

  beforeAll(async () => {
    w = await startSketchWorld();
    viewer = await w.tokenFor('viewer');
    const { id, targetIds } = await addSketch(w.db, { service: 'checkout', sketch: 'per-card-limiter', team: 'payments', instances: [{ instance: 'a' }] });
    sketchId = id;
    // The collectors roll up what they have read by 28:20; the readings after that are raw only.
    const rolledBy = FROM + 28 * HOUR + 20 * 60_000;
    await w.db('readings').insert(readings.filter((r) => r.t < rolledBy).map((r) => rowOf(targetIds[0], r)));
    await rollUpHours(w.db);
    await w.db('readings').insert(readings.filter((r) => r.t >= rolledBy).map((r) => rowOf(targetIds[0], r)));
    // The owner has since halved the error budget: charts show load against the budget the sketch has now.
    await w.db('sketches').where({ id }).update({ error_budget: 50 });
  });
  afterAll(() => w.close());

  // Two-hour buckets hand over from rollups to raw readings at a bucket's edge (28:00); three-hour ones inside the bucket 27:00–30:00.
  it.each([15, 10])('when each bucket spans hours (%i buckets), then every bucket matches the readings it covers, load is against the current budget, and resizes and resets are marked', async (points) => {
    const res = await as(w.app, viewer).get(`/api/v1/sketches/${sketchId}/readings?from=${new Date(FROM).toISOString()}&to=${new Date(FROM + HOURS * HOUR).toISOString()}&points=${points}`);
    expect(res.status).toBe(200);
    const span = (HOURS / points) * HOUR;
    expect(res.body.bucketSeconds).toBeCloseTo(span / 1000, 6);
    expect(res.body.points).toHaveLength(points);
    for (const [n, point] of res.body.points.entries()) {
      const lo = FROM + n * span;
      const inBucket = readings.filter((r) => r.t >= lo && r.t < lo + span);
      const good = inBucket.filter((r) => r.ok);
      expect(point.t).toBe(new Date(lo).toISOString());
      expect(point.readings, `bucket ${n}`).toBe(inBucket.length);
      expect(point.failures, `bucket ${n}`).toBe(inBucket.length - good.length);
      expect(point.totalMin, `bucket ${n}`).toBe(Math.min(...good.map((r) => r.total!)));
      expect(point.totalMax, `bucket ${n}`).toBe(Math.max(...good.map((r) => r.total!)));
      expect(point.totalLast, `bucket ${n}`).toBe(good.at(-1)!.total);
      // Occupancy: the share of non-zero cells per row at the bucket's last good reading.
      expect(point.occupancy, `bucket ${n}`).toEqual(good.at(-1)!.cells.map((c) => c / good.at(-1)!.width));
      // Load n / (m·E·δ^(1/k)): capacity m·E·δ^(1/k) from the count-min bound (Cormode & Muthukrishnan 2005), as DESIGN.md defines it, with E = 50 now.
      const loads = good.map((r) => r.total! / (r.width * 50 * Math.pow(0.01, 1 / 5)));
      expect(point.loadMax, `bucket ${n}`).toBeCloseTo(Math.max(...loads), 9);
    }
    expect(res.body.markers).toEqual([
      // From the rollups: at the hour, with the sizing the hour ended on.
      { t: new Date(RESIZED_AT).toISOString(), kind: 'resize', instance: 'a', width: 544, depth: 5 },
      // From the raw readings, after the rollups' latest hour: at the reading.
      { t: new Date(RESET_AT).toISOString(), kind: 'reset', instance: 'a', width: 544, depth: 5 },
    ]);
  });
});
