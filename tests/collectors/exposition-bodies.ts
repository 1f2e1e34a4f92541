import client from 'prom-client';

export interface Figures {
  width?: number;
  depth?: number;
  streamTotal?: number;
  counterBytes?: number;
  windowSeconds?: number;
  conservative?: number;
  /** Row label → non-zero cells. */
  nonzeroCells?: Record<string, number>;
}

export const GOOD: Required<Figures> = {
  width: 2719,
  depth: 4,
  streamTotal: 1_000_000,
  counterBytes: 4,
  windowSeconds: 0,
  conservative: 0,
  nonzeroCells: { '0': 2000, '1': 1990, '2': 2010, '3': 1985 },
};

/**
 * Writes figures for one sketch with prom-client, an independent producer of
 * both text dialects, so the parser is checked against what services really send.
 */
export async function promClientBody(figures: Figures, openMetrics: boolean, label = 'limiter'): Promise<{ body: string; contentType: string }> {
  const registry = new client.Registry<client.RegistryContentType>();
  if (openMetrics) registry.setContentType(client.Registry.OPENMETRICS_CONTENT_TYPE);
  const gauge = (name: string, value: number | undefined) => {
    if (value === undefined) return;
    new client.Gauge({ name, help: name, labelNames: ['sketch'], registers: [registry] }).set({ sketch: label }, value);
  };
  gauge('countmin_width', figures.width);
  gauge('countmin_depth', figures.depth);
  gauge('countmin_counter_bytes', figures.counterBytes);
  gauge('countmin_window_seconds', figures.windowSeconds);
  gauge('countmin_conservative', figures.conservative);
  if (figures.streamTotal !== undefined) {
    const counter = new client.Counter({ name: 'countmin_stream_total', help: 'n', labelNames: ['sketch'], registers: [registry] });
    counter.inc({ sketch: label }, figures.streamTotal);
  }
  if (figures.nonzeroCells) {
    const cells = new client.Gauge({ name: 'countmin_nonzero_cells', help: 'nz', labelNames: ['sketch', 'row'], registers: [registry] });
    for (const [row, value] of Object.entries(figures.nonzeroCells)) cells.set({ sketch: label, row }, value);
  }
  return { body: await registry.metrics(), contentType: registry.contentType };
}
