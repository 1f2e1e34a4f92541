import type { Db } from '../../db';
import { AppError } from '../../http/errors';
import { bucketEdges, bucketedReadings, markersInRange } from '../../queries/readings';
import { bucketedRollups, oldestRawReading, rollupMarkers } from '../../queries/rollups';
import { requireSketch } from './detail';

export interface HistoryQuery {
  from: Date;
  to: Date;
  points: number;
  instance?: string;
}

export interface HistoryPoint {
  /** Start of the bucket. */
  t: string;
  totalMin: number | null;
  totalMax: number | null;
  totalLast: number | null;
  /** Highest load in the bucket, against the sketch's current error budget and confidence. */
  loadMax: number | null;
  /** Level of the bucket's last reading ('unreachable' for a failed one). */
  level: string | null;
  readings: number;
  failures: number;
}

export interface HistoryMarker {
  t: string;
  kind: 'reset' | 'resize';
  instance: string;
  width: number | null;
  depth: number | null;
}

export interface SketchHistory {
  sketchId: number;
  instance: string | null;
  from: string;
  to: string;
  bucketSeconds: number;
  points: HistoryPoint[];
  markers: HistoryMarker[];
}

/**
 * A sketch's readings over a range, bucketed by time in the database: at most
 * `points` points however many readings lie in the range. Empty buckets are
 * left out, so gaps in collection show as gaps on the chart. Where the raw
 * readings have aged out, the hourly rollups fill in.
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
  // Raw readings are dropped after RAW_RETENTION_DAYS; buckets wholly before the oldest one come from the hourly rollups.
  const oldest = await oldestRawReading(db, sketchId, targetId);
  const endAfterOldest = oldest === null ? -1 : edges.findIndex((edge, i) => i > 0 && new Date(edge) > oldest);
  const firstRaw = endAfterOldest === -1 ? q.points : endAfterOldest - 1;
  const budget = { errorBudget: sketch.error_budget, confidence: sketch.confidence };
  const [rolled, raw, rolledMarkers, rawMarkers] = await Promise.all([
    bucketedRollups(db, range, edges, 0, firstRaw - 1),
    bucketedReadings(db, range, budget, edges, firstRaw),
    firstRaw > 0 ? rollupMarkers(db, range, new Date(edges[firstRaw])) : [],
    markersInRange(db, range),
  ]);
  const buckets = [...rolled, ...raw];
  const markers = [...rolledMarkers, ...rawMarkers];
  const bucketMs = (q.to.getTime() - q.from.getTime()) / q.points;
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
      readings: b.readings,
      failures: b.failures,
    })),
    markers: markers.flatMap((m) => {
      const base = { t: new Date(m.taken_at).toISOString(), instance: m.instance, width: m.width, depth: m.depth };
      return [...(m.is_reset ? [{ ...base, kind: 'reset' as const }] : []), ...(m.is_resize ? [{ ...base, kind: 'resize' as const }] : [])];
    }),
  };
}
