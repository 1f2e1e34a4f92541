import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { assess } from '../../backend/src/maths';
import { createTestDatabase, type TestDatabase } from '../setup/database';
import { addSketch, collectRound, makeAllDue } from './fleet-fixture';
import { startLoopbackTargets, type LoopbackTargets, type TargetFigures } from './loopback-targets';

const FIGURES: TargetFigures = { width: 2719, depth: 5, streamTotal: 50_000, nonzeroCells: [1500, 1500, 1500, 1500, 1500] };

describe('scrape → reading → judgement', () => {
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
  beforeEach(async () => {
    await t.db('targets').delete();
  });

  const serve = (path: string, figures: TargetFigures) => targets.behaviours.set(path, { kind: 'sketch', label: 'limiter', figures });
  const readingsOf = (targetId: number) => t.db('readings').where({ target_id: targetId }).orderBy('taken_at');
  // The whole judgement is the target's latest word; each reading keeps its level and load.
  const latestJudgementOf = async (targetId: number) => (await t.db('target_status').where({ target_id: targetId }).first()).judgement;

  it('when a target serves its sketch, then the reading carries its figures and a judgement with the load of the published formula', async () => {
    serve('/one', FIGURES);
    const { targetIds } = await addSketch(t.db, [targets.url('/one')], { errorBudget: 100, confidence: 0.99 });
    const { stored } = await collectRound(t.db);
    expect(stored).toMatchObject({ stored: 1, leaseConflicts: 0, levels: ['clear'] });

    const [reading] = await readingsOf(targetIds[0]);
    expect(reading).toMatchObject({ ok: true, stream_total: 50_000, width: 2719, depth: 5, counter_bytes: 4, window_seconds: 0, conservative: false, nonzero_cells: [1500, 1500, 1500, 1500, 1500], is_reset: false, is_resize: false });
    const j = await latestJudgementOf(targetIds[0]);
    expect(reading.judgement).toEqual({ level: j.level, load: j.load });
    // Cormode & Muthukrishnan (2005) with Markov over k rows (DESIGN.md): capacity = m·E·δ^(1/k),
    // by hand δ^(1/5) = 10^(−0.4) = 0.398107…, so capacity = 2719·100·0.398107 = 108,245.34 and load = 50,000 / 108,245.34 = 0.461914.
    expect(j.capacity).toBeCloseTo(108_245.34, 2);
    expect(j.load).toBeCloseTo(0.461914, 6);
    // miss risk = (n/(m·E))^k = (50,000/271,900)^5 = 2.1028e−4, by hand.
    expect(j.missRisk).toBeCloseTo(2.1028e-4, 8);
    expect(j.load).toBe(assess({ width: 2719, depth: 5, errorBudget: 100, confidence: 0.99, streamTotal: 50_000 }).load);
    // Linear counting (Whang, Vander-Zanden & Taylor 1990): D ≈ −m·ln V, V = 1219/2719 → 2181.27 by hand.
    expect(j.distinctEstimate).toBeCloseTo(2181.27, 2);
    expect(j).toMatchObject({ level: 'clear', trend: 'none', saturatedRows: 0, errorBudget: 100, confidence: 0.99, watchLine: 0.8, brimAt: null });
    expect(j.trendReason).toBe('only 1 readings since the last reset; a trend needs at least 5');

    const status = await t.db('target_status').where({ target_id: targetIds[0] }).first();
    expect(status).toMatchObject({ level: 'clear', failures_in_row: 0, last_error: null, stream_total: 50_000, width: 2719 });
    const target = await t.db('targets').where({ id: targetIds[0] }).first();
    expect(target.lease_owner).toBeNull();
    expect(target.next_scrape_at.getTime()).toBeGreaterThan(Date.now() + 10_000);
  });

  it('when the stream total falls, then the reading is a reset, the history stays, and the new segment is judged alone', async () => {
    serve('/restarting', { ...FIGURES, streamTotal: 90_000 });
    const { targetIds } = await addSketch(t.db, [targets.url('/restarting')]);
    await collectRound(t.db);
    serve('/restarting', { ...FIGURES, streamTotal: 1_000 });
    await makeAllDue(t.db);
    await collectRound(t.db);

    const readings = await readingsOf(targetIds[0]);
    expect(readings.map((r) => [r.stream_total, r.is_reset, r.is_resize])).toEqual([[90_000, false, false], [1_000, true, false]]);
    expect(readings[1].judgement.load).toBeCloseTo(1_000 / 108_245.34, 6);
    expect((await latestJudgementOf(targetIds[0])).trendReason).toBe('only 1 readings since the last reset; a trend needs at least 5');
  });

  it('when the width changes, then the reading is a resize and the forecast starts a new epoch', async () => {
    serve('/resized', FIGURES);
    const { targetIds } = await addSketch(t.db, [targets.url('/resized')]);
    for (let i = 0; i < 3; i++) {
      serve('/resized', { ...FIGURES, streamTotal: 50_000 + i * 1000 });
      await makeAllDue(t.db);
      await collectRound(t.db);
    }
    serve('/resized', { ...FIGURES, width: 5437, streamTotal: 54_000 });
    await makeAllDue(t.db);
    await collectRound(t.db);

    const readings = await readingsOf(targetIds[0]);
    expect(readings.map((r) => r.is_resize)).toEqual([false, false, false, true]);
    const j = await latestJudgementOf(targetIds[0]);
    expect(j.capacity).toBeCloseTo(5437 * 100 * 0.39810717, 1);
    expect(j.trendReason).toBe('only 1 readings since the last reset; a trend needs at least 5');
  });

  it('when the total climbs fast enough to brim within the lead time, then the level is at least watch below the watch line', async () => {
    serve('/climbing', { ...FIGURES, streamTotal: 70_000 });
    const { sketchId, targetIds } = await addSketch(t.db, [targets.url('/climbing')]);
    const now = Date.now();
    // Ten earlier readings, one a minute, rising 1,000 a minute: 60,000 … 69,000.
    await t.db('readings').insert(
      Array.from({ length: 10 }, (_, i) => ({ target_id: targetIds[0], sketch_id: sketchId, taken_at: new Date(now - (10 - i) * 60_000), ok: true, stream_total: 60_000 + i * 1000, width: 2719, depth: 5 })),
    );
    await collectRound(t.db);

    const [latest] = await t.db('readings').where({ target_id: targetIds[0] }).orderBy('taken_at', 'desc').limit(1);
    const j = await latestJudgementOf(targetIds[0]);
    expect(latest.judgement).toEqual({ level: 'watch', load: j.load });
    expect(j.load).toBeLessThan(0.8);
    expect(j.trend).toBe('rising');
    // (108,245 − 70,000) / 1,000 a minute ≈ 38 minutes ahead, far inside the 7-day lead time.
    const minutesAhead = (Date.parse(j.brimAt) - latest.taken_at.getTime()) / 60_000;
    expect(minutesAhead).toBeGreaterThan(36);
    expect(minutesAhead).toBeLessThan(40);
    expect(j.level).toBe('watch');
  });

  it('when a windowed sketch has just reset, then its forecast runs through the hourly peaks of the rollups and its level through the last peak', async () => {
    serve('/windowed', { ...FIGURES, streamTotal: 10_000, windowSeconds: 3600 });
    const { sketchId, targetIds } = await addSketch(t.db, [targets.url('/windowed')]);
    const hour = Math.floor(Date.now() / 3_600_000) * 3_600_000;
    // Six finished hourly windows whose peaks grow by 5,000 an hour: 50,000 … 75,000.
    await t.db('reading_rollups_hourly').insert(
      Array.from({ length: 6 }, (_, i) => {
        const start = hour - (6 - i) * 3_600_000;
        return { target_id: targetIds[0], sketch_id: sketchId, hour: new Date(start), readings: 100, failures: 0, max_stream_total: 50_000 + i * 5000, max_at: new Date(start + 50 * 60_000) };
      }),
    );
    await collectRound(t.db);

    const [reading] = await readingsOf(targetIds[0]);
    const j = await latestJudgementOf(targetIds[0]);
    expect(reading.judgement).toEqual({ level: 'watch', load: j.load });
    expect(j.judgedTotal).toBe(75_000);
    expect(j.load).toBeCloseTo(75_000 / 108_245.34, 6);
    expect(j.trend).toBe('rising');
    // By hand: (108,245 − 75,000) / 5,000 an hour = 6.65 hours after the last peak.
    const lastPeak = hour - 3_600_000 + 50 * 60_000;
    expect((Date.parse(j.brimAt) - lastPeak) / 3_600_000).toBeCloseTo(6.65, 2);
    expect(j.level).toBe('watch');
  });
});
