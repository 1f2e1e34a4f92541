import { Registry, type RegistryContentType } from 'prom-client';
import { describe, expect, it } from 'vitest';
import { sketchExporter } from '../../collectors/exporter';
import { readSketch } from '../../collectors/exposition/read-sketch';
import { CountMinSketch } from '../../backend/src/maths/sketch';
import { createZipfSampler, mulberry32 } from '../../backend/src/maths/random';

/** A real sketch fed a seeded skewed stream, so the figures are not ones we typed. */
function fedSketch(options: { width: number; depth: number; conservative?: boolean; updates: number; seed: number }): CountMinSketch {
  const sketch = new CountMinSketch({ width: options.width, depth: options.depth, conservative: options.conservative, seed: options.seed });
  const random = mulberry32(options.seed);
  const nextKey = createZipfSampler(5000, 1.1, random);
  for (let i = 0; i < options.updates; i++) sketch.update(`shopper-${nextKey()}`, 1 + Math.floor(random() * 3));
  return sketch;
}

/** Non-zero counters per row, counted here straight from the counter array rather than through the sketch's own method. */
function countNonzero(sketch: CountMinSketch): number[] {
  return Array.from({ length: sketch.depth }, (_, r) => sketch.counters.subarray(r * sketch.width, (r + 1) * sketch.width).filter((c) => c > 0).length);
}

const CONTENT_TYPES = [Registry.PROMETHEUS_CONTENT_TYPE, Registry.OPENMETRICS_CONTENT_TYPE] as const;

describe('the exporter for services', () => {
  for (const contentType of CONTENT_TYPES) {
    it(`when a prom-client registry (${contentType.split(';')[0]}) publishes a sketch, then the collector's parser reads back its exact figures`, async () => {
      const registry = new Registry<RegistryContentType>();
      registry.setContentType(contentType);
      const sketch = fedSketch({ width: 272, depth: 5, updates: 20_000, seed: 7 });
      sketchExporter(registry).add('per-card-limiter', sketch);

      const read = readSketch(await registry.metrics(), registry.contentType, 'per-card-limiter');

      expect(read).toEqual({
        ok: true,
        value: {
          width: 272,
          depth: 5,
          streamTotal: sketch.streamTotal,
          nonzeroCells: countNonzero(sketch),
          counterBytes: 4,
          windowSeconds: 0,
          conservative: false,
        },
      });
      expect(sketch.streamTotal).toBeGreaterThan(20_000);
    });
  }

  it('when several sketches share a registry, then each is read under its own label with its own window and update rule', async () => {
    const registry = new Registry<RegistryContentType>();
    registry.setContentType(Registry.OPENMETRICS_CONTENT_TYPE);
    const exporter = sketchExporter(registry);
    const cap = fedSketch({ width: 100, depth: 4, conservative: true, updates: 3000, seed: 11 });
    const quota = fedSketch({ width: 544, depth: 3, updates: 9000, seed: 12 });
    exporter.add('frequency-cap', cap, { windowSeconds: 3600 });
    exporter.add('per-key-quota', quota);
    const body = await registry.metrics();

    const capRead = readSketch(body, registry.contentType, 'frequency-cap');
    const quotaRead = readSketch(body, registry.contentType, 'per-key-quota');
    expect(capRead.ok && capRead.value).toMatchObject({ width: 100, depth: 4, windowSeconds: 3600, conservative: true, streamTotal: cap.streamTotal });
    expect(quotaRead.ok && quotaRead.value).toMatchObject({ width: 544, depth: 3, windowSeconds: 0, conservative: false, streamTotal: quota.streamTotal });
  });

  it('when a windowed sketch starts a new window, then the next scrape shows the lower stream total, not the old one', async () => {
    const registry = new Registry();
    const sketch = fedSketch({ width: 64, depth: 3, updates: 500, seed: 3 });
    sketchExporter(registry).add('hourly-screen', sketch, { windowSeconds: 3600 });
    const before = readSketch(await registry.metrics(), registry.contentType, 'hourly-screen');
    sketch.reset();
    sketch.update('fresh-key', 2);
    const after = readSketch(await registry.metrics(), registry.contentType, 'hourly-screen');

    expect(before.ok && before.value.streamTotal).toBeGreaterThan(500);
    expect(after).toMatchObject({ ok: true, value: { streamTotal: 2, nonzeroCells: [1, 1, 1] } });
  });

  it('when a sketch is removed, then the collector is told that it is missing', async () => {
    const registry = new Registry();
    const exporter = sketchExporter(registry);
    exporter.add('gone-soon', fedSketch({ width: 32, depth: 2, updates: 50, seed: 5 }));
    exporter.remove('gone-soon');
    const read = readSketch(await registry.metrics(), registry.contentType, 'gone-soon');
    expect(read).toMatchObject({ ok: false, reason: expect.stringContaining('sketch="gone-soon"') });
  });
});
