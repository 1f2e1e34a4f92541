import { Counter, Gauge, register as defaultRegistry, type Registry, type RegistryContentType } from 'prom-client';

/** What the exporter reads from a service's sketch; Brimwatch's own CountMinSketch has all but the window. */
export interface SketchLike {
  readonly width: number;
  readonly depth: number;
  /** n: the sum of all increments since start (or since the window began), counted by the service itself. */
  readonly streamTotal: number;
  nonzeroCells(): readonly number[];
  readonly counterBytes: number;
  readonly windowSeconds?: number;
  readonly conservative?: boolean;
}

export interface SketchOptions {
  /** The reset period of a windowed sketch, when the sketch object does not carry it; 0 or absent for a cumulative one. */
  windowSeconds?: number;
}

export interface SketchExporter {
  /** Publishes a sketch under the `sketch` label Brimwatch is told to read. */
  add(label: string, sketch: SketchLike, options?: SketchOptions): void;
  remove(label: string): void;
}

/**
 * Publishes count-min sketches in Brimwatch's exposition on a prom-client
 * registry: the figures are read from the sketch at every scrape, so the
 * service keeps updating its sketch as it always did and serves
 * `registry.metrics()` on its metrics endpoint. One exporter per registry.
 */
export function sketchExporter(registry: Registry<RegistryContentType> = defaultRegistry): SketchExporter {
  const sketches = new Map<string, { sketch: SketchLike; windowSeconds: number }>();
  const each = (read: (s: SketchLike, windowSeconds: number) => number) =>
    function collect(this: Gauge<'sketch'>) {
      this.reset();
      for (const [label, { sketch, windowSeconds }] of sketches) this.set({ sketch: label }, read(sketch, windowSeconds));
    };
  const gauge = (name: string, help: string, read: (s: SketchLike, windowSeconds: number) => number) =>
    new Gauge({ name, help, labelNames: ['sketch'], registers: [registry], collect: each(read) });

  gauge('countmin_width', 'Counters per row (m).', (s) => s.width);
  gauge('countmin_depth', 'Rows, one hash function each (k).', (s) => s.depth);
  new Counter({
    name: 'countmin_stream_total',
    help: 'Sum of all increments since start or since the window began (n).',
    labelNames: ['sketch'],
    registers: [registry],
    collect() {
      // The service owns n; a windowed sketch's n falls at each window, which Brimwatch reads as a reset.
      this.reset();
      for (const [label, { sketch }] of sketches) this.inc({ sketch: label }, sketch.streamTotal);
    },
  });
  new Gauge({
    name: 'countmin_nonzero_cells',
    help: 'Non-zero counters in the row.',
    labelNames: ['sketch', 'row'],
    registers: [registry],
    collect() {
      this.reset();
      for (const [label, { sketch }] of sketches) sketch.nonzeroCells().forEach((cells, row) => this.set({ sketch: label, row: String(row) }, cells));
    },
  });
  gauge('countmin_counter_bytes', 'Bytes per counter.', (s) => s.counterBytes);
  gauge('countmin_window_seconds', 'Reset period in seconds; 0 for a cumulative sketch.', (_s, windowSeconds) => windowSeconds);
  gauge('countmin_conservative', '1 when updated conservatively.', (s) => (s.conservative ? 1 : 0));

  return {
    add(label, sketch, options = {}) {
      sketches.set(label, { sketch, windowSeconds: options.windowSeconds ?? sketch.windowSeconds ?? 0 });
    },
    remove(label) {
      sketches.delete(label);
    },
  };
}
