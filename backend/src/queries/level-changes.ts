import type { Knex } from 'knex';

type Q = Knex | Knex.Transaction;

/** One point where a target's level may change, as the database finds it. */
export interface LevelChangeRow {
  target_id: number;
  sketch_id: number;
  at: Date;
  level: string;
  /** Until when this point vouches for the target: the reading itself, or the end of a rolled-up hour. */
  seen_until: Date;
  /** Set when nothing was read for longer than the stale limit before this point: when the last sighting ended. */
  gap_from: Date | null;
  /** Seconds without a reading after which the target counts as stale. */
  stale_after: number;
  /** The target's last point in the period (for a trailing stale span). */
  is_last: boolean;
}

export interface LevelChangeQuery {
  sketchIds: number[];
  from: Date;
  to: Date;
  /** Hourly rollups where they exist (long periods), or raw readings where they exist (short ones). */
  hourly: boolean;
  failuresForUnreachable: number;
  staleAfterIntervals: number;
}

/**
 * The level of every target over a period, reduced in the database to the few
 * rows where it changes. A reading's level is its judgement's; a failed
 * reading makes the target unreachable from the Nth failure in a row (the
 * collector's rule: runs of failures are numbered by counting good readings
 * before them), and leaves the level as it was before that. Hours whose raw
 * readings are gone, or that a long period reads hourly, come from the hourly
 * rollups, each vouching for its whole hour. `lag` keeps only the points
 * whose level differs from the one before, plus gaps (stale) and each
 * target's last point.
 */
/** Read hour by hour, a gap shorter than an hour is below what the timeline resolves, so only longer ones count as stale. */
const HOUR_SECONDS = 3600;

export async function levelChanges(db: Q, q: LevelChangeQuery): Promise<LevelChangeRow[]> {
  const cut = q.hourly
    ? `coalesce((select max(h.hour) from reading_rollups_hourly h where h.target_id = t.id), '-infinity'::timestamptz)`
    : `coalesce((select date_trunc('hour', min(r.taken_at)) from readings r where r.target_id = t.id), 'infinity'::timestamptz)`;
  const sql = `
    with tg as (
      select t.id as target_id, t.sketch_id, greatest(s.scrape_interval_seconds * ?::float8, ?::float8) as stale_after, ${cut} as cut
      from targets t join sketches s on s.id = t.sketch_id
      where t.sketch_id = any(?::bigint[])
    ),
    raw as (
      select r.target_id, r.taken_at as at, r.ok, r.judgement->>'level' as jlevel,
             sum(case when r.ok then 1 else 0 end) over (partition by r.target_id order by r.taken_at, r.id) as run
      from readings r join tg on tg.target_id = r.target_id
      where r.sketch_id = any(?::bigint[]) and r.taken_at >= ? and r.taken_at <= ? and r.taken_at >= tg.cut
    ),
    raw_levels as (
      select target_id, at, true as is_raw,
        case when ok then jlevel
             when row_number() over (partition by target_id, run order by at) - (case when run > 0 then 1 else 0 end) >= ? then 'unreachable'
        end as level
      from raw
    ),
    rolled as (
      select h.target_id, h.hour as at, false as is_raw,
        case when h.readings >= ? and h.failures = h.readings then 'unreachable' else h.last_level end as level
      from reading_rollups_hourly h join tg on tg.target_id = h.target_id
      where h.sketch_id = any(?::bigint[]) and h.hour >= date_trunc('hour', ?::timestamptz) and h.hour <= ?
        and (h.hour < tg.cut or (h.hour = tg.cut and not exists (select 1 from readings r where r.target_id = h.target_id and r.taken_at >= h.hour)))
    ),
    before as (
      select tg.target_id, b.at, b.is_raw, b.level from tg
      cross join lateral (
        select * from (
          (select r.taken_at as at, true as is_raw, r.judgement->>'level' as level from readings r
            where r.target_id = tg.target_id and r.ok and r.taken_at < ? order by r.taken_at desc limit 1)
          union all
          (select h.hour as at, false as is_raw, h.last_level as level from reading_rollups_hourly h
            where h.target_id = tg.target_id and h.hour < date_trunc('hour', ?::timestamptz) and h.last_level is not null order by h.hour desc limit 1)
        ) latest order by at desc limit 1
      ) b
    ),
    pts as (
      select target_id, at, is_raw, level from raw_levels where level is not null
      union all select target_id, at, is_raw, level from rolled where level is not null
      union all select target_id, at, is_raw, level from before where level is not null
    ),
    seen as (
      select p.*, p.at + (case when p.is_raw then interval '0' else interval '1 hour' end) as seen_until from pts p
    ),
    marked as (
      select p.target_id, tg.sketch_id, p.at, p.level, p.seen_until, tg.stale_after,
        lag(p.level) over w as prev_level, lag(p.seen_until) over w as prev_seen,
        lead(p.at) over w is null as is_last
      from seen p join tg on tg.target_id = p.target_id
      window w as (partition by p.target_id order by p.at)
    ),
    gaps as (
      select m.*, case when extract(epoch from m.at - m.prev_seen) > m.stale_after then m.prev_seen end as gap_from from marked m
    )
    select target_id, sketch_id, at, level, seen_until, gap_from, stale_after, is_last
    from gaps
    where prev_level is distinct from level or is_last or gap_from is not null
    order by target_id, at`;
  // A PostgreSQL array literal: Knex would spread a JS array into separate parameters.
  const ids = `{${q.sketchIds.map(Number).join(',')}}`;
  const bindings = [q.staleAfterIntervals, q.hourly ? HOUR_SECONDS : 0, ids, ids, q.from, q.to, q.failuresForUnreachable, q.failuresForUnreachable, ids, q.from, q.to, q.from, q.from];
  const result = await db.raw(sql, bindings);
  return result.rows;
}
