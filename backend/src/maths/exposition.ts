/**
 * Writes sketch readings in the Prometheus text exposition format (0.0.4) or
 * in OpenMetrics 1.0, the metrics of DESIGN.md's "Sketch readings". Several
 * sketches share each family, told apart by the `sketch` label, because a
 * family may appear only once per exposition.
 */
export interface SketchReading {
  sketch: string;
  width: number;
  depth: number;
  streamTotal: number;
  nonzeroCells: readonly number[];
  counterBytes: number;
  windowSeconds: number;
  conservative: boolean;
}

export interface ExpositionOptions {
  openMetrics?: boolean;
}

export const EXPOSITION_CONTENT_TYPES = {
  prometheus: 'text/plain; version=0.0.4; charset=utf-8',
  openMetrics: 'application/openmetrics-text; version=1.0.0; charset=utf-8',
} as const;

function escapeLabel(value: string): string {
  return value.replace(/\\/g, '\\\\').replace(/"/g, '\\"').replace(/\n/g, '\\n');
}

/** The metrics of a sketch reading, with their exposition types and help texts. */
export const COUNTMIN_METRICS = {
  countmin_width: { type: 'gauge', help: 'Counters per row (m).' },
  countmin_depth: { type: 'gauge', help: 'Rows, one hash function each (k).' },
  countmin_stream_total: { type: 'counter', help: 'Sum of all increments since start or since the window began (n).' },
  countmin_nonzero_cells: { type: 'gauge', help: 'Non-zero counters in the row.' },
  countmin_counter_bytes: { type: 'gauge', help: 'Bytes per counter.' },
  countmin_window_seconds: { type: 'gauge', help: 'Reset period in seconds; 0 for a cumulative sketch.' },
  countmin_conservative: { type: 'gauge', help: '1 when updated conservatively.' },
} as const;

export type CountminMetric = keyof typeof COUNTMIN_METRICS;

const SAMPLES: Record<CountminMetric, (r: SketchReading, label: string) => string[]> = {
  countmin_width: (r, label) => [`countmin_width{${label}} ${r.width}`],
  countmin_depth: (r, label) => [`countmin_depth{${label}} ${r.depth}`],
  countmin_stream_total: (r, label) => [`countmin_stream_total{${label}} ${r.streamTotal}`],
  countmin_nonzero_cells: (r, label) => r.nonzeroCells.map((cells, row) => `countmin_nonzero_cells{${label},row="${row}"} ${cells}`),
  countmin_counter_bytes: (r, label) => [`countmin_counter_bytes{${label}} ${r.counterBytes}`],
  countmin_window_seconds: (r, label) => [`countmin_window_seconds{${label}} ${r.windowSeconds}`],
  countmin_conservative: (r, label) => [`countmin_conservative{${label}} ${r.conservative ? 1 : 0}`],
};

export function writeExposition(readings: readonly SketchReading[], options: ExpositionOptions = {}): string {
  const lines: string[] = [];
  for (const metric of Object.keys(COUNTMIN_METRICS) as CountminMetric[]) {
    const { type, help } = COUNTMIN_METRICS[metric];
    // OpenMetrics names a counter's family without the `_total` its sample carries.
    const family = options.openMetrics && type === 'counter' ? metric.replace(/_total$/, '') : metric;
    lines.push(`# HELP ${family} ${help}`, `# TYPE ${family} ${type}`);
    for (const reading of readings) lines.push(...SAMPLES[metric](reading, `sketch="${escapeLabel(reading.sketch)}"`));
  }
  if (options.openMetrics) lines.push('# EOF');
  return `${lines.join('\n')}\n`;
}
