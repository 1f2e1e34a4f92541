// Where the forecast sits on the stream-total chart: a dashed continuation
// from the last reading to the brim at the forecast date, inside a band that
// fans out to the earliest and latest brim dates.
import type { SketchDetail } from '@brimwatch/api-types';
import type { ReadingSeries } from './reading-series';

export interface ForecastShape {
  startX: number;
  startTotal: number;
  capacity: number;
  brimX: number;
  earliestX: number;
  latestX: number;
  /** Where the dashed line stops: the brim, or the chart's right edge when the brim lies beyond it. */
  endX: number;
  endTotal: number;
  beyondView: boolean;
}

const seconds = (iso: string) => new Date(iso).getTime() / 1000;

type ForecastFields = Pick<SketchDetail, 'brimDate' | 'brimEarliest' | 'brimLatest' | 'capacity' | 'load'>;

/**
 * Null when there is nothing to forecast: no rising trend, already at the
 * brim, or no reading in the range. The chart reaches past "now" by at most
 * the range's own length, so a far-off brim does not squash the history.
 */
export function forecastShape(detail: ForecastFields, series: ReadingSeries): ForecastShape | null {
  if (!detail.brimDate || detail.capacity === null || (detail.load ?? 0) >= 1) return null;
  const last = series.totals.reduce<number>((at, total, i) => (total !== null ? i : at), -1);
  if (last < 0) return null;
  const startX = series.xs[last];
  const startTotal = series.totals[last] as number;
  const brimX = seconds(detail.brimDate);
  if (!(brimX > startX) || startTotal >= detail.capacity) return null;
  const earliestX = Math.min(brimX, detail.brimEarliest ? seconds(detail.brimEarliest) : brimX);
  const latestX = Math.max(brimX, detail.brimLatest ? seconds(detail.brimLatest) : brimX);
  const viewEnd = series.toX + (series.toX - series.fromX);
  const beyondView = brimX > viewEnd;
  const endX = beyondView ? viewEnd : brimX;
  const slope = (detail.capacity - startTotal) / (brimX - startX);
  return {
    startX,
    startTotal,
    capacity: detail.capacity,
    brimX,
    earliestX,
    latestX,
    endX,
    endTotal: beyondView ? startTotal + slope * (endX - startX) : detail.capacity,
    beyondView,
  };
}

/** The right edge of the chart: the latest brim date (with a little room) when it fits, else the reach above. */
export function chartEndX(series: ReadingSeries, forecast: ForecastShape | null): number {
  if (!forecast) return series.toX;
  const span = series.toX - series.fromX;
  return Math.min(series.toX + span, Math.max(series.toX, forecast.latestX + span * 0.04));
}
