import { SketchMathsError } from './errors';

/** One reading of a sketch's stream total; `t` in milliseconds since the epoch. */
export interface TotalReading {
  t: number;
  total: number;
}

export function sortedReadings(points: readonly TotalReading[]): TotalReading[] {
  points.forEach((point, index) => {
    if (!Number.isFinite(point?.t) || !Number.isFinite(point?.total) || point.total < 0) {
      throw new SketchMathsError('points', `reading ${index} needs a finite time and a stream total of 0 or more.`);
    }
  });
  return points.slice().sort((a, b) => a.t - b.t);
}

/** A fall in the total is a restart or a new window; the trend before it belongs to another run. */
export function latestSegment(sorted: readonly TotalReading[]): TotalReading[] {
  let start = 0;
  for (let i = 1; i < sorted.length; i++) {
    if (sorted[i].total < sorted[i - 1].total) start = i;
  }
  return sorted.slice(start);
}

export interface WindowPeaks {
  /** The highest reading of each finished window, at the time it was read. */
  peaks: TotalReading[];
  /** Readings of the window still running at `now`, if any. */
  current: TotalReading[];
}

/**
 * Splits readings into windows: a new window starts where the total falls, or
 * where two readings are a full window apart (a window that began before the
 * first cannot still be running at the second, even if no fall was seen).
 */
export function windowPeaks(sorted: readonly TotalReading[], windowSeconds: number, now: number): WindowPeaks {
  const windowMs = windowSeconds * 1000;
  const windows: TotalReading[][] = [];
  for (const reading of sorted) {
    const open = windows[windows.length - 1];
    if (open && reading.total >= open[open.length - 1].total && reading.t - open[0].t < windowMs) open.push(reading);
    else windows.push([reading]);
  }
  const last = windows[windows.length - 1];
  const current = last && now - last[0].t < windowMs ? (windows.pop() as TotalReading[]) : [];
  const peaks = windows.map((readings) => readings.reduce((best, r) => (r.total > best.total ? r : best)));
  return { peaks, current };
}
