import type { SketchHistory } from '../../api-types';
import type { Db } from '../../db';
import { AppError } from '../../http/errors';
import { bucketEdges, bucketedReadings, markersInRange, type BucketRow, type BudgetOfSketch, type MarkerRow, type RangeQuery } from '../../queries/readings';
import { bucketedRollups, latestRolledHour, oldestRawReading, rollupMarkers } from '../../queries/rollups';
import { requireSketch } from './detail';

export interface HistoryQuery {
  from: Date;
  to: Date;
  points: number;
  instance?: string;
}

const HOUR_MS = 3_600_000;

interface Bucketed {
  buckets: BucketRow[];
  markers: MarkerRow[];
}

/**
 * A sketch's readings over a range, bucketed by time in the database: at most
 * `points` points however many readings lie in the range. Empty buckets are
 * left out, so gaps in collection show as gaps on the chart. Buckets of an
 * hour or more come from the hourly rollups where they reach; shorter ones
 * from the raw readings, with the rollups filling in where those have aged out.
 */
export async function sketchHistory(db: Db, sketchId: number, q: HistoryQuery): Promise<SketchHistory> {
  const sketch = await requireSketch(db, sketchId);
  let targetId: number | undefined;
  if (q.instance !== undefined) {
    const target = await db('targets').where({ sketch_id: sketchId, instance: q.instance }).first('id');
    if (!target) {
      const known = await db('targets').where({ sketch_id: sketchId }).orderBy('instance').pluck('instance');
      throw new AppError(400, 'invalid', `instance must be one of this sketch's instances (${known.join(', ') || 'none registered'}); got ${q.instance}.`, 'instance');
    }
    targetId = Number(target.id);
  }
  const range = { sketchId, targetId, from: q.from, to: q.to, points: q.points };
  const edges = bucketEdges(range);
  const budget = { errorBudget: sketch.error_budget, confidence: sketch.confidence };
  const bucketMs = (q.to.getTime() - q.from.getTime()) / q.points;
  const { buckets, markers } = bucketMs >= HOUR_MS ? await hoursThenReadings(db, range, budget, edges) : await readingsAfterHours(db, range, budget, edges);
  return {
    sketchId,
    instance: q.instance ?? null,
    from: q.from.toISOString(),
    to: q.to.toISOString(),
    bucketSeconds: bucketMs / 1000,
    points: buckets.map((b) => ({
      t: new Date(q.from.getTime() + b.bucket * bucketMs).toISOString(),
      totalMin: b.total_min,
      totalMax: b.total_max,
      totalLast: b.total_last,
      loadMax: b.load_max,
      level: b.level_last,
      occupancy: b.cells_last && b.width_last ? b.cells_last.map((cells) => cells / b.width_last!) : null,
      readings: b.readings,
      failures: b.failures,
    })),
    markers: markers.flatMap((m) => {
      const base = { t: new Date(m.taken_at).toISOString(), instance: m.instance, width: m.width, depth: m.depth };
      return [...(m.is_reset ? [{ ...base, kind: 'reset' as const }] : []), ...(m.is_resize ? [{ ...base, kind: 'resize' as const }] : [])];
    }),
  };
}

/**
 * Buckets of an hour or more. Every hour before the latest one the rollups hold
 * is rolled up in full, so those hours come from the rollups (about 2,000 rows
 * for 90 days instead of hundreds of thousands of readings) and only the
 * readings from that hour on are bucketed raw. The bucket the hand-over falls
 * in takes from both.
 */
async function hoursThenReadings(db: Db, range: RangeQuery, budget: BudgetOfSketch, edges: string[]): Promise<Bucketed> {
  const latest = await latestRolledHour(db, range.sketchId, range.targetId);
  if (latest === null) return readingsAfterHours(db, range, budget, edges);
  const handOver = new Date(Math.min(Math.max(latest.getTime(), range.from.getTime()), range.to.getTime() + 1));
  const rolledBuckets = edges.slice(0, -1).filter((lo) => new Date(lo) < handOver).length;
  const firstRaw = Math.max(0, rolledBuckets - 1);
  const [rolled, raw, rolledMarkers, rawMarkers] = await Promise.all([
    bucketedRollups(db, range, budget, edges, 0, rolledBuckets - 1, handOver),
    bucketedReadings(db, range, budget, edges, firstRaw, handOver),
    rollupMarkers(db, range, handOver),
    markersInRange(db, { ...range, from: handOver }),
  ]);
  return { buckets: mergeBuckets(rolled, raw), markers: [...rolledMarkers, ...rawMarkers] };
}

/**
 * Buckets shorter than an hour, from the raw readings; raw readings are dropped
 * after RAW_RETENTION_DAYS, so buckets wholly before the oldest one in the range
 * come from the hourly rollups (which have nothing either where collection had
 * not begun or had a gap).
 */
async function readingsAfterHours(db: Db, range: RangeQuery, budget: BudgetOfSketch, edges: string[]): Promise<Bucketed> {
  const oldest = await oldestRawReading(db, range.sketchId, range.from, range.to, range.targetId);
  const endAfterOldest = oldest === null ? -1 : edges.findIndex((edge, i) => i > 0 && new Date(edge) > oldest);
  const firstRaw = endAfterOldest === -1 ? range.points : endAfterOldest - 1;
  const rawFrom = new Date(edges[firstRaw] ?? range.to);
  const [rolled, raw, rolledMarkers, rawMarkers] = await Promise.all([
    bucketedRollups(db, range, budget, edges, 0, firstRaw - 1, rawFrom),
    bucketedReadings(db, range, budget, edges, firstRaw),
    firstRaw > 0 ? rollupMarkers(db, range, rawFrom) : [],
    markersInRange(db, range),
  ]);
  return { buckets: [...rolled, ...raw], markers: [...rolledMarkers, ...rawMarkers] };
}

/** Rollup buckets followed by raw ones; a bucket in both (where the rollups hand over) is the two combined. */
function mergeBuckets(rolled: BucketRow[], raw: BucketRow[]): BucketRow[] {
  const last = rolled.at(-1);
  const first = raw[0];
  if (!last || !first || Number(last.bucket) !== Number(first.bucket)) return [...rolled, ...raw];
  const extreme = (pick: (...v: number[]) => number, a: number | null, b: number | null) => (a === null ? b : b === null ? a : pick(a, b));
  const both: BucketRow = {
    bucket: first.bucket,
    total_min: extreme(Math.min, last.total_min, first.total_min),
    total_max: extreme(Math.max, last.total_max, first.total_max),
    total_last: first.total_last ?? last.total_last,
    width_last: first.total_last === null ? last.width_last : first.width_last,
    cells_last: first.total_last === null ? last.cells_last : first.cells_last,
    load_max: extreme(Math.max, last.load_max, first.load_max),
    level_last: first.level_last,
    readings: last.readings + first.readings,
    failures: last.failures + first.failures,
    last_at: first.last_at,
  };
  return [...rolled.slice(0, -1), both, ...raw.slice(1)];
}
