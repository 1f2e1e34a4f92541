// Miss risk on a log scale: at the brim it equals δ, so δ is drawn in brass.
import type uPlot from 'uplot';
import { formatPowerOfTen, formatRisk } from '@/utils/format';
import { PALETTE } from '@/utils/palette';
import { baseOptions, drawMarkers, labelLine } from './chart-common';
import type { ReadingSeries } from './reading-series';

const FLOOR = 1e-12;

/** Powers of ten only, at most about six, so the labels never crowd. */
function powersOfTen(_u: uPlot, _axis: number, min: number, max: number): number[] {
  const low = Math.ceil(Math.log10(min));
  const high = Math.floor(Math.log10(max));
  const step = Math.max(1, Math.ceil((high - low) / 5));
  const splits: number[] = [];
  for (let exponent = high; exponent >= low; exponent -= step) splits.push(10 ** exponent);
  return splits;
}

export function riskChart(series: ReadingSeries, delta: number): { data: uPlot.AlignedData; options: (width: number) => uPlot.Options } {
  const shown = series.risks.filter((r): r is number => r !== null && r > 0);
  const low = Math.max(FLOOR, Math.min(delta / 100, ...shown) / 3);
  return {
    data: [series.xs, series.risks, series.xs.map(() => delta)],
    options: (width) => {
      const base = baseOptions(width, { xRange: [series.fromX, series.toX], yLabel: 'miss risk' });
      return {
        ...base,
        scales: { ...base.scales, y: { distr: 3, log: 10, range: () => [10 ** Math.floor(Math.log10(low)), 1] } },
        axes: [
          base.axes![0],
          {
            ...base.axes![1],
            splits: powersOfTen,
            filter: (_u, splits) => splits,
            values: (_u, splits) => splits.map((v) => formatPowerOfTen(Math.round(Math.log10(v)))),
          },
        ],
        series: [
          base.series[0],
          {
            label: 'miss risk',
            stroke: PALETTE.primary,
            width: 2,
            points: { show: false },
            value: (_u, v) => (v == null ? '—' : v >= 1 ? 'no guarantee' : formatRisk(v)),
          },
          { label: 'brim (δ)', stroke: PALETTE.brass, width: 2, points: { show: false }, value: () => formatRisk(delta) },
        ],
        hooks: {
          ...base.hooks,
          draw: [
            (u) => {
              drawMarkers(u, series.markers);
              labelLine(u, delta, `brim: δ = ${formatRisk(delta)}`, PALETTE.brass);
            },
          ],
        },
      };
    },
  };
}
