import type { Figures, ResizeAdvice } from '../../api-types';
import type { Db } from '../../db';
import { forecastBrim } from '../../maths/forecast';
import { DEFAULT_HEADROOM, DEFAULT_HORIZON_DAYS, forecastTotalAt, resizePlan } from '../../maths/resize';
import { recentTotals } from '../../queries/readings';

const DAY_MS = 86_400_000;
/** The forecast behind a plan looks back over a week, thinned to this many points (Theil–Sen is quadratic). */
const LOOKBACK_DAYS = 7;
const FIT_POINTS = 400;
const MIN_RESTARTS_AS_RUNS = 2;

/**
 * The resize plan of the sketch page: the stream total its trend reaches in 90
 * days, plus 25 % headroom, sized with the same budget and confidence. Null
 * until the sketch has a good reading (its width and depth come from the service).
 */
export async function resizeAdvice(
  db: Db,
  sketch: { id: number; errorBudget: number; confidence: number },
  worst: { targetId: number; figures: Figures } | undefined,
  now: Date,
): Promise<ResizeAdvice | null> {
  const f = worst?.figures;
  if (!worst || !f || !f.width || !f.depth || !f.counterBytes || !f.capacity || f.streamTotal === null) return null;
  const points = await recentTotals(db, worst.targetId, sketch.id, new Date(now.getTime() - LOOKBACK_DAYS * DAY_MS), now, FIT_POINTS);
  // A cumulative sketch that restarts often (say at every deploy) never holds more than one run's
  // total: its runs are judged like windows, on their peaks, or one run's slope would be projected
  // over the whole horizon as if the service never restarted again.
  const restarts = points.filter((p, i) => i > 0 && p.total < points[i - 1].total).length;
  const windowSeconds = (f.windowSeconds ?? 0) > 0 ? (f.windowSeconds as number) : restarts >= MIN_RESTARTS_AS_RUNS ? (LOOKBACK_DAYS * DAY_MS) / 1000 : 0;
  const forecast = forecastBrim({ points, capacity: f.capacity, windowSeconds, now: now.getTime() });
  const peak = points.reduce((best, p) => Math.max(best, p.total), f.streamTotal);
  const currentTotal = windowSeconds > 0 ? peak : f.streamTotal;
  const forecastTotal = forecastTotalAt({ forecast, currentTotal, now: now.getTime(), horizonDays: DEFAULT_HORIZON_DAYS });
  if (!(forecastTotal > 0)) return null;
  const plan = resizePlan({
    width: f.width,
    depth: f.depth,
    counterBytes: f.counterBytes,
    errorBudget: sketch.errorBudget,
    confidence: sketch.confidence,
    forecastTotal,
    headroom: DEFAULT_HEADROOM,
    horizonDays: DEFAULT_HORIZON_DAYS,
  });
  return { ...plan, horizonDays: DEFAULT_HORIZON_DAYS, headroom: DEFAULT_HEADROOM, forecastTotal, forecastTrend: forecast.trend };
}
