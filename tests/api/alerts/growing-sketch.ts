import type { Db } from '../../../backend/src/db';
import { evaluateSketchAlerts } from '../../../backend/src/alerts/evaluate';
import type { Clock } from '../../../backend/src/alerts/clock';
import { alertSettingsFrom, type AlertSettings } from '../../../backend/src/alerts/settings';
import { assess } from '../../../backend/src/maths/assess';
import { forecastBrim } from '../../../backend/src/maths/forecast';
import type { HealthLevel } from '../../../backend/src/maths/health-levels';
import { testConfig } from '../../setup/database';

export interface GrowingSketch {
  sketchId: number;
  targetId: number;
  teamId: number;
  width: number;
  depth: number;
  errorBudget: number;
  confidence: number;
}

export function alertTestSettings(url: string, overrides: Partial<AlertSettings> = {}): AlertSettings {
  return { ...alertSettingsFrom(testConfig(url, { PUBLIC_URL: 'http://brimwatch.larkfield.test' })), ...overrides };
}

/** A clock the test moves by hand. */
export function handClock(start: Date): Clock & { set(at: Date): void } {
  let now = start;
  return { now: () => now, set: (at) => void (now = at) };
}

/** One registered sketch with one instance, not yet read; its team (from the demo seed) has alert and escalation addresses. */
export async function addGrowingSketch(
  db: Db,
  f: { team: string; service: string; sketch: string; width: number; depth: number; errorBudget: number; confidence: number },
): Promise<GrowingSketch> {
  const team = await db('teams').where({ slug: f.team }).first('id');
  const service = await db('services').where({ name: f.service }).first('id');
  // lead_time_days 0: this stand-in for the collectors' judge raises the level by load alone.
  const [sketch] = await db('sketches')
    .insert({ name: f.sketch, service_id: service.id, team_id: team.id, error_budget: f.errorBudget, confidence: f.confidence, lead_time_days: 0 })
    .returning('id');
  const [target] = await db('targets').insert({ sketch_id: sketch.id, instance: 'i-1', url: 'http://127.0.0.1:9601/metrics' }).returning('id');
  return { sketchId: Number(sketch.id), targetId: Number(target.id), teamId: Number(team.id), width: f.width, depth: f.depth, errorBudget: f.errorBudget, confidence: f.confidence };
}

/**
 * What a collector round does for this sketch, in one transaction: store the
 * reading and the target's status with a judgement from the maths module
 * (assess, and the brim forecast over the stored readings), then call the
 * alert hook. The real collector does the same through collectors/judge.ts.
 */
export async function observe(db: Db, s: GrowingSketch, at: Date, streamTotal: number, clock: Clock, settings: AlertSettings): Promise<HealthLevel> {
  return db.transaction(async (trx) => {
    const base = { target_id: s.targetId, sketch_id: s.sketchId, taken_at: at };
    const figures = { stream_total: streamTotal, width: s.width, depth: s.depth, counter_bytes: 4, window_seconds: 0, conservative: false };
    await trx('readings').insert({ ...base, ok: true, ...figures });
    const a = assess({ width: s.width, depth: s.depth, errorBudget: s.errorBudget, confidence: s.confidence, streamTotal });
    const points = (await trx('readings').where({ target_id: s.targetId, ok: true }).orderBy('taken_at').select('taken_at', 'stream_total')).map(
      (r: { taken_at: Date; stream_total: number }) => ({ t: new Date(r.taken_at).getTime(), total: r.stream_total }),
    );
    const forecast = forecastBrim({ points, capacity: a.capacity, now: at.getTime() });
    const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());
    const judgement = {
      ...a,
      errorBudget: s.errorBudget,
      confidence: s.confidence,
      watchLine: 0.8,
      distinctEstimate: null,
      saturatedRows: 0,
      ...(forecast.trend === 'rising'
        ? { trend: 'rising', brimAt: iso(forecast.brimAt), brimEarliest: iso(forecast.brimEarliest), brimLatest: iso(forecast.brimLatest) }
        : { trend: 'none', trendReason: forecast.reason, brimAt: null, brimEarliest: null, brimLatest: null }),
    };
    await trx('target_status')
      .insert({ ...base, level: a.level, last_ok_at: at, last_error: null, failures_in_row: 0, ...figures, judgement: JSON.stringify(judgement), level_since: at })
      .onConflict('target_id')
      .merge();
    await evaluateSketchAlerts(trx, [{ sketchId: s.sketchId, level: a.level, judgement, at }], clock, settings);
    return a.level;
  });
}
