import {
  assess,
  combinedOccupancy,
  forecastBrim,
  severity,
  windowPeaks,
  sortedReadings,
  type HealthLevel,
  type TotalReading,
} from '../backend/src/maths';
import type { SketchSample } from './exposition/read-sketch';

/** What the sketch's owner set; the figures it is judged against. */
export interface SketchTerms {
  errorBudget: number;
  confidence: number;
  watchLine: number;
  leadTimeDays: number;
}

/** The latest word on a target (target_status.judgement); every good reading keeps its ReadingJudgement. */
export interface Judgement {
  level: HealthLevel;
  load: number;
  capacity: number;
  boundNow: number;
  missRisk: number | null;
  missRiskNote?: string;
  relativeError: number;
  brimAt: string | null;
  brimEarliest: string | null;
  brimLatest: string | null;
  trend: 'rising' | 'none';
  trendReason?: string;
  distinctEstimate: number | null;
  saturatedRows: number;
  errorBudget: number;
  confidence: number;
  watchLine: number;
  /** The total the load is worked out from: n itself, or for a windowed sketch the higher of n and the last finished window's peak. */
  judgedTotal: number;
}

/** What a stored reading keeps of its judgement (readings.judgement): what level timelines, charts and hourly rollups read. */
export type ReadingJudgement = Pick<Judgement, 'level' | 'load'>;

const DAY_MS = 86_400_000;
const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());

/**
 * A windowed sketch restarts from zero each window, so judging only the
 * current total would call it clear at every window's start. The peak of the
 * last finished window is what the sketch had to hold, until the running
 * window beats it.
 */
function judgedTotalOf(sample: SketchSample, points: TotalReading[], now: number): number {
  if (sample.windowSeconds === 0) return sample.streamTotal;
  const { peaks } = windowPeaks(sortedReadings(points), sample.windowSeconds, now);
  return Math.max(sample.streamTotal, peaks.length > 0 ? peaks[peaks.length - 1].total : 0);
}

/**
 * Judges one good reading with the maths module: the load and its level, the
 * occupancy of the rows, and the brim date from `history` (good readings of
 * the current sizing epoch, oldest or newest first, without this one). A brim
 * date within the lead time makes the level at least `watch`.
 */
export function judgeReading(sample: SketchSample, history: readonly TotalReading[], terms: SketchTerms, now: number): Judgement {
  const points = [...history, { t: now, total: sample.streamTotal }];
  const judgedTotal = judgedTotalOf(sample, points, now);
  const a = assess({
    width: sample.width,
    depth: sample.depth,
    errorBudget: terms.errorBudget,
    confidence: terms.confidence,
    streamTotal: judgedTotal,
    watchLine: terms.watchLine,
  });
  const forecast = forecastBrim({ points, capacity: a.capacity, windowSeconds: sample.windowSeconds, now });
  const occupancy = combinedOccupancy(sample.nonzeroCells, sample.width);

  let level: HealthLevel = a.level;
  if (forecast.trend === 'rising' && forecast.brimAt - now <= terms.leadTimeDays * DAY_MS && severity(level) < severity('watch')) level = 'watch';

  const judgement: Judgement = {
    level,
    load: a.load,
    capacity: a.capacity,
    boundNow: a.boundNow,
    missRisk: a.missRisk,
    relativeError: a.relativeError,
    brimAt: forecast.trend === 'rising' ? iso(forecast.brimAt) : null,
    brimEarliest: forecast.trend === 'rising' ? iso(forecast.brimEarliest) : null,
    brimLatest: forecast.trend === 'rising' ? iso(forecast.brimLatest) : null,
    trend: forecast.trend,
    distinctEstimate: occupancy.saturated ? null : occupancy.distinctEstimate,
    saturatedRows: sample.nonzeroCells.filter((cells) => cells === sample.width).length,
    errorBudget: terms.errorBudget,
    confidence: terms.confidence,
    watchLine: terms.watchLine,
    judgedTotal,
  };
  if (a.missRiskNote) judgement.missRiskNote = a.missRiskNote;
  if (forecast.trend === 'none') judgement.trendReason = forecast.reason;
  return judgement;
}

/** The level after a failed scrape: two failures in a row make a target unreachable; one alone changes nothing yet. */
export const FAILURES_FOR_UNREACHABLE = 2;

export function levelAfterFailure(previous: HealthLevel, failuresInRow: number): HealthLevel {
  return failuresInRow >= FAILURES_FOR_UNREACHABLE ? 'unreachable' : previous;
}
