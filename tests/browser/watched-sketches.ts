import type { Knex } from 'knex';
import type { ClaimedTarget } from '../../collectors/claim';
import { readingRows, type PreviousStatus } from '../../collectors/reading-rows';
import type { TotalReading } from '../../backend/src/maths';

/**
 * Sketches with a back-filled history for the browser tests, written the way
 * the collector writes them: every reading goes through the collector's own
 * readingRows (judgement, reset and resize marks, target_status), so the pages
 * show real judgements over invented traffic.
 */
export interface WatchedSketch {
  team: string;
  service: string;
  sketch: string;
  width: number;
  depth: number;
  errorBudget: number;
  confidence?: number;
  /** Stream total at a time, ms since 1970; return null for a failed scrape. */
  totalAt: (t: number) => number | null;
  /** From this time on the service reports this width and depth (a resize). */
  resize?: { at: number; width: number; depth: number };
  days?: number;
  stepMinutes?: number;
  instances?: string[];
}

const MINUTE = 60_000;
const HISTORY_READINGS = 400;

/** Non-zero cells a row of width m shows after D distinct keys: m·(1 − e^(−D/m)); keys taken as a share of the total. */
function nonzeroCells(total: number, width: number, depth: number): number[] {
  const distinct = total / 40;
  const filled = Math.min(width, Math.round(width * (1 - Math.exp(-distinct / width))));
  return Array.from({ length: depth }, (_, row) => Math.max(0, Math.min(width, filled - row)));
}

async function backfill(db: Knex, target: ClaimedTarget, spec: WatchedSketch, now: number): Promise<void> {
  const step = (spec.stepMinutes ?? 20) * MINUTE;
  const start = now - (spec.days ?? 7) * 1440 * MINUTE;
  let previous: PreviousStatus | undefined;
  let history: TotalReading[] = [];
  let status: Record<string, unknown> = {};
  const readings: Record<string, unknown>[] = [];
  for (let t = start; t <= now; t += step) {
    const resized = spec.resize && t >= spec.resize.at;
    const width = resized ? spec.resize!.width : spec.width;
    const depth = resized ? spec.resize!.depth : spec.depth;
    const total = spec.totalAt(t);
    const outcome =
      total === null
        ? { ok: false as const, kind: 'refused' as const, reason: 'connection refused by 127.0.0.1:9', scrapeMs: 2 }
        : {
            ok: true as const,
            scrapeMs: 3,
            sample: { width, depth, streamTotal: total, nonzeroCells: nonzeroCells(total, width, depth), counterBytes: 4, windowSeconds: 0, conservative: false },
          };
    const rows = readingRows({ target, outcome, takenAt: new Date(t) }, previous, history);
    readings.push(rows.reading);
    status = rows.status;
    previous = { ...(previous ?? { streamTotal: null, width: null, depth: null }), level: rows.level, levelSince: rows.status.level_since as Date, failuresInRow: Number(rows.status.failures_in_row) };
    if (rows.good && total !== null) {
      previous = { ...previous, streamTotal: total, width, depth };
      history = (rows.reading.is_resize ? [] : history).concat({ t, total }).slice(-HISTORY_READINGS);
    }
  }
  for (let i = 0; i < readings.length; i += 500) await db('readings').insert(readings.slice(i, i + 500));
  await db('target_status').insert(status);
}

export async function addWatchedSketch(db: Knex, spec: WatchedSketch, now = Date.now()): Promise<number> {
  const team = await db('teams').where({ slug: spec.team }).first('id');
  let service = await db('services').where({ name: spec.service }).first('id');
  if (!service) [service] = await db('services').insert({ name: spec.service, team_id: team.id }).returning('id');
  const terms = { error_budget: spec.errorBudget, confidence: spec.confidence ?? 0.99, watch_line: 0.8, lead_time_days: 7, scrape_interval_seconds: 1200 };
  const [sketch] = await db('sketches').insert({ name: spec.sketch, service_id: service.id, team_id: team.id, ...terms }).returning('id');
  const instances = spec.instances ?? ['127.0.0.1:9'];
  for (const [n, instance] of instances.entries()) {
    const url = `http://127.0.0.1:${9 + n}/metrics`;
    const [target] = await db('targets').insert({ sketch_id: sketch.id, instance, url, next_scrape_at: new Date(now + 86_400_000) }).returning('id');
    const claimed: ClaimedTarget = {
      targetId: Number(target.id),
      sketchId: Number(sketch.id),
      url,
      instance,
      sketchLabel: spec.sketch,
      intervalSeconds: terms.scrape_interval_seconds,
      dueAt: new Date(now),
      errorBudget: terms.error_budget,
      confidence: terms.confidence,
      watchLine: terms.watch_line,
      leadTimeDays: terms.lead_time_days,
    };
    // Replicas carry slightly different traffic, so their figures differ.
    await backfill(db, claimed, { ...spec, totalAt: (t) => scaled(spec.totalAt(t), 1 - n * 0.07) }, now);
  }
  return Number(sketch.id);
}

const scaled = (total: number | null, by: number) => (total === null ? null : Math.round(total * by));
