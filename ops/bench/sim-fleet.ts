import { writeExposition, EXPOSITION_CONTENT_TYPES, type SketchReading } from '../../backend/src/maths';

/**
 * The simulated fleet's figures, shared by the server that answers and the
 * loader that registers the same targets: every target is one instance of a
 * sketch of 8 rows, served on a page that also carries two other sketches of
 * its service, as a real service's metrics page would.
 */
export const INSTANCES_PER_SKETCH = 5;
export const SKETCH_WIDTH = 16_384;
export const SKETCH_DEPTH = 8;
export const ERROR_BUDGET = 2_000;
export const CONFIDENCE = 0.99;
/** Growth of every target's stream total per scrape. */
export const GROWTH_PER_SCRAPE = 500;

const KINDS = ['per-card-limiter', 'heavy-queries', 'ad-frequency-cap', 'signup-abuse', 'per-key-quota'];

export const sketchOfTarget = (target: number) => Math.floor(target / INSTANCES_PER_SKETCH);
export const sketchName = (sketch: number) => `${KINDS[sketch % KINDS.length]}-${sketch}`;

/** The stream total a target starts from: most sketches well inside capacity, one in fifty near or over it. */
export function baseTotal(target: number): number {
  const sketch = sketchOfTarget(target);
  if (sketch % 50 === 0) return 1.6e7 + (target % INSTANCES_PER_SKETCH) * 1e6;
  return 1e6 * (1 + (sketch % 97) / 10) + (target % INSTANCES_PER_SKETCH) * 10_000;
}

/** Non-zero cells per row for a stream of this total, as linear counting expects them (one key per 50 increments). */
function nonzeroCells(total: number, width: number, depth: number, salt: number): number[] {
  const distinct = total / 50;
  const expected = width * (1 - Math.exp(-distinct / width));
  return Array.from({ length: depth }, (_, row) => Math.min(width, Math.max(0, Math.round(expected - 3 + ((salt + row * 7) % 7)))));
}

function reading(sketch: string, total: number, salt: number): SketchReading {
  return {
    sketch,
    width: SKETCH_WIDTH,
    depth: SKETCH_DEPTH,
    streamTotal: total,
    nonzeroCells: nonzeroCells(total, SKETCH_WIDTH, SKETCH_DEPTH, salt),
    counterBytes: 4,
    windowSeconds: 0,
    conservative: salt % 3 === 0,
  };
}

/** The page target `target` serves on its `scrape`-th request. */
export function targetPage(target: number, scrape: number): { body: string; contentType: string } {
  const total = baseTotal(target) + scrape * GROWTH_PER_SCRAPE;
  const name = sketchName(sketchOfTarget(target));
  const readings = [reading(name, total, target), reading(`${name}-companion-a`, total / 3, target + 1), reading(`${name}-companion-b`, total / 7, target + 2)];
  const openMetrics = target % 2 === 0;
  return {
    body: writeExposition(readings, { openMetrics }),
    contentType: openMetrics ? EXPOSITION_CONTENT_TYPES.openMetrics : EXPOSITION_CONTENT_TYPES.prometheus,
  };
}
