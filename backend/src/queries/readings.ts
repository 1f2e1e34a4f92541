import type { Db } from '../db';

export interface BucketRow {
  bucket: number;
  total_min: number | null;
  total_max: number | null;
  total_last: number | null;
  load_max: number | null;
  level_last: string | null;
  /** Width and non-zero cells per row of the bucket's last good reading, for the occupancy chart. */
  width_last: number | null;
  cells_last: number[] | null;
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

/** The `points + 1` edges of the range's buckets; the range includes `to`, so the last bucket ends just after it. */
export function bucketEdges(q: RangeQuery): string[] {
  const span = q.to.getTime() - q.from.getTime();
  const edges = Array.from({ length: q.points + 1 }, (_, i) => new Date(q.from.getTime() + (span * i) / q.points).toISOString());
  edges[q.points] = new Date(q.to.getTime() + 1).toISOString();
  return edges;
}

export interface BudgetOfSketch {
  errorBudget: number;
  confidence: number;
}

/**
 * Buckets a sketch's readings by time in the database, so a chart over 90 days
 * of 30-second readings moves `points` rows, not hundreds of thousands. Each
 * bucket is one range scan of a covering index (no table rows, no sort): the
 * extremes (min/max stream total, max load — the peaks a chart must not lose)
 * come from it, then the last good reading (total, width, non-zero cells) and
 * the last level from one lookup each. Load is n / (m·E·δ^(1/k)) (DESIGN.md) against the sketch's current
 * budget, worked out from the indexed columns rather than each stored judgement.
 * Only readings taken from `since` on count (where the hourly rollups hand
 * over); the bounds are repeated as plain conditions so PostgreSQL leaves the
 * day partitions outside them out of the plan.
 */
export async function bucketedReadings(db: Db, q: RangeQuery, budget: BudgetOfSketch, edges: string[], first: number, since: Date = q.from): Promise<BucketRow[]> {
  if (first >= q.points) return [];
  const bounds = 'and r.taken_at >= ?::timestamptz and r.taken_at < ?::timestamptz';
  const target = `${bounds} ${q.targetId === undefined ? '' : 'and r.target_id = ?'}`;
  const t = [since, edges[q.points], ...(q.targetId === undefined ? [] : [q.targetId])];
  const sql = `
    select b.n - 1 + ? as bucket, agg.*, good.stream_total as total_last, good.width as width_last, good.nonzero_cells as cells_last, latest.level as level_last
    from unnest(?::timestamptz[], ?::timestamptz[]) with ordinality as b(lo, hi, n)
    cross join lateral (
      select min(stream_total) as total_min, max(stream_total) as total_max,
             max(stream_total / (width * ?::float8 * power(?::float8, 1::float8 / depth))) as load_max,
             count(*)::int as readings, (count(*) filter (where not ok))::int as failures,
             max(taken_at) as last_at, max(taken_at) filter (where ok) as last_ok_at
      from readings r
      where r.sketch_id = ? and r.taken_at >= b.lo and r.taken_at < b.hi ${target}
    ) agg
    left join lateral (
      select r.stream_total, r.width, r.nonzero_cells from readings r
      where r.sketch_id = ? and r.taken_at = agg.last_ok_at and r.ok ${target}
      limit 1
    ) good on true
    left join lateral (
      select coalesce(r.judgement->>'level', case when r.ok then null else 'unreachable' end) as level from readings r
      where r.sketch_id = ? and r.taken_at = agg.last_at ${target}
      order by r.ok, r.id desc limit 1
    ) latest on true
    where agg.readings > 0
    order by b.n`;
  const bindings = [first, edges.slice(first, -1), edges.slice(first + 1), budget.errorBudget, 1 - budget.confidence, q.sketchId, ...t, q.sketchId, ...t, q.sketchId, ...t];
  return db.transaction(async (trx) => {
    // A thousand small index scans look costly to the planner, and compiling them (JIT) would take longer than running them.
    await trx.raw('set local jit = off');
    return (await trx.raw(sql, bindings)).rows;
  });
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
