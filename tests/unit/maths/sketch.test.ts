import { describe, expect, it } from 'vitest';
import { CountMinSketch, SketchMathsError, createZipfSampler, mulberry32 } from '../../../backend/src/maths';

/** A skewed stream of `length` updates over `keys` keys, with its true counts. */
function zipfStream(length: number, keys: number, skew: number, seed: number) {
  const draw = createZipfSampler(keys, skew, mulberry32(seed));
  const names = Array.from({ length: keys }, (_, i) => `item-${i}`);
  const stream = Array.from({ length }, () => names[draw()]);
  const truth = new Map<string, number>();
  for (const key of stream) truth.set(key, (truth.get(key) ?? 0) + 1);
  return { stream, truth };
}

describe('CountMinSketch', () => {
  it('when a stream is counted, then no estimate is below the true count', () => {
    const { stream, truth } = zipfStream(20_000, 2_000, 1.1, 3);
    for (const conservative of [false, true]) {
      const sketch = new CountMinSketch({ width: 200, depth: 4, seed: 8, conservative });
      for (const key of stream) sketch.update(key);
      // Cormode & Muthukrishnan 2005 (and Estan & Varghese 2002 for conservative update): estimates only overcount.
      const under = [...truth].filter(([key, count]) => sketch.estimate(key) < count);
      expect(under).toEqual([]);
      expect(sketch.streamTotal).toBe(20_000);
    }
  });

  it('when the same stream is counted conservatively, then no estimate is above the standard one', () => {
    // Estan & Varghese, SIGCOMM 2002: conservative update never raises a counter beyond what the standard update would.
    const { stream, truth } = zipfStream(20_000, 2_000, 0.9, 4);
    const standard = new CountMinSketch({ width: 150, depth: 3, seed: 21 });
    const conservative = new CountMinSketch({ width: 150, depth: 3, seed: 21, conservative: true });
    for (const key of stream) {
      standard.update(key);
      conservative.update(key);
    }
    const keys = [...truth.keys()];
    expect(keys.filter((key) => conservative.estimate(key) > standard.estimate(key))).toEqual([]);
    expect(keys.filter((key) => conservative.estimate(key) < standard.estimate(key)).length).toBeGreaterThan(0);
  });

  it('when two halves of a stream are merged, then the counters equal one sketch of the whole stream', () => {
    const { stream } = zipfStream(5_000, 500, 1.2, 5);
    const whole = new CountMinSketch({ width: 97, depth: 5, seed: 13 });
    const first = new CountMinSketch({ width: 97, depth: 5, seed: 13 });
    const second = new CountMinSketch({ width: 97, depth: 5, seed: 13 });
    stream.forEach((key, i) => {
      whole.update(key, 2);
      (i % 2 ? first : second).update(key, 2);
    });
    first.merge(second);
    expect(first.counters).toEqual(whole.counters);
    expect(first.streamTotal).toBe(10_000);
  });

  it('when shapes or seeds differ, then merge refuses', () => {
    const a = new CountMinSketch({ width: 10, depth: 2, seed: 1 });
    expect(() => a.merge(new CountMinSketch({ width: 10, depth: 2, seed: 2 }))).toThrow(/same width, depth, seeds/);
    expect(() => a.merge(new CountMinSketch({ width: 11, depth: 2, seed: 1 }))).toThrow(SketchMathsError);
    expect(() => a.merge(new CountMinSketch({ width: 10, depth: 2, seed: 1, conservative: true }))).toThrow(SketchMathsError);
  });

  it('when explicit seeds are given, then the sketch uses them and a copy with the same seeds agrees', () => {
    const seeds = [
      { a: 48_271, b: 11 },
      { a: 16_807, b: 0 },
    ];
    const a = new CountMinSketch({ width: 31, depth: 2, seeds });
    const b = new CountMinSketch({ width: 31, depth: 2, seeds });
    a.update('x', 5);
    b.update('x', 5);
    expect(a.seeds).toEqual(seeds);
    expect(a.counters).toEqual(b.counters);
    expect(() => new CountMinSketch({ width: 31, depth: 2, seeds: [{ a: 0, b: 1 }, { a: 1, b: 1 }] })).toThrow(/seeds must hold 2 pairs/);
  });

  it('when a counter would pass 2^32 − 1, then it stops there instead of wrapping', () => {
    const sketch = new CountMinSketch({ width: 4, depth: 2, seed: 3 });
    sketch.update('heavy', 0xffffffff - 1);
    sketch.update('heavy', 10);
    expect(sketch.estimate('heavy')).toBe(0xffffffff);
    expect(sketch.streamTotal).toBe(0xffffffff + 9);
  });

  it('when non-zero cells are counted, then they match a scan of the counters, and a reset empties them', () => {
    const sketch = new CountMinSketch({ width: 50, depth: 3, seed: 6 });
    for (let i = 0; i < 40; i++) sketch.update(`k${i}`);
    const expected = [0, 1, 2].map((r) => sketch.counters.subarray(r * 50, (r + 1) * 50).filter((c) => c > 0).length);
    expect(sketch.nonzeroCells()).toEqual(expected);
    sketch.reset();
    expect(sketch.nonzeroCells()).toEqual([0, 0, 0]);
    expect(sketch.streamTotal).toBe(0);
  });

  it('when an update is negative or fractional, then it is refused', () => {
    const sketch = new CountMinSketch({ width: 4, depth: 2 });
    expect(() => sketch.update('x', -1)).toThrow(/non-negative updates/);
    expect(() => sketch.update('x', 0.5)).toThrow(SketchMathsError);
  });
});
