// uPlot options for a dump's histogram: bars per doubling bin of counter
// values, cells on a log scale (a dump is mostly small counters), and the
// error budget E drawn as the brass brim: cells right of it are over budget.
import uPlot from 'uplot';
import type { HistogramBin } from '@/api/upload-types';
import { axisStyle, canvasText, CHART_HEIGHT } from '@/components/sketch/charts/chart-common';
import { formatCompact, formatCount } from '@/utils/format';
import { PALETTE } from '@/utils/palette';

export function binLabel(bin: HistogramBin): string {
  if (bin.from === bin.to) return formatCompact(bin.from);
  return `${formatCompact(bin.from)}–${formatCompact(bin.to)}`;
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
        label: 'counter value',
        splits: () => bins.map((_, i) => i),
        values: (_u, splits) => splits.map((i) => (bins[i] ? binLabel(bins[i]) : '')),
      },
      { ...axisStyle(), label: 'cells', size: 64, values: (_u, splits) => splits.map((v) => formatCompact(v)) },
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
          canvasText(ctx, PALETTE.brass);
          ctx.fillText(`E = ${formatCompact(errorBudget)}`, x + 4 * uPlot.pxRatio, top + 12 * uPlot.pxRatio);
          ctx.restore();
        },
      ],
    },
  });
}
