import type { Db } from '../db';

export interface BucketRow {
  bucket: number;
  total_min: number | null;
  total_max: number | null;
  total_last: number | null;
  load_max: number | null;
  level_last: string | null;
  readings: number;
  failures: number;
  last_at: Date;
}

export interface MarkerRow {
  taken_at: Date;
  instance: string;
  is_reset: boolean;
  is_resize: boolean;
  width: number | null;
  depth: number | null;
}

export interface RangeQuery {
  sketchId: number;
  targetId?: number;
  from: Date;
  to: Date;
  points: number;
}

/**
 * Buckets a sketch's readings by time in the database, so a chart over 90 days
 * of 30-second readings moves `points` rows, not hundreds of thousands. Each
 * bucket keeps the extremes (min/max stream total, max load: the peaks a chart
 * must not lose) and the last word (last good total, last level), which two
 * index lookups per bucket fetch after the grouping.
 */
export async function bucketedReadings(db: Db, q: RangeQuery): Promise<BucketRow[]> {
  const fromSeconds = q.from.getTime() / 1000;
  const bucketSeconds = (q.to.getTime() - q.from.getTime()) / 1000 / q.points;
  const target = q.targetId === undefined ? '' : 'and target_id = ?';
  const targetBinding = q.targetId === undefined ? [] : [q.targetId];
  const sql = `
    with span as (
      select least(floor((extract(epoch from taken_at) - ?) / ?), ?)::int as bucket,
             min(stream_total) as total_min, max(stream_total) as total_max,
             max((judgement->>'load')::float8) as load_max,
             count(*)::int as readings, (count(*) filter (where not ok))::int as failures,
             max(taken_at) as last_at, max(taken_at) filter (where ok) as last_ok_at
      from readings
      where sketch_id = ? and taken_at >= ? and taken_at <= ? ${target}
      group by 1
    )
    select span.bucket, span.total_min, span.total_max, span.load_max, span.readings, span.failures, span.last_at,
           good.stream_total as total_last, latest.level as level_last
    from span
    left join lateral (
      select r.stream_total from readings r
      where r.sketch_id = ? and r.taken_at = span.last_ok_at and r.ok ${target.replace('target_id', 'r.target_id')}
      order by r.id desc limit 1
    ) good on true
    left join lateral (
      select coalesce(r.judgement->>'level', case when r.ok then null else 'unreachable' end) as level from readings r
      where r.sketch_id = ? and r.taken_at = span.last_at ${target.replace('target_id', 'r.target_id')}
      order by r.ok, r.id desc limit 1
    ) latest on true
    order by span.bucket`;
  const bindings = [fromSeconds, bucketSeconds, q.points - 1, q.sketchId, q.from, q.to, ...targetBinding, q.sketchId, ...targetBinding, q.sketchId, ...targetBinding];
  const result = await db.raw(sql, bindings);
  return result.rows;
}

/** Resets and resizes in the range: the few readings the collector marked, found through a partial index. */
export function markersInRange(db: Db, q: RangeQuery): Promise<MarkerRow[]> {
  const query = db('readings as r')
    .join('targets as tg', 'tg.id', 'r.target_id')
    .where('r.sketch_id', q.sketchId)
    .whereBetween('r.taken_at', [q.from, q.to])
    .where((w) => w.where('r.is_reset', true).orWhere('r.is_resize', true))
    .orderBy('r.taken_at')
    .limit(1000)
    .select('r.taken_at', 'tg.instance', 'r.is_reset', 'r.is_resize', 'r.width', 'r.depth');
  if (q.targetId !== undefined) query.where('r.target_id', q.targetId);
  return query;
}

/**
 * A target's good stream totals over a span, thinned in SQL to at most `points`
 * (the highest total per slice, so window peaks survive), for the forecast
 * behind a resize plan.
 */
export async function recentTotals(db: Db, targetId: number, sketchId: number, from: Date, to: Date, points: number): Promise<{ t: number; total: number }[]> {
  const sliceSeconds = Math.max(1, (to.getTime() - from.getTime()) / 1000 / points);
  const result = await db.raw(
    `select (array_agg(extract(epoch from taken_at) * 1000 order by stream_total desc, taken_at))[1]::float8 as t, max(stream_total) as total
     from readings
     where sketch_id = ? and target_id = ? and ok and taken_at >= ? and taken_at <= ?
     group by floor(extract(epoch from taken_at) / ?)
     order by 1`,
    [sketchId, targetId, from, to, sliceSeconds],
  );
  return result.rows.map((r: { t: number; total: number }) => ({ t: Number(r.t), total: Number(r.total) }));
}
