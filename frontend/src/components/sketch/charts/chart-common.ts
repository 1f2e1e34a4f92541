// What every chart of the sketch page shares: axes in JetBrains Mono, time in
// the user's zone, and resets and resizes drawn as thin labelled rules.
import uPlot from 'uplot';
import { PALETTE } from '@/utils/palette';
import type { ChartMarker } from './reading-series';

export const AXIS_FONT = '11px "JetBrains Mono", ui-monospace, monospace';
export const CHART_HEIGHT = 240;

/** The user's time zone, shown beside every time axis. */
export function localZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone || 'local time';
}

export function axisStyle(): Pick<uPlot.Axis, 'font' | 'labelFont' | 'stroke' | 'grid' | 'ticks'> {
  return {
    font: AXIS_FONT,
    labelFont: AXIS_FONT,
    stroke: PALETTE.inkSecondary,
    grid: { stroke: PALETTE.hairline, width: 1 },
    ticks: { stroke: PALETTE.hairline, width: 1 },
  };
}

/** Text on a paper-coloured patch, so a label stays legible where a series crosses it. */
export function labelAt(ctx: CanvasRenderingContext2D, text: string, x: number, y: number, colour: string): void {
  canvasText(ctx, colour);
  const width = ctx.measureText(text).width;
  const pad = 2 * uPlot.pxRatio;
  ctx.fillStyle = 'rgba(255, 253, 248, 0.85)';
  ctx.fillRect(x - pad, y - 10 * uPlot.pxRatio, width + 2 * pad, 13 * uPlot.pxRatio);
  ctx.fillStyle = colour;
  ctx.fillText(text, x, y);
}

export function canvasText(ctx: CanvasRenderingContext2D, colour: string): void {
  ctx.font = `${11 * uPlot.pxRatio}px "JetBrains Mono", monospace`;
  ctx.fillStyle = colour;
  // uPlot leaves its last axis's alignment on the context.
  ctx.textAlign = 'left';
  ctx.textBaseline = 'alphabetic';
}

const MARKER_COLOUR = { reset: PALETTE.inkSecondary, resize: PALETTE.primary } as const;
/** Labels closer than this (CSS px) to the last one drawn are left out; the rule still shows. */
const LABEL_GAP = 70;

/** Resets and resizes as thin vertical rules, each with a short label at the foot of the plot. */
export function drawMarkers(u: uPlot, markers: readonly ChartMarker[]): void {
  const ctx = u.ctx;
  const { left, top, width, height } = u.bbox;
  let lastLabelX = -Infinity;
  ctx.save();
  for (const m of markers) {
    const x = Math.round(u.valToPos(m.x, 'x', true));
    if (x < left || x > left + width) continue;
    ctx.strokeStyle = MARKER_COLOUR[m.kind];
    ctx.lineWidth = uPlot.pxRatio;
    ctx.setLineDash(m.kind === 'reset' ? [2 * uPlot.pxRatio, 2 * uPlot.pxRatio] : []);
    ctx.beginPath();
    ctx.moveTo(x, top);
    ctx.lineTo(x, top + height);
    ctx.stroke();
    if (x - lastLabelX >= LABEL_GAP * uPlot.pxRatio) {
      labelAt(ctx, m.label, x + 3 * uPlot.pxRatio, top + height - 4 * uPlot.pxRatio, MARKER_COLOUR[m.kind]);
      lastLabelX = x;
    }
  }
  ctx.restore();
}

/** A word written just above a horizontal line, at the left end of the plot where a growing series is lowest. */
export function labelLine(u: uPlot, y: number, text: string, colour: string, scale = 'y'): void {
  const py = u.valToPos(y, scale, true);
  const { left, top, height } = u.bbox;
  if (!Number.isFinite(py) || py < top || py > top + height) return;
  const ctx = u.ctx;
  ctx.save();
  labelAt(ctx, text, left + 6 * uPlot.pxRatio, py - 4 * uPlot.pxRatio, colour);
  ctx.restore();
}

/** The last point of the first series, which the legend shows while the pointer is elsewhere. */
function latestIndex(u: uPlot): number | null {
  const values = u.data[1] ?? [];
  for (let i = values.length - 1; i >= 0; i--) if (values[i] != null) return i;
  return null;
}

function legendOnLatest(u: uPlot): void {
  if (u.cursor.idx == null) u.setLegend({ idx: latestIndex(u) ?? undefined });
}

export function baseOptions(width: number, opts: { xRange: [number, number]; yLabel: string }): uPlot.Options {
  return {
    width,
    height: CHART_HEIGHT,
    legend: { show: true, live: true },
    cursor: { drag: { x: false, y: false }, points: { size: 6 } },
    scales: { x: { time: true, range: () => opts.xRange } },
    axes: [
      { ...axisStyle(), label: `time (${localZone()})`, labelSize: 18 },
      { ...axisStyle(), label: opts.yLabel, size: 70, labelSize: 18 },
    ],
    series: [{ label: 'time' }],
    hooks: { ready: [legendOnLatest], setCursor: [legendOnLatest], setData: [legendOnLatest] },
  };
}
