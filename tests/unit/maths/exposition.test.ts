import client from 'prom-client';
import { describe, expect, it } from 'vitest';
import { COUNTMIN_METRICS, CountMinSketch, EXPOSITION_CONTENT_TYPES, writeExposition, type CountminMetric, type SketchReading } from '../../../backend/src/maths';

const readings: SketchReading[] = [
  { sketch: 'checkout-limiter', width: 2719, depth: 5, streamTotal: 123_456, nonzeroCells: [10, 11, 12, 13, 14], counterBytes: 4, windowSeconds: 0, conservative: false },
  { sketch: 'odd "name"\\with\nbreak', width: 64, depth: 2, streamTotal: 0, nonzeroCells: [0, 0], counterBytes: 8, windowSeconds: 300, conservative: true },
];

/** The same readings written by prom-client, an independent writer of both formats. */
async function promClientText(openMetrics: boolean): Promise<string> {
  const registry = new client.Registry<client.RegistryContentType>();
  if (openMetrics) registry.setContentType(client.Registry.OPENMETRICS_CONTENT_TYPE);
  const values: Record<CountminMetric, (r: SketchReading) => number> = {
    countmin_width: (r) => r.width,
    countmin_depth: (r) => r.depth,
    countmin_stream_total: (r) => r.streamTotal,
    countmin_nonzero_cells: () => 0,
    countmin_counter_bytes: (r) => r.counterBytes,
    countmin_window_seconds: (r) => r.windowSeconds,
    countmin_conservative: (r) => (r.conservative ? 1 : 0),
  };
  for (const name of Object.keys(COUNTMIN_METRICS) as CountminMetric[]) {
    const { type, help } = COUNTMIN_METRICS[name];
    if (name === 'countmin_nonzero_cells') {
      const gauge = new client.Gauge({ name, help, labelNames: ['sketch', 'row'], registers: [registry] });
      for (const r of readings) r.nonzeroCells.forEach((cells, row) => gauge.set({ sketch: r.sketch, row: String(row) }, cells));
    } else if (type === 'counter') {
      const counter = new client.Counter({ name, help, labelNames: ['sketch'], registers: [registry] });
      for (const r of readings) counter.inc({ sketch: r.sketch }, values[name](r));
    } else {
      const gauge = new client.Gauge({ name, help, labelNames: ['sketch'], registers: [registry] });
      for (const r of readings) gauge.set({ sketch: r.sketch }, values[name](r));
    }
  }
  expect(registry.contentType).toBe(openMetrics ? EXPOSITION_CONTENT_TYPES.openMetrics : EXPOSITION_CONTENT_TYPES.prometheus);
  return registry.metrics();
}

const lines = (text: string) => text.split('\n').filter((line) => line !== '');

describe('writeExposition', () => {
  it('when written in the Prometheus text format, then it matches prom-client line for line', async () => {
    expect(lines(writeExposition(readings))).toEqual(lines(await promClientText(false)));
  });

  it('when written as OpenMetrics, then the counter family drops _total, the body ends with # EOF, and prom-client agrees', async () => {
    const text = writeExposition(readings, { openMetrics: true });
    expect(text).toContain('# TYPE countmin_stream counter\n');
    expect(text).toContain('countmin_stream_total{sketch="checkout-limiter"} 123456\n');
    expect(text.endsWith('# EOF\n')).toBe(true);
    expect(lines(text)).toEqual(lines(await promClientText(true)));
  });

  it('when a sketch label holds quotes, backslashes or line breaks, then they are escaped', () => {
    expect(writeExposition(readings)).toContain('countmin_width{sketch="odd \\"name\\"\\\\with\\nbreak"} 64');
  });

  it('when a live sketch writes itself out, then its figures appear under its label', () => {
    const sketch = new CountMinSketch({ width: 8, depth: 2, seed: 4, conservative: true });
    sketch.update('a', 3);
    const text = sketch.toExposition('search-top', { windowSeconds: 60 });
    expect(text).toContain('countmin_stream_total{sketch="search-top"} 3');
    expect(text).toContain('countmin_nonzero_cells{sketch="search-top",row="1"} 1');
    expect(text).toContain('countmin_window_seconds{sketch="search-top"} 60');
    expect(text).toContain('countmin_conservative{sketch="search-top"} 1');
    expect(text).toContain('countmin_counter_bytes{sketch="search-top"} 4');
  });
});
