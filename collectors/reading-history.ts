import type { Knex } from 'knex';
import type { TotalReading } from '../backend/src/maths';

export interface HistoryRequest {
  targetId: number;
  windowed: boolean;
}

/** How far back a windowed sketch's hourly peaks are read: a week of windows shows the weekly growth. */
const WINDOWED_SPAN_HOURS = 7 * 24;

/**
 * The good readings of each target's current sizing epoch that its forecast
 * is fitted to: the latest `rawLimit` readings (one indexed probe per target),
 * and for a windowed sketch also the hourly peaks of the rollups before them,
 * since its trend is in the peaks of many windows rather than within one.
 */
export async function loadHistory(db: Knex, requests: HistoryRequest[], rawLimit: number): Promise<Map<number, TotalReading[]>> {
  const history = new Map<number, TotalReading[]>(requests.map((r) => [r.targetId, []]));
  if (requests.length === 0) return history;
  const ids = requests.map((r) => r.targetId);
  const { rows } = await db.raw(
    // Times as epoch milliseconds: thousands of rows per batch, and a number costs far less to read than a date.
    `select t.id as target_id, h.t, h.stream_total, h.is_resize
     from unnest(?::bigint[]) as t(id)
     cross join lateral (
       select (extract(epoch from r.taken_at) * 1000)::float8 as t, r.taken_at, r.stream_total, r.is_resize from readings r
       where r.target_id = t.id and r.ok
       order by r.taken_at desc limit ?
     ) h`,
    [ids, rawLimit],
  );
  const raw = new Map<number, { t: number; total: number; isResize: boolean }[]>();
  for (const row of rows) {
    const list = raw.get(Number(row.target_id)) ?? [];
    list.push({ t: row.t, total: row.stream_total, isResize: row.is_resize });
    raw.set(Number(row.target_id), list);
  }
  for (const [targetId, newestFirst] of raw) {
    // A resize starts a new epoch: the readings before it describe another sketch.
    const resizeAt = newestFirst.findIndex((r) => r.isResize);
    const epoch = resizeAt >= 0 ? newestFirst.slice(0, resizeAt + 1) : newestFirst;
    history.set(targetId, epoch.reverse().map(({ t, total }) => ({ t, total })));
  }

  const windowed = requests.filter((r) => r.windowed).map((r) => r.targetId);
  if (windowed.length > 0) await addHourlyPeaks(db, windowed, history);
  return history;
}

/** Hourly peaks from the rollups, from the epoch's start (the latest resize) up to the oldest raw reading. */
async function addHourlyPeaks(db: Knex, targetIds: number[], history: Map<number, TotalReading[]>): Promise<void> {
  const { rows } = await db.raw(
    `select u.id as target_id, p.max_at, p.max_stream_total
     from unnest(?::bigint[]) as u(id)
     cross join lateral (
       select coalesce(max(r.taken_at), '-infinity') as since from readings r where r.target_id = u.id and r.is_resize
     ) epoch
     cross join lateral (
       select h.max_at, h.max_stream_total from reading_rollups_hourly h
       where h.target_id = u.id and h.max_at is not null and h.hour >= now() - make_interval(hours => ?)
         and h.max_at >= epoch.since
       order by h.hour
     ) p`,
    [targetIds, WINDOWED_SPAN_HOURS],
  );
  const peaks = new Map<number, TotalReading[]>();
  for (const row of rows) {
    const list = peaks.get(Number(row.target_id)) ?? [];
    list.push({ t: new Date(row.max_at).getTime(), total: Number(row.max_stream_total) });
    peaks.set(Number(row.target_id), list);
  }
  for (const [targetId, hourly] of peaks) {
    const recent = history.get(targetId) ?? [];
    const oldestRaw = recent.length > 0 ? recent[0].t : Infinity;
    history.set(targetId, [...hourly.filter((p) => p.t < oldestRaw), ...recent]);
  }
}
