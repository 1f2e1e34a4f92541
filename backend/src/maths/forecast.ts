import { SketchMathsError, requireNonNegative, requirePositive } from './errors';
import { latestSegment, sortedReadings, windowPeaks, type TotalReading } from './forecast-series';
import { SEN_INTERVAL_Z, theilSen, thinEvenly } from './theil-sen';

export interface ForecastInput {
  points: readonly TotalReading[];
  /** The stream total at which load reaches 100 % (see `assess`). */
  capacity: number;
  /** 0 for a cumulative sketch, else its reset period. */
  windowSeconds?: number;
  now: number;
  /** Fewer readings than this give "no trend" rather than a guess. */
  minPoints?: number;
  z?: number;
}

export interface NoTrend {
  trend: 'none';
  reason: string;
  pointsUsed: number;
}

export interface RisingTrend {
  trend: 'rising';
  slopePerSecond: number;
  slopeLow: number;
  slopeHigh: number;
  /** When load reaches 100 % (ms since the epoch); in the past when `reached`. */
  brimAt: number;
  brimEarliest: number;
  /** null when the slower edge of the interval does not rise at all. */
  brimLatest: number | null;
  /** Already at or over capacity: `brimAt` is when it was crossed, not a projection. */
  reached: boolean;
  /** The reading the projection starts from. */
  anchorAt: number;
  anchorTotal: number;
  pointsUsed: number;
}

export type BrimForecast = NoTrend | RisingTrend;

export const DEFAULT_MIN_POINTS = 5;

/** Where the readings first reached capacity, interpolated between the two readings either side. */
function crossingTime(series: readonly TotalReading[], capacity: number): number {
  const at = series.findIndex((r) => r.total >= capacity);
  if (at <= 0) return series[0].t;
  const before = series[at - 1];
  const after = series[at];
  return before.t + ((capacity - before.total) / (after.total - before.total)) * (after.t - before.t);
}

/**
 * The brim date: when the stream total (cumulative sketch) or the per-window
 * peak (windowed sketch) will reach capacity, by a Theil–Sen fit with Sen's
 * interval. A cumulative total is exact, so its projection starts from the
 * latest reading; a single window's peak is noisy, so a windowed projection
 * starts from the fitted line at the latest peak.
 */
export function forecastBrim(input: ForecastInput): BrimForecast {
  const capacity = requirePositive('capacity', input.capacity);
  const windowSeconds = requireNonNegative('windowSeconds', input.windowSeconds ?? 0);
  const minPoints = input.minPoints ?? DEFAULT_MIN_POINTS;
  if (!Number.isSafeInteger(minPoints) || minPoints < 2) {
    throw new SketchMathsError('minPoints', `minPoints must be a whole number of 2 or more (got ${String(minPoints)}).`);
  }
  if (!Number.isFinite(input.now)) throw new SketchMathsError('now', 'now must be a time in milliseconds since the epoch.');

  const sorted = sortedReadings(input.points);
  const windowed = windowSeconds > 0;
  const { peaks, current } = windowed ? windowPeaks(sorted, windowSeconds, input.now) : { peaks: [], current: [] };
  const series = windowed ? peaks : latestSegment(sorted);
  const latest = windowed ? (current.length > 0 ? current : peaks.slice(-1)) : series;
  const what = windowed ? 'finished windows' : 'readings since the last reset';
  if (series.length < minPoints) {
    return { trend: 'none', reason: `only ${series.length} ${what}; a trend needs at least ${minPoints}`, pointsUsed: series.length };
  }

  const fitted = thinEvenly(series);
  const t0 = fitted[0].t;
  const fit = theilSen(
    fitted.map((r) => (r.t - t0) / 1000),
    fitted.map((r) => r.total),
    input.z ?? SEN_INTERVAL_Z,
  );
  if (fit === null) return { trend: 'none', reason: 'all readings share one time', pointsUsed: fitted.length };
  const atCapacity = latest.length > 0 && latest[latest.length - 1].total >= capacity;
  if (!(fit.slope > 0)) {
    const subject = windowed ? 'window peaks are' : 'stream total is';
    const reason = atCapacity ? `already at or over capacity; the ${subject} not rising further` : `the ${subject} not rising`;
    return { trend: 'none', reason, pointsUsed: fitted.length };
  }

  const base = { trend: 'rising' as const, slopePerSecond: fit.slope, slopeLow: fit.slopeLow, slopeHigh: fit.slopeHigh, pointsUsed: fitted.length };
  const last = fitted[fitted.length - 1];
  const anchorAt = last.t;
  const anchorTotal = windowed ? fit.intercept + fit.slope * ((last.t - t0) / 1000) : last.total;

  if (atCapacity) {
    const brimAt = crossingTime(latest, capacity);
    return { ...base, brimAt, brimEarliest: brimAt, brimLatest: brimAt, reached: true, anchorAt, anchorTotal };
  }

  const remaining = capacity - anchorTotal;
  const when = (slope: number) => anchorAt + (remaining / slope) * 1000;
  const brimAt = when(fit.slope);
  if (remaining > 0) {
    const brimLatest = fit.slopeLow > 0 ? when(fit.slopeLow) : null;
    return { ...base, brimAt, brimEarliest: when(fit.slopeHigh), brimLatest, reached: false, anchorAt, anchorTotal };
  }
  // The fitted line is already above capacity though no peak has reached it: the crossings lie behind the anchor.
  const edges = [fit.slopeLow, fit.slopeHigh].filter((s) => s > 0).map(when);
  return { ...base, brimAt, brimEarliest: Math.min(brimAt, ...edges), brimLatest: Math.max(brimAt, ...edges), reached: false, anchorAt, anchorTotal };
}
