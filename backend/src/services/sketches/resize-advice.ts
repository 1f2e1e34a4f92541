import type { Db } from '../../db';
import { forecastBrim, type BrimForecast } from '../../maths/forecast';
import { DEFAULT_HEADROOM, DEFAULT_HORIZON_DAYS, forecastTotalAt, resizePlan, type ResizePlan } from '../../maths/resize';
import { recentTotals } from '../../queries/readings';
import type { Figures } from './figures';

const DAY_MS = 86_400_000;
/** The forecast behind a plan looks back over a week, thinned to this many points (Theil–Sen is quadratic). */
const LOOKBACK_DAYS = 7;
const FIT_POINTS = 400;

export interface ResizeAdvice extends ResizePlan {
  horizonDays: number;
  headroom: number;
  forecastTotal: number;
  forecastTrend: BrimForecast['trend'];
}

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
  const forecast = forecastBrim({ points, capacity: f.capacity, windowSeconds: f.windowSeconds ?? 0, now: now.getTime() });
  // A windowed sketch is judged on its peak per window, not on the total of the window still filling.
  const peak = points.reduce((best, p) => Math.max(best, p.total), f.streamTotal);
  const currentTotal = (f.windowSeconds ?? 0) > 0 ? peak : f.streamTotal;
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
