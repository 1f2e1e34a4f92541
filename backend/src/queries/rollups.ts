import type { Db } from '../db';
import type { BucketRow, BudgetOfSketch, MarkerRow, RangeQuery } from './readings';

/**
 * When the oldest raw reading of the sketch (or instance) within the range was
 * taken; hours before it survive only as hourly rollups. Bounded by the range,
 * so PostgreSQL plans only the day partitions the range covers.
 */
export async function oldestRawReading(db: Db, sketchId: number, from: Date, to: Date, targetId?: number): Promise<Date | null> {
  const query = db('readings').where({ sketch_id: sketchId }).whereBetween('taken_at', [from, to]).min({ oldest: 'taken_at' });
  if (targetId !== undefined) query.where({ target_id: targetId });
  const [row] = await query;
  return row?.oldest ? new Date(row.oldest) : null;
}

/** The latest hour the rollups hold for the sketch (or instance); every hour before it is rolled up in full. */
export async function latestRolledHour(db: Db, sketchId: number, targetId?: number): Promise<Date | null> {
  const query = db('reading_rollups_hourly').where({ sketch_id: sketchId }).max({ latest: 'hour' });
  if (targetId !== undefined) query.where({ target_id: targetId });
  const [row] = await query;
  return row?.latest ? new Date(row.latest) : null;
}

/**
 * Buckets from the hourly rollups (reading_rollups_hourly, kept long after the
 * raw readings are dropped), for the buckets `first` … `last` of the range and
 * the hours before `before`. An hour counts in the bucket its start falls in.
 * Its load is worked out against the sketch's current budget from the width
 * and depth of the hour's peak, as raw buckets do; hours rolled up before the
 * rollups kept those fall back to the load judged at the time. The level is
 * the hour's last judged level, or 'unreachable' when every reading failed.
 */
export async function bucketedRollups(db: Db, q: RangeQuery, budget: BudgetOfSketch, edges: string[], first: number, last: number, before: Date): Promise<BucketRow[]> {
  if (last < first) return [];
  const target = q.targetId === undefined ? '' : 'and h.target_id = ?';
  const t = q.targetId === undefined ? [] : [q.targetId];
  const { rows } = await db.raw(
    `select b.n - 1 + ? as bucket, agg.*, latest.last_stream_total as total_last, latest.level as level_last,
            latest.last_width as width_last, latest.last_nonzero_cells as cells_last
     from unnest(?::timestamptz[], ?::timestamptz[]) with ordinality as b(lo, hi, n)
     cross join lateral (
       select min(h.min_stream_total) as total_min, max(h.max_stream_total) as total_max,
              max(coalesce(h.max_stream_total / (h.peak_width * ?::float8 * power(?::float8, 1::float8 / h.peak_depth)), h.max_load)) as load_max,
              sum(h.readings)::int as readings, sum(h.failures)::int as failures, max(h.hour) as last_at
       from reading_rollups_hourly h
       where h.sketch_id = ? and h.hour >= b.lo and h.hour < b.hi and h.hour < ? ${target}
     ) agg
     left join lateral (
       select h.last_stream_total, h.last_width, h.last_nonzero_cells,
              case when h.failures = h.readings then 'unreachable' else h.last_level end as level
       from reading_rollups_hourly h
       where h.sketch_id = ? and h.hour = agg.last_at ${target}
       order by h.last_stream_total desc nulls last limit 1
     ) latest on true
     where agg.readings > 0
     order by b.n`,
    [first, edges.slice(first, last + 1), edges.slice(first + 1, last + 2), budget.errorBudget, 1 - budget.confidence, q.sketchId, before, ...t, q.sketchId, ...t],
  );
  return rows;
}

/** Resets and resizes of the rolled-up hours, marked at the hour with the sizing the hour ended on (the exact reading is not looked up). */
export function rollupMarkers(db: Db, q: RangeQuery, before: Date): Promise<MarkerRow[]> {
  const query = db('reading_rollups_hourly as h')
    .join('targets as tg', 'tg.id', 'h.target_id')
    .where('h.sketch_id', q.sketchId)
    .where('h.hour', '>=', q.from)
    .where('h.hour', '<', before)
    .where((w) => w.where('h.resets', '>', 0).orWhere('h.resizes', '>', 0))
    .orderBy('h.hour')
    .limit(1000)
    .select('h.hour as taken_at', 'tg.instance', db.raw('h.resets > 0 as is_reset'), db.raw('h.resizes > 0 as is_resize'), 'h.last_width as width', 'h.last_depth as depth');
  if (q.targetId !== undefined) query.where('h.target_id', q.targetId);
  return query;
}
