// uPlot options for a dump's histogram: bars per doubling bin of counter
// values, cells on a log scale (a dump is mostly small counters), and the
// error budget E drawn as the brass brim: cells right of it are over budget.
import uPlot from 'uplot';
import type { HistogramBin } from '@brimwatch/api-types';
import { axisStyle, CHART_HEIGHT, labelAt } from '@/components/sketch/charts/chart-common';
import { formatCompact, formatCount } from '@/utils/format';
import { PALETTE } from '@/utils/palette';

/** A bin by its lower bound: the bars double in width, so the next label is where this one ends. */
export function binLabel(bin: HistogramBin): string {
  return formatCompact(bin.from);
}

/** Every bin's label when there is room, else every second or fourth, so they never overlap. */
function labelEvery(bins: number, width: number): number {
  const room = Math.max(1, Math.floor(width / 56));
  return bins <= room ? 1 : Math.ceil(bins / room);
}

/** Whole decades on the log axis: 1, 10, 100, … (at most six of them). */
function decades(min: number, max: number): number[] {
  const low = Math.max(0, Math.ceil(Math.log10(min)));
  const high = Math.floor(Math.log10(max));
  const step = Math.max(1, Math.ceil((high - low + 1) / 6));
  const out: number[] = [];
  for (let e = low; e <= high; e += step) out.push(10 ** e);
  return out;
}

/** Bin index → cells; an empty bin has no bar (a log scale has no zero). */
export function histogramData(bins: HistogramBin[]): uPlot.AlignedData {
  return [bins.map((_, i) => i), bins.map((b) => (b.cells > 0 ? b.cells : null))];
}

/** Where E falls on the bin axis: inside its bin, in proportion. */
export function budgetPosition(bins: HistogramBin[], errorBudget: number): number | null {
  const i = bins.findIndex((b) => errorBudget >= b.from && errorBudget <= b.to);
  if (i < 0) return errorBudget > (bins[bins.length - 1]?.to ?? 0) ? null : 0;
  const b = bins[i];
  return i - 0.5 + (b.to === b.from ? 0.5 : (errorBudget - b.from) / (b.to - b.from + 1));
}

export function histogramOptions(bins: HistogramBin[], errorBudget: number): (width: number) => uPlot.Options {
  const budgetAt = budgetPosition(bins, errorBudget);
  return (width) => ({
    width,
    height: CHART_HEIGHT,
    legend: { show: false },
    cursor: { drag: { x: false, y: false }, points: { show: false } },
    scales: {
      x: { time: false, range: [-0.5, Math.max(0.5, bins.length - 0.5)] },
      y: { distr: 3, log: 10, range: (_u, _min, max) => [0.5, Math.max(10, (max ?? 10) * 2)] },
    },
    axes: [
      {
        ...axisStyle(),
        label: 'counter value (each bar runs to double its left edge)',
        labelSize: 18,
        splits: () => bins.map((_, i) => i).filter((i) => i % labelEvery(bins.length, width) === 0),
        values: (_u, splits) => splits.map((i) => (bins[i] ? binLabel(bins[i]) : '')),
      },
      {
        ...axisStyle(),
        label: 'cells',
        size: 70,
        labelSize: 18,
        splits: (_u, _axis, min, max) => decades(min, max),
        filter: (_u, splits) => splits,
        values: (_u, splits) => splits.map((v) => formatCompact(v)),
      },
    ],
    series: [
      {},
      {
        label: 'cells',
        fill: `${PALETTE.primary}cc`,
        stroke: PALETTE.primary,
        paths: uPlot.paths.bars!({ size: [0.8, 48] }),
        points: { show: false },
        value: (_u, v) => (v == null ? '0' : formatCount(v)),
      },
    ],
    hooks: {
      draw: [
        (u) => {
          if (budgetAt === null) return;
          const ctx = u.ctx;
          const x = Math.round(u.valToPos(budgetAt, 'x', true));
          const { top, height } = u.bbox;
          ctx.save();
          ctx.strokeStyle = PALETTE.brass;
          ctx.lineWidth = 2 * uPlot.pxRatio;
          ctx.beginPath();
          ctx.moveTo(x, top);
          ctx.lineTo(x, top + height);
          ctx.stroke();
          labelAt(ctx, `E = ${formatCompact(errorBudget)}`, x + 4 * uPlot.pxRatio, top + 12 * uPlot.pxRatio, PALETTE.brass);
          ctx.restore();
        },
      ],
    },
  });
}
