// uPlot options for the Planner's chart: miss risk (log scale) against stream
// total, with the brim at the capacity and the watch line before it (LOOK.md).
import uPlot from 'uplot';
import { DEFAULT_WATCH_LINE } from '@brimwatch/maths';
import { formatCompact, formatCount, formatPowerOfTen, formatRisk } from './format';
import { PALETTE } from './palette';

export interface ChartMarks {
  capacity: number;
  sizedTotal: number;
  delta: number;
}

const AXIS_FONT = '11px "JetBrains Mono", ui-monospace, monospace';

interface Rule {
  at: number;
  colour: string;
  dash: number[];
  label: string;
  width?: number;
  /** Which line of labels, counted from the top, so close rules do not print over each other. */
  row: number;
}

function labelStyle(ctx: CanvasRenderingContext2D): void {
  ctx.font = `${11 * uPlot.pxRatio}px "JetBrains Mono", monospace`;
  // uPlot leaves the alignment of its last axis on the context.
  ctx.textAlign = 'left';
  ctx.textBaseline = 'alphabetic';
}

function verticalRule(u: uPlot, { at, colour, dash, label, width = 1, row }: Rule): void {
  const ctx = u.ctx;
  const x = Math.round(u.valToPos(at, 'x', true));
  const { top, height } = u.bbox;
  ctx.save();
  ctx.strokeStyle = colour;
  ctx.fillStyle = colour;
  ctx.lineWidth = width * uPlot.pxRatio;
  ctx.setLineDash(dash.map((d) => d * uPlot.pxRatio));
  ctx.beginPath();
  ctx.moveTo(x, top);
  ctx.lineTo(x, top + height);
  ctx.stroke();
  labelStyle(ctx);
  ctx.fillText(label, x + 4 * uPlot.pxRatio, top + (12 + 14 * row) * uPlot.pxRatio);
  ctx.restore();
}

function horizontalRule(u: uPlot, at: number, label: string): void {
  const ctx = u.ctx;
  const y = Math.round(u.valToPos(at, 'y', true));
  const { left, width } = u.bbox;
  ctx.save();
  ctx.strokeStyle = PALETTE.inkSecondary;
  ctx.fillStyle = PALETTE.inkSecondary;
  ctx.lineWidth = uPlot.pxRatio;
  ctx.setLineDash([2 * uPlot.pxRatio, 3 * uPlot.pxRatio]);
  ctx.beginPath();
  ctx.moveTo(left, y);
  ctx.lineTo(left + width, y);
  ctx.stroke();
  labelStyle(ctx);
  ctx.fillText(label, left + 4 * uPlot.pxRatio, y - 4 * uPlot.pxRatio);
  ctx.restore();
}

/** At most about six powers of ten, so the labels never crowd. */
function powersOfTen(_u: uPlot, _axis: number, min: number, max: number): number[] {
  const low = Math.ceil(Math.log10(min));
  const high = Math.floor(Math.log10(max));
  const step = Math.max(1, Math.ceil((high - low) / 6));
  const splits: number[] = [];
  for (let exponent = high; exponent >= low; exponent -= step) splits.push(10 ** exponent);
  return splits;
}

function powerLabels(_u: uPlot, splits: number[]): string[] {
  return splits.map((v) => (v > 0 ? formatPowerOfTen(Math.round(Math.log10(v))) : ''));
}

/** The splits above are already thinned; uPlot's own log thinning would blank some of them. */
function keepAll(_u: uPlot, splits: number[]): number[] {
  return splits;
}

/** `marks` is read on every draw, so updating it and redrawing moves the rules. */
export function missRiskChartOptions(width: number, marks: () => ChartMarks): uPlot.Options {
  const axis = {
    font: AXIS_FONT,
    labelFont: AXIS_FONT,
    stroke: PALETTE.inkSecondary,
    grid: { stroke: PALETTE.hairline, width: 1 },
  };
  return {
    width,
    height: 280,
    legend: { show: true },
    cursor: { drag: { x: false, y: false } },
    scales: {
      x: { time: false },
      y: { distr: 3, log: 10, range: (_u, min) => [Math.max(min, 1e-12), 1] },
    },
    axes: [
      { ...axis, label: 'stream total n', values: (_u, splits) => splits.map(formatCompact) },
      { ...axis, label: 'miss risk', size: 64, splits: powersOfTen, filter: keepAll, values: powerLabels },
    ],
    series: [
      { label: 'stream total', value: (_u, v) => (v == null ? '—' : formatCount(v)) },
      {
        label: 'miss risk',
        stroke: PALETTE.primary,
        width: 2,
        points: { show: false },
        value: (_u, v) => (v == null ? '—' : v >= 1 ? 'no guarantee' : formatRisk(v)),
      },
    ],
    hooks: {
      draw: [
        (u) => {
          const { capacity, sizedTotal, delta } = marks();
          horizontalRule(u, delta, `δ ${formatRisk(delta)}`);
          verticalRule(u, { at: capacity * DEFAULT_WATCH_LINE, colour: PALETTE.watch, dash: [1, 3], label: 'watch', row: 0 });
          verticalRule(u, { at: sizedTotal, colour: PALETTE.inkSecondary, dash: [4, 4], label: 'n₀', row: 1 });
          verticalRule(u, { at: capacity, colour: PALETTE.brass, dash: [], label: 'brim', width: 2, row: 0 });
        },
      ],
    },
  };
}
