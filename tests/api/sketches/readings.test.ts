import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addSketch, judgementOf } from './fixtures';
import { as, startSketchWorld, type SketchWorld } from './world';

const START = Date.parse('2026-11-01T00:00:00Z');
const STEP = 30_000;
const COUNT = 6000; // 50 hours of 30-second readings

interface Raw {
  t: number;
  targetId: number;
  ok: boolean;
  total: number | null;
  load: number | null;
  reset: boolean;
}

describe('a sketch history, downsampled in the database', () => {
  let w: SketchWorld;
  let viewer: string;
  let sketchId: number;
  const raw: Raw[] = [];

  beforeAll(async () => {
    w = await startSketchWorld();
    viewer = await w.tokenFor('viewer');
    const { id, targetIds } = await addSketch(w.db, { service: 'search', sketch: 'heavy-queries', team: 'discovery', instances: [{ instance: 'a' }, { instance: 'b' }] });
    sketchId = id;
    // A growing total with one restart, one lone spike, and a failed scrape every 97th reading.
    for (let i = 0; i < COUNT; i++) {
      const targetId = targetIds[i % 2];
      const ok = i % 97 !== 0;
      const base = i < 4000 ? 1000 + i * 2 : (i - 4000) * 2;
      const total = i === 2345 ? 40_000 : base;
      raw.push({ t: START + i * STEP, targetId, ok, total: ok ? total : null, load: null, reset: i === 4000 });
    }
    const rows = raw.map((r) => {
      const judgement = r.ok ? judgementOf({ width: 272, depth: 5, streamTotal: r.total as number, errorBudget: 100, confidence: 0.99 }) : null;
      r.load = judgement?.load ?? null;
      return {
        target_id: r.targetId,
        sketch_id: sketchId,
        taken_at: new Date(r.t),
        ok: r.ok,
        failure_reason: r.ok ? null : 'connection refused',
        stream_total: r.total,
        width: r.ok ? 272 : null,
        depth: r.ok ? 5 : null,
        counter_bytes: r.ok ? 4 : null,
        is_reset: r.reset,
        judgement: judgement ? JSON.stringify(judgement) : null,
      };
    });
    for (let i = 0; i < rows.length; i += 1000) await w.db('readings').insert(rows.slice(i, i + 1000));
  });
  afterAll(() => w.close());

  const history = (query: string) => as(w.app, viewer).get(`/api/v1/sketches/${sketchId}/readings${query}`);
  const range = (from: number, to: number) => `from=${new Date(from).toISOString()}&to=${new Date(to).toISOString()}`;

  it('when 50 points are asked of 6,000 readings, then at most 50 come back and together they account for every reading', async () => {
    const res = await history(`?${range(START, START + COUNT * STEP)}&points=50`);
    expect(res.status).toBe(200);
    expect(res.body.points.length).toBeLessThanOrEqual(50);
    expect(res.body.points.length).toBeGreaterThan(40);
    const sum = res.body.points.reduce((s: number, p: { readings: number }) => s + p.readings, 0);
    expect(sum).toBe(COUNT);
    expect(res.body.points.reduce((s: number, p: { failures: number }) => s + p.failures, 0)).toBe(raw.filter((r) => !r.ok).length);
  });

  it('when downsampled, then the lone spike and the highest load survive in their bucket', async () => {
    const res = await history(`?${range(START, START + COUNT * STEP)}&points=20`);
    const maxTotal = Math.max(...res.body.points.map((p: { totalMax: number }) => p.totalMax));
    const maxLoad = Math.max(...res.body.points.map((p: { loadMax: number }) => p.loadMax));
    expect(maxTotal).toBe(40_000);
    expect(maxLoad).toBeCloseTo(Math.max(...raw.map((r) => r.load ?? 0)), 9);
    const spikeBucket = res.body.points.find((p: { totalMax: number }) => p.totalMax === 40_000);
    expect(Date.parse(spikeBucket.t)).toBeLessThanOrEqual(START + 2345 * STEP);
    expect(Date.parse(spikeBucket.t) + res.body.bucketSeconds * 1000).toBeGreaterThan(START + 2345 * STEP);
  });

  it('when every bucket is checked against the raw readings, then min, max and last good total match', async () => {
    const from = START + 1000 * STEP;
    const to = START + 2000 * STEP;
    const res = await history(`?${range(from, to)}&points=10`);
    const width = (to - from) / 10;
    for (const p of res.body.points) {
      const start = Date.parse(p.t);
      const inBucket = raw.filter((r) => r.t >= start && (r.t < start + width || (r.t === to && start + width >= to)) && r.t >= from && r.t <= to);
      const totals = inBucket.filter((r) => r.ok).map((r) => r.total as number);
      expect(p.readings).toBe(inBucket.length);
      expect(p.totalMin).toBe(Math.min(...totals));
      expect(p.totalMax).toBe(Math.max(...totals));
      expect(p.totalLast).toBe(totals[totals.length - 1]);
    }
  });

  it('when the range holds a restart, then a reset marker names the instance and time', async () => {
    const res = await history(`?${range(START, START + COUNT * STEP)}&points=100`);
    expect(res.body.markers).toEqual([{ t: new Date(START + 4000 * STEP).toISOString(), kind: 'reset', instance: 'a', width: 272, depth: 5 }]);
  });

  it('when one instance is asked for, then only its readings are bucketed', async () => {
    const res = await history(`?${range(START, START + COUNT * STEP)}&points=10&instance=b`);
    expect(res.body.points.reduce((s: number, p: { readings: number }) => s + p.readings, 0)).toBe(COUNT / 2);
    expect(res.body.markers).toEqual([]);
    const unknown = await history(`?${range(START, START + STEP * 10)}&instance=zz`);
    expect(unknown.status).toBe(400);
    expect(unknown.body.error).toMatchObject({ field: 'instance', message: expect.stringContaining('a, b') });
  });

  it('when points, from or to are wrong, then 400 names the parameter', async () => {
    for (const [query, field] of [
      ['?points=5001', 'points'],
      ['?points=0', 'points'],
      ['?from=yesterday', 'from'],
      [`?${range(START + STEP, START)}`, 'from'],
      ['?from=2000-01-01T00:00:00Z&to=2026-01-01T00:00:00Z', 'from'],
    ]) {
      const res = await history(query);
      expect(res.status, query).toBe(400);
      expect(res.body.error.field, query).toBe(field);
    }
  });

  it('when the sketch does not exist, then 404', async () => {
    expect((await as(w.app, viewer).get('/api/v1/sketches/999999/readings')).status).toBe(404);
  });
});
