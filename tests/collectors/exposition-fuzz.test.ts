import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readSketch } from '../../collectors/exposition/read-sketch';
import { parseExposition } from '../../collectors/exposition/text-format';

const CONTENT_TYPES = [undefined, 'text/plain; version=0.0.4', 'application/openmetrics-text; version=1.0.0', 'application/json'];
const escape = (v: string) => v.replace(/\\/g, '\\\\').replace(/"/g, '\\"').replace(/\n/g, '\\n');

/** Strings built from the format's own characters reach deeper into the parser than random text. */
const expositionish = fc.array(
  fc.constantFrom('countmin_width', 'countmin_nonzero_cells', '{', '}', '="', '"', ',', ' ', '\n', '# TYPE ', '# EOF', 'sketch', 'row', '=', '\\', '1', '-', 'NaN', '+Inf', '.', 'e', '0', '#', '\t', '\r'),
  { maxLength: 60 },
).map((parts) => parts.join(''));

const sketchFigures = fc.record({
  width: fc.integer({ min: 1, max: 1_000_000 }),
  streamTotal: fc.oneof(fc.integer({ min: 0, max: Number.MAX_SAFE_INTEGER }), fc.double({ min: 0, max: 1e300, noNaN: true })),
  counterBytes: fc.constantFrom(1, 2, 4, 8),
  windowSeconds: fc.integer({ min: 0, max: 86_400 * 7 }),
  conservative: fc.boolean(),
  depth: fc.integer({ min: 1, max: 12 }),
  label: fc.string({ maxLength: 12 }),
  seed: fc.integer(),
});

describe('the exposition reader under fuzzing', () => {
  it('when given any text, content type and label, then it returns a sample or a reason and never throws', () => {
    fc.assert(
      fc.property(fc.oneof(fc.string({ maxLength: 400 }), expositionish), fc.constantFrom(...CONTENT_TYPES), fc.string({ maxLength: 8 }), (body, type, label) => {
        const read = readSketch(body, type, label);
        if (read.ok) {
          expect(read.value.nonzeroCells).toHaveLength(read.value.depth);
          expect(read.value.nonzeroCells.every((c) => c >= 0 && c <= read.value.width)).toBe(true);
          expect(Number.isFinite(read.value.streamTotal) && read.value.streamTotal >= 0).toBe(true);
        } else {
          expect(read.reason.length).toBeGreaterThan(10);
        }
      }),
      { numRuns: 3000 },
    );
  });

  it('when given any text, then the parser gives samples or a reason that starts with "parse error"', () => {
    fc.assert(
      fc.property(fc.oneof(fc.string({ maxLength: 400 }), expositionish), fc.boolean(), (body, openMetrics) => {
        const parsed = parseExposition(body, openMetrics ? 'openmetrics' : 'prometheus');
        if (!parsed.ok) expect(parsed.reason).toMatch(/^parse error/);
        else for (const s of parsed.samples) expect(typeof s.value).toBe('number');
      }),
      { numRuns: 3000 },
    );
  });

  it('when a valid sketch is written in any line order with any label text, then exactly its figures are read back', () => {
    fc.assert(
      fc.property(sketchFigures, fc.boolean(), (f, openMetrics) => {
        const cells = Array.from({ length: f.depth }, (_, row) => Math.abs((f.seed * (row + 7)) % (f.width + 1)));
        const sketch = `sketch="${escape(f.label)}"`;
        const lines = [
          `countmin_width{${sketch}} ${f.width}`,
          `countmin_depth{${sketch}} ${f.depth}`,
          `countmin_stream_total{pod="a",${sketch}} ${f.streamTotal}`,
          `countmin_counter_bytes{${sketch}} ${f.counterBytes}`,
          `countmin_window_seconds{${sketch}} ${f.windowSeconds}`,
          `countmin_conservative{${sketch}} ${f.conservative ? 1 : 0}`,
          ...cells.map((c, row) => `countmin_nonzero_cells{row="${row}", ${sketch}} ${c}`),
        ];
        const shuffled = lines.map((line, i) => ({ line, key: (f.seed ^ (i * 2654435761)) >>> 0 })).sort((a, b) => a.key - b.key).map((x) => x.line);
        const body = shuffled.join('\n') + (openMetrics ? '\n# EOF\n' : '\n');
        const read = readSketch(body, openMetrics ? 'application/openmetrics-text' : 'text/plain', f.label);
        expect(read).toEqual({
          ok: true,
          value: { width: f.width, depth: f.depth, streamTotal: f.streamTotal, nonzeroCells: cells, counterBytes: f.counterBytes, windowSeconds: f.windowSeconds, conservative: f.conservative },
        });
      }),
      { numRuns: 500 },
    );
  });

  it('when one line of a valid exposition is dropped, then the reading fails and names the missing metric', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 6 }), (drop) => {
        const lines = ['countmin_width{sketch="s"} 8', 'countmin_depth{sketch="s"} 1', 'countmin_stream_total{sketch="s"} 9', 'countmin_counter_bytes{sketch="s"} 4', 'countmin_window_seconds{sketch="s"} 0', 'countmin_conservative{sketch="s"} 0', 'countmin_nonzero_cells{sketch="s",row="0"} 3'];
        const missing = lines[drop].split('{')[0];
        const read = readSketch(lines.filter((_, i) => i !== drop).join('\n'), 'text/plain', 's');
        expect(read).toEqual({ ok: false, reason: `missing metric ${missing} for sketch="s"` });
      }),
    );
  });
});
