import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addSketch, judgementOf } from './fixtures';
import { as, startSketchWorld, type SketchWorld } from './world';

const DAY = 86_400_000;
const SLOPE_PER_DAY = 1000;

describe('one sketch with its resize plan', () => {
  let w: SketchWorld;
  let viewer: string;
  let id: number;
  beforeAll(async () => {
    w = await startSketchWorld();
    viewer = await w.tokenFor('viewer');
    const now = Date.now();
    // A week of readings every 10 minutes on an exact line: 2,000 a week ago, +1,000 a day, 9,000 now.
    const points = Array.from({ length: 7 * 144 + 1 }, (_, i) => ({ t: now - 7 * DAY + i * 600_000, total: 2000 + (i * 600_000 * SLOPE_PER_DAY) / DAY }));
    const last = points[points.length - 1];
    const fixture = await addSketch(w.db, {
      service: 'search',
      sketch: 'heavy-queries',
      team: 'discovery',
      instances: [{ instance: 'search-1', streamTotal: last.total }, { instance: 'search-2', streamTotal: 100 }],
    });
    id = fixture.id;
    await w.db('readings').insert(
      points.map((p) => ({
        target_id: fixture.targetIds[0],
        sketch_id: id,
        taken_at: new Date(p.t),
        ok: true,
        stream_total: p.total,
        width: 272,
        depth: 5,
        counter_bytes: 4,
        judgement: JSON.stringify(judgementOf({ width: 272, depth: 5, streamTotal: p.total, errorBudget: 100, confidence: 0.99 })),
      })),
    );
  });
  afterAll(() => w.close());

  it('when a sketch is read, then the worst instance speaks for it and every instance has its own figures', async () => {
    const res = await as(w.app, viewer).get(`/api/v1/sketches/${id}`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id, service: 'search', sketch: 'heavy-queries', team: 'discovery', level: 'watch', streamTotal: 9000, width: 272, depth: 5 });
    expect(res.body.instances).toEqual([
      expect.objectContaining({ instance: 'search-1', level: 'watch', streamTotal: 9000 }),
      expect.objectContaining({ instance: 'search-2', level: 'clear', streamTotal: 100 }),
    ]);
    for (const key of ['load', 'capacity', 'boundNow', 'missRisk', 'brimDate', 'brimEarliest', 'brimLatest', 'lastReadingAt', 'lastError', 'memoryBytes', 'errorBudget', 'confidence', 'watchLine', 'leadTimeDays', 'scrapeIntervalSeconds', 'sizedTotal']) {
      expect(res.body, key).toHaveProperty(key);
    }
  });

  it('when the total rises on a line, then the plan sizes for the 90-day forecast plus 25 % headroom', async () => {
    const plan = (await as(w.app, viewer).get(`/api/v1/sketches/${id}`)).body.resizePlan;
    // The line reaches 9,000 + 90 × 1,000 = 99,000 in 90 days (a straight line's Theil–Sen slope is its own slope).
    expect(plan.forecastTrend).toBe('rising');
    expect(plan.forecastTotal).toBeCloseTo(99_000, -1);
    expect(plan.targetTotal).toBeCloseTo(99_000 * 1.25, -1);
    // Cormode & Muthukrishnan (2005): m = ⌈e/ε⌉ with ε = E/n₀ = 100/123,750 → ⌈3,363.9⌉; k = ⌈ln(1/0.01)⌉ = ⌈4.61⌉.
    expect(plan).toMatchObject({ width: 3364, depth: 5, memoryBytes: 3364 * 5 * 4, widthBefore: 272, depthBefore: 5, memoryBytesBefore: 272 * 5 * 4, resizeNeeded: true });
    expect(plan.reason).toContain('3,364');
  });

  it('when a cumulative sketch restarts every day, then the plan sizes for the trend of its daily peaks, not one run stretched over 90 days', async () => {
    const now = Date.now();
    const HOUR = 3_600_000;
    // Runs of 24 h, the current one started 12 h ago; run k peaks at (100,000 + 10,000·k)·(elapsed / 24 h).
    const runStart = (k: number) => now - 7 * DAY + 12 * HOUR + k * 24 * HOUR;
    const points = Array.from({ length: 7 * 144 + 1 }, (_, i) => {
      const t = now - 7 * DAY + i * 600_000;
      const k = Math.floor((t - runStart(0)) / (24 * HOUR));
      return { t, total: Math.floor((100_000 + 10_000 * k) * ((t - runStart(k)) / (24 * HOUR))) };
    });
    const fixture = await addSketch(w.db, { service: 'api-gateway', sketch: 'per-key-quota', team: 'edge', errorBudget: 1000, instances: [{ instance: 'gw-1', streamTotal: points[points.length - 1].total }] });
    await w.db('readings').insert(
      points.map((p) => ({ target_id: fixture.targetIds[0], sketch_id: fixture.id, taken_at: new Date(p.t), ok: true, stream_total: p.total, width: 272, depth: 5, counter_bytes: 4 })),
    );
    const plan = (await as(w.app, viewer).get(`/api/v1/sketches/${fixture.id}`)).body.resizePlan;
    // Each run's last reading, 10 minutes before its end, holds 143/144 of its peak; those readings lie on a line
    // rising 10,000 × 143/144 a day. The last finished run peaked 12 h 10 min ago at 150,000 × 143/144, so 90 days
    // on: (150,000 + 10,000 × (90 + 0.5 + 10/1440)) × 143/144 ≈ 1,047,742 (worked by hand).
    expect(plan.forecastTotal / 1_047_742).toBeCloseTo(1, 3);
    // m = ⌈e·n₀/E⌉ (Cormode & Muthukrishnan 2005) with n₀ = 1.25 × the forecast and E = 1,000.
    expect(plan.width).toBe(Math.ceil((Math.E * 1.25 * plan.forecastTotal) / 1000));
  });
});
