// The stream total against the brim (LOOK.md): history, the forecast as a
// dashed continuation in its band, the brim in brass and the watch line dotted.
import uPlot from 'uplot';
import { formatCompact, formatCount, formatRelative } from '@/utils/format';
import { PALETTE } from '@/utils/palette';
import { baseOptions, canvasText, drawMarkers, labelAt, labelLine } from './chart-common';
import { chartEndX, type ForecastShape } from './brim-forecast';
import type { ReadingSeries } from './reading-series';

export interface TotalChart {
  data: uPlot.AlignedData;
  options: (width: number) => uPlot.Options;
}

const BAND_FILL = 'rgba(168, 116, 26, 0.12)';
const TOTAL_FILL = 'rgba(13, 92, 99, 0.08)';

function rows(series: ReadingSeries, forecast: ForecastShape | null, watchLine: number): uPlot.AlignedData {
  const lastCapacity = series.capacities.at(-1) ?? forecast?.capacity ?? null;
  const points = series.xs.map((x, i) => ({ x, total: series.totals[i], capacity: series.capacities[i], ahead: null as number | null }));
  if (forecast) {
    const start = points.find((p) => p.x === forecast.startX);
    if (start) start.ahead = forecast.startTotal;
    points.push({ x: forecast.endX, total: null, capacity: lastCapacity, ahead: forecast.endTotal });
    points.sort((a, b) => a.x - b.x);
  }
  return [
    points.map((p) => p.x),
    points.map((p) => p.total),
    points.map((p) => p.ahead),
    points.map((p) => p.capacity),
    points.map((p) => (p.capacity === null ? null : p.capacity * watchLine)),
  ];
}

function drawBand(u: uPlot, f: ForecastShape): void {
  const ctx = u.ctx;
  const { left, top, width, height } = u.bbox;
  const px = (x: number) => u.valToPos(x, 'x', true);
  const py = (y: number) => u.valToPos(y, 'y', true);
  ctx.save();
  ctx.beginPath();
  ctx.rect(left, top, width, height);
  ctx.clip();
  ctx.fillStyle = BAND_FILL;
  ctx.beginPath();
  ctx.moveTo(px(f.startX), py(f.startTotal));
  ctx.lineTo(px(f.earliestX), py(f.capacity));
  ctx.lineTo(px(f.latestX), py(f.capacity));
  ctx.closePath();
  ctx.fill();
  ctx.restore();
}

function drawBrimDate(u: uPlot, f: ForecastShape): void {
  const ctx = u.ctx;
  const x = u.valToPos(f.endX, 'x', true);
  const y = u.valToPos(f.endTotal, 'y', true);
  const when = new Date(f.brimX * 1000);
  ctx.save();
  canvasText(ctx, PALETTE.brass);
  if (f.beyondView) {
    const text = `brims ${formatRelative(when)} →`;
    labelAt(ctx, text, x - ctx.measureText(text).width - 6 * uPlot.pxRatio, y - 8 * uPlot.pxRatio, PALETTE.brass);
  } else {
    ctx.fillStyle = PALETTE.brass;
    ctx.beginPath();
    ctx.arc(x, y, 5 * uPlot.pxRatio, 0, 2 * Math.PI);
    ctx.fill();
    const text = `brim date ${when.toLocaleDateString(undefined, { day: 'numeric', month: 'short' })}`;
    const width = ctx.measureText(text).width;
    const fitsRight = x + width + 10 * uPlot.pxRatio < u.bbox.left + u.bbox.width;
    labelAt(ctx, text, fitsRight ? x + 8 * uPlot.pxRatio : x - width - 8 * uPlot.pxRatio, y + 16 * uPlot.pxRatio, PALETTE.brass);
  }
  ctx.restore();
}

/** With replicas, each point is the highest of them, so the legend says so. */
export function totalChart(series: ReadingSeries, forecast: ForecastShape | null, watchLine: number, replicas = 1): TotalChart {
  const data = rows(series, forecast, watchLine);
  const peak = Math.max(0, ...(data[1] as (number | null)[]).map((v) => v ?? 0), ...(data[3] as (number | null)[]).map((v) => v ?? 0));
  const lastCapacity = series.capacities.at(-1) ?? forecast?.capacity ?? null;
  const figure = (_u: uPlot, v: number | null) => (v == null ? '—' : formatCount(v));
  return {
    data,
    options: (width) => {
      const base = baseOptions(width, { xRange: [series.fromX, chartEndX(series, forecast)], yLabel: 'stream total n' });
      return {
        ...base,
        scales: { ...base.scales, y: { range: () => [0, peak * 1.08 || 1] } },
        axes: [base.axes![0], { ...base.axes![1], values: (_u, splits) => splits.map(formatCompact) }],
        series: [
          base.series[0],
          { label: replicas > 1 ? 'stream total (highest replica)' : 'stream total', stroke: PALETTE.primary, fill: TOTAL_FILL, width: 2, points: { show: false }, value: figure },
          { label: 'forecast', stroke: PALETTE.primary, dash: [6, 5], width: 1.5, spanGaps: true, points: { show: false }, value: figure },
          { label: 'brim', stroke: PALETTE.brass, width: 2, spanGaps: true, paths: uPlot.paths.stepped!({ align: 1 }), points: { show: false }, value: figure },
          { label: 'watch line', stroke: PALETTE.watch, dash: [1, 3], width: 1, spanGaps: true, paths: uPlot.paths.stepped!({ align: 1 }), points: { show: false }, value: figure },
        ],
        hooks: {
          ...base.hooks,
          drawAxes: [(u) => forecast && drawBand(u, forecast)],
          draw: [
            (u) => {
              drawMarkers(u, series.markers);
              if (lastCapacity !== null) labelLine(u, lastCapacity, 'brim', PALETTE.brass);
              if (forecast) drawBrimDate(u, forecast);
            },
          ],
        },
      };
    },
  };
}
