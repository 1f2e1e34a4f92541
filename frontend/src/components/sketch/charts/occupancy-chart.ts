// Each row's occupancy (share of non-zero cells) over time, one line per row.
// Rows fill at nearly the same pace, so they are told apart by dash as well as
// by shade, and the legend names each; a row near 100 % has little room left
// and linear counting's distinct-key estimate saturates there.
import type uPlot from 'uplot';
import { formatLoad } from '@/utils/format';
import { PALETTE } from '@/utils/palette';
import { baseOptions, drawMarkers, labelLine } from './chart-common';
import type { ReadingSeries } from './reading-series';

/** Four dash patterns tell rows 0–3 apart; each further four rows take the next, lighter shade of the primary teal. */
const DASHES: number[][] = [[], [6, 3], [2, 3], [8, 3, 2, 3]];
const SHADES = ['#0d5c63', '#3b868c', '#6aa8ad', '#93c2c6'] as const;

export function occupancyChart(series: ReadingSeries): { data: uPlot.AlignedData; options: (width: number) => uPlot.Options } {
  const rows = series.occupancyPercents;
  return {
    data: [series.xs, ...rows, series.xs.map(() => 100)],
    options: (width) => {
      const base = baseOptions(width, { xRange: [series.fromX, series.toX], yLabel: 'occupancy' });
      return {
        ...base,
        scales: { ...base.scales, y: { range: () => [0, 105] } },
        axes: [base.axes![0], { ...base.axes![1], values: (_u, splits) => splits.map((v) => `${v}\u202F%`) }],
        series: [
          base.series[0],
          ...rows.map((_, row) => ({
            label: `row ${row}`,
            stroke: SHADES[Math.floor(row / DASHES.length) % SHADES.length],
            dash: DASHES[row % DASHES.length],
            width: 1.5,
            points: { show: false },
            value: (_u: uPlot, v: number | null) => (v == null ? '—' : formatLoad(v / 100)),
          })),
          { label: 'full', stroke: PALETTE.brass, width: 1, points: { show: false }, value: () => '100\u202F%' },
        ],
        hooks: {
          ...base.hooks,
          draw: [
            (u) => {
              drawMarkers(u, series.markers);
              labelLine(u, 100, 'full', PALETTE.brass);
            },
          ],
        },
      };
    },
  };
}
