import type { Knex } from 'knex';

/**
 * Folds raw readings into reading_rollups_hourly, from the hour before the
 * latest rolled-up hour onwards (that hour may have been rolled up before it
 * ended), or from the very first reading on a fresh database. Re-running is
 * harmless: each hour's row is recomputed from its readings.
 */
export async function rollUpHours(db: Knex): Promise<number> {
  const { rows } = await db.raw(
    `with since as (
       select coalesce((select max(hour) - interval '1 hour' from reading_rollups_hourly), '-infinity'::timestamptz) as at
     )
     insert into reading_rollups_hourly as h
       (target_id, sketch_id, hour, readings, failures, min_stream_total, max_stream_total, max_at,
        last_stream_total, last_level, max_load, resets, resizes, peak_width, peak_depth, last_width, last_depth, last_nonzero_cells)
     select r.target_id, min(r.sketch_id), date_trunc('hour', r.taken_at), count(*), count(*) filter (where not r.ok),
       min(r.stream_total) filter (where r.ok), max(r.stream_total) filter (where r.ok),
       (array_agg(r.taken_at order by r.stream_total desc, r.taken_at) filter (where r.ok))[1],
       (array_agg(r.stream_total order by r.taken_at desc) filter (where r.ok))[1],
       (array_agg(r.judgement->>'level' order by r.taken_at desc) filter (where r.ok and r.judgement is not null))[1],
       max((r.judgement->>'load')::double precision) filter (where r.ok),
       count(*) filter (where r.is_reset), count(*) filter (where r.is_resize),
       (array_agg(r.width order by r.stream_total desc, r.taken_at) filter (where r.ok))[1],
       (array_agg(r.depth order by r.stream_total desc, r.taken_at) filter (where r.ok))[1],
       (array_agg(r.width order by r.taken_at desc) filter (where r.ok))[1],
       (array_agg(r.depth order by r.taken_at desc) filter (where r.ok))[1],
       -- As text: array_agg of arrays needs them all one length, and a resize can change the depth within the hour.
       ((array_agg(r.nonzero_cells::text order by r.taken_at desc) filter (where r.ok))[1])::integer[]
     from readings r, since
     where r.taken_at >= since.at
     group by r.target_id, date_trunc('hour', r.taken_at)
     on conflict (target_id, hour) do update set
       readings = excluded.readings, failures = excluded.failures, min_stream_total = excluded.min_stream_total,
       max_stream_total = excluded.max_stream_total, max_at = excluded.max_at, last_stream_total = excluded.last_stream_total,
       last_level = excluded.last_level, max_load = excluded.max_load, resets = excluded.resets, resizes = excluded.resizes,
       peak_width = excluded.peak_width, peak_depth = excluded.peak_depth, last_width = excluded.last_width, last_depth = excluded.last_depth,
       last_nonzero_cells = excluded.last_nonzero_cells
     returning 1`,
  );
  return rows.length;
}
