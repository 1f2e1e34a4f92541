import { describe, expect, it } from 'vitest';
import { forecastBrim, forecastTotalAt, windowPeaks, type BrimForecast, type RisingTrend, type TotalReading } from '../../../backend/src/maths';

const HOUR = 3_600_000;
const T0 = Date.UTC(2026, 0, 5);

function rising(forecast: BrimForecast): RisingTrend {
  if (forecast.trend !== 'rising') throw new Error(`expected a rising trend, got: ${forecast.reason}`);
  return forecast;
}

/** Hourly readings on an exact line, 1,000 per hour. */
const hourly = (hours: number): TotalReading[] => Array.from({ length: hours }, (_, h) => ({ t: T0 + h * HOUR, total: 1_000 * h }));

describe('forecastBrim', () => {
  it('when a cumulative total rises 1,000 an hour, then it brims when the remaining room is used up', () => {
    const points = hourly(48);
    const now = points[47].t;
    const forecast = rising(forecastBrim({ points, capacity: 100_000, now }));
    // By hand: 47,000 now, 53,000 to go at 1,000/h → 53 h after the last reading.
    expect(forecast.slopePerSecond).toBeCloseTo(1_000 / 3_600, 12);
    expect(forecast.brimAt).toBeCloseTo(now + 53 * HOUR, -1);
    expect(forecast.brimEarliest).toBeCloseTo(forecast.brimAt, -1);
    expect(forecast.reached).toBe(false);
  });

  it('when the total fell (a restart), then only the readings after the fall are fitted', () => {
    const before = Array.from({ length: 20 }, (_, i) => ({ t: T0 + i * 1_000, total: 50_000 + 10 * i }));
    const after = Array.from({ length: 10 }, (_, i) => ({ t: T0 + (20 + i) * 1_000, total: 20 * i }));
    const forecast = rising(forecastBrim({ points: [...after, ...before], capacity: 1e6, now: T0 + 30_000 }));
    expect(forecast.slopePerSecond).toBeCloseTo(20, 9);
    expect(forecast.pointsUsed).toBe(10);
  });

  it('when too few readings follow the last reset, then there is no trend and the reason says why', () => {
    const points = [...hourly(30), { t: T0 + 31 * HOUR, total: 5 }, { t: T0 + 32 * HOUR, total: 9 }];
    const forecast = forecastBrim({ points, capacity: 1e6, now: T0 + 32 * HOUR });
    expect(forecast).toMatchObject({ trend: 'none', pointsUsed: 2 });
    expect(forecast.trend === 'none' && forecast.reason).toMatch(/only 2 readings since the last reset; a trend needs at least 5/);
  });

  it('when the total stays flat, then there is no trend', () => {
    const points = Array.from({ length: 10 }, (_, i) => ({ t: T0 + i * HOUR, total: 777 }));
    expect(forecastBrim({ points, capacity: 1e6, now: T0 + 10 * HOUR })).toMatchObject({ trend: 'none', reason: 'the stream total is not rising' });
  });

  it('when the total has already passed capacity, then the brim date is the interpolated crossing', () => {
    const points = [0, 100, 200, 300, 400].map((total, i) => ({ t: T0 + i * 1_000, total }));
    const forecast = rising(forecastBrim({ points, capacity: 250, now: T0 + 10_000 }));
    // Linear between (2 s, 200) and (3 s, 300): 250 is reached at 2.5 s.
    expect(forecast.reached).toBe(true);
    expect(forecast.brimAt).toBe(T0 + 2_500);
    expect(forecast.brimLatest).toBe(T0 + 2_500);
  });

  it('when some pairs of readings are flat, then the slow edge of the interval is 0 and the latest brim date is unknown', () => {
    // Slopes by hand: 0,0,3.33,5,5,5,5,6.67,10,10 → median 5; Sen's lower limit (rank 1 of 10) = 0.
    const points = [0, 0, 10, 10, 20].map((total, i) => ({ t: T0 + i * 1_000, total }));
    const forecast = rising(forecastBrim({ points, capacity: 100, now: T0 + 4_000 }));
    expect(forecast.slopePerSecond).toBe(5);
    expect(forecast.brimAt).toBe(T0 + 4_000 + 16_000);
    expect(forecast.brimLatest).toBeNull();
    expect(forecast.brimEarliest).toBeLessThan(forecast.brimAt);
  });

  it('when a sketch resets every hour, then the per-window peaks are fitted and the running window is left out', () => {
    const points: TotalReading[] = [];
    for (let w = 0; w <= 10; w++) {
      const peak = 10_000 + 1_000 * w;
      const readings = w < 10 ? 6 : 2;
      for (let i = 0; i < readings; i++) points.push({ t: T0 + w * HOUR + i * 10 * 60_000, total: (peak * (i + 1)) / 6 });
    }
    const now = T0 + 10 * HOUR + 15 * 60_000;
    const forecast = rising(forecastBrim({ points, capacity: 25_000, windowSeconds: 3_600, now }));
    // Peaks 10,000 … 19,000, one per hour → 1,000/h; 6,000 to go from the last peak at 9 h 50 min → 6 h later.
    expect(forecast.pointsUsed).toBe(10);
    expect(forecast.slopePerSecond).toBeCloseTo(1_000 / 3_600, 9);
    expect(forecast.anchorTotal).toBeCloseTo(19_000, 6);
    expect(forecast.brimAt).toBeCloseTo(T0 + 9 * HOUR + 50 * 60_000 + 6 * HOUR, -1);
  });

  it('when readings are further apart than the window, then each one is its own window even without a fall', () => {
    const points = Array.from({ length: 6 }, (_, i) => ({ t: T0 + i * 5 * 60_000, total: 100 + i }));
    const { peaks, current } = windowPeaks(points, 60, T0 + 60 * 60_000);
    expect(peaks.map((p) => p.total)).toEqual([100, 101, 102, 103, 104, 105]);
    expect(current).toEqual([]);
  });

  it('when 2,000 readings lie on a line, then the fit is thinned to 400 and the slope is exact', () => {
    const points = Array.from({ length: 2_000 }, (_, i) => ({ t: T0 + i * 60_000, total: 3 * 60 * i }));
    const forecast = rising(forecastBrim({ points, capacity: 1e9, now: T0 + 2_000 * 60_000 }));
    expect(forecast.pointsUsed).toBe(400);
    expect(forecast.slopePerSecond).toBeCloseTo(3, 9);
  });

  it('when a reading is not a number, then the error points at it', () => {
    const points = [...hourly(5), { t: T0, total: Number.NaN }];
    expect(() => forecastBrim({ points, capacity: 10, now: T0 })).toThrow(/reading 5/);
  });
});

describe('forecastTotalAt', () => {
  it('when the trend rises 1,000 an hour, then 90 days out adds 2,160,000', () => {
    const points = hourly(48);
    const now = points[47].t;
    const forecast = forecastBrim({ points, capacity: 1e9, now });
    // By hand: 47,000 + 1,000 · 24 · 90 = 2,207,000.
    expect(forecastTotalAt({ forecast, currentTotal: 47_000, now })).toBeCloseTo(2_207_000, 3);
    expect(forecastTotalAt({ forecast, currentTotal: 47_000, now, horizonDays: 1 })).toBeCloseTo(71_000, 3);
  });

  it('when there is no trend, then the forecast total is today\'s total', () => {
    const forecast: BrimForecast = { trend: 'none', reason: 'too few', pointsUsed: 1 };
    expect(forecastTotalAt({ forecast, currentTotal: 1234, now: T0 })).toBe(1234);
  });
});
