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
    expect(res.body.markers).toEqual([{ t: new Date(START + 3 * DAY).toISOString(), kind: 'reset', instance: 'a', width: null, depth: null }]);
  });
});
