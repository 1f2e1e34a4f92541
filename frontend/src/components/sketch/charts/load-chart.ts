// Load as a percentage of capacity: the brim at 100 %, the watch line dotted.
import type uPlot from 'uplot';
import { formatLoad } from '@/utils/format';
import { PALETTE } from '@/utils/palette';
import { baseOptions, drawMarkers, labelLine } from './chart-common';
import type { ReadingSeries } from './reading-series';

export function loadChart(series: ReadingSeries, watchLine: number): { data: uPlot.AlignedData; options: (width: number) => uPlot.Options } {
  const peak = Math.max(0, ...series.loadPercents.map((v) => v ?? 0));
  const top = Math.max(110, Math.ceil((peak * 1.08) / 10) * 10);
  const constant = (value: number) => series.xs.map(() => value);
  return {
    data: [series.xs, series.loadPercents, constant(100), constant(watchLine * 100)],
    options: (width) => {
      const base = baseOptions(width, { xRange: [series.fromX, series.toX], yLabel: 'load' });
      return {
        ...base,
        scales: { ...base.scales, y: { range: () => [0, top] } },
        axes: [base.axes![0], { ...base.axes![1], values: (_u, splits) => splits.map((v) => `${v}\u202F%`) }],
        series: [
          base.series[0],
          {
            label: 'load',
            stroke: PALETTE.primary,
            fill: 'rgba(13, 92, 99, 0.08)',
            width: 2,
            points: { show: false },
            value: (_u, v) => (v == null ? '—' : formatLoad(v / 100)),
          },
          { label: 'brim', stroke: PALETTE.brass, width: 2, points: { show: false }, value: () => '100\u202F%' },
          { label: 'watch line', stroke: PALETTE.watch, dash: [1, 3], width: 1, points: { show: false }, value: () => formatLoad(watchLine) },
        ],
        hooks: {
          ...base.hooks,
          draw: [
            (u) => {
              drawMarkers(u, series.markers);
              labelLine(u, 100, 'brim', PALETTE.brass);
              labelLine(u, watchLine * 100, 'watch', PALETTE.watch);
            },
          ],
        },
      };
    },
  };
}
