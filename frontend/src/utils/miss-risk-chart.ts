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

function verticalRule(u: uPlot, at: number, colour: string, dash: number[], label: string, width = 1): void {
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
  ctx.font = `${11 * uPlot.pxRatio}px "JetBrains Mono", monospace`;
  ctx.fillText(label, x + 4 * uPlot.pxRatio, top + 12 * uPlot.pxRatio);
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
  ctx.font = `${11 * uPlot.pxRatio}px "JetBrains Mono", monospace`;
  ctx.fillText(label, left + 4 * uPlot.pxRatio, y - 4 * uPlot.pxRatio);
  ctx.restore();
}

function logTicks(_u: uPlot, splits: number[]): string[] {
  return splits.map((v) => formatPowerOfTen(Math.round(Math.log10(v))));
}

/** `marks` is read on every draw, so updating it and redrawing moves the rules. */
export function missRiskChartOptions(width: number, marks: () => ChartMarks): uPlot.Options {
  const axis = { font: AXIS_FONT, stroke: PALETTE.inkSecondary, grid: { stroke: PALETTE.hairline, width: 1 } };
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
      { ...axis, label: 'miss risk', size: 64, values: logTicks },
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
          verticalRule(u, sizedTotal, PALETTE.inkSecondary, [4, 4], 'n₀');
          verticalRule(u, capacity * DEFAULT_WATCH_LINE, PALETTE.watch, [1, 3], 'watch');
          verticalRule(u, capacity, PALETTE.brass, [], 'brim', 2);
        },
      ],
    },
  };
}
