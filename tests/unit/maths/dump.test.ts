import { describe, expect, it } from 'vitest';
import { CountMinSketch, SketchMathsError, analyseDump, createDumpAccumulator, mulberry32 } from '../../../backend/src/maths';

const handMatrix = { width: 4, depth: 2, errorBudget: 5, confidence: 0.99, counters: [0, 5, 10, 1, 3, 3, 10, 0] };

describe('analyseDump', () => {
  it('when a 2 × 4 dump is analysed, then each figure matches the hand calculation', () => {
    const result = analyseDump(handMatrix);
    // Row 0 = [0, 5, 10, 1]: sum 16, mean 4, one zero of four, median (1 + 5)/2 = 3, cells ≥ 5: 2 of 4.
    expect(result.rows[0]).toMatchObject({ sum: 16, mean: 4, zeroFraction: 0.25, nonzeroCells: 3, median: 3, shareAtOrAboveBudget: 0.5 });
    // Row 1 = [3, 3, 10, 0]: sum 16, median (3 + 3)/2 = 3, cells ≥ 5: 1 of 4.
    expect(result.rows[1]).toMatchObject({ sum: 16, median: 3, shareAtOrAboveBudget: 0.25 });
    // Empirical miss risk (product of shares, after Ting, KDD 2018): 0.5 · 0.25 = 0.125.
    expect(result.empiricalMissRisk).toBe(0.125);
    // Markov: (n/(m·E))^k = (16/20)^2 = 0.64.
    expect(result.markovMissRisk).toBeCloseTo(0.64, 12);
    // Linear counting (Whang et al. 1990), pooled: V̄ = 2/8, D̂ = −4 · ln 0.25 = 5.545.
    expect(result.distinct.saturated === false && result.distinct.distinctEstimate).toBeCloseTo(5.5452, 4);
    expect(result).toMatchObject({ rowSumsAgree: true, streamTotal: 16, streamTotalSource: 'largest row sum' });
    // 4 · 5 · 0.01^(1/2) = 2 is the capacity, so 16 is far past it.
    expect(result.level).toBe('brimmed');
    expect(result.verdict).toMatch(/^Brimmed: .*load 800 % of a capacity of 2\)\. Empirical miss risk at an error budget of 5: 12\.5 %; Markov figure 64 %\./);
  });

  it('when a real sketch is dumped, then every row sums to its stream total and the mean is n/m', () => {
    const sketch = new CountMinSketch({ width: 500, depth: 4, seed: 11 });
    for (let i = 0; i < 3_000; i++) sketch.update(`order-${i % 700}`, 1 + (i % 3));
    const result = analyseDump({ width: 500, depth: 4, errorBudget: 50, confidence: 0.99, counters: sketch.counters });
    // DESIGN.md: under the standard update each row's mean is exactly n/m.
    for (const row of result.rows) {
      expect(row.sum).toBe(sketch.streamTotal);
      expect(row.mean).toBe(sketch.streamTotal / 500);
      expect(row.nonzeroCells).toBe(sketch.nonzeroCells()[row.row]);
    }
    expect(result.empiricalMissRisk).toBeLessThanOrEqual(result.markovMissRisk);
  });

  it('when the sketch was updated conservatively, then row sums fall short of n and the verdict asks for the service total', () => {
    const sketch = new CountMinSketch({ width: 64, depth: 3, seed: 5, conservative: true });
    for (let i = 0; i < 2_000; i++) sketch.update(`user-${i % 300}`);
    const result = analyseDump({ width: 64, depth: 3, errorBudget: 40, confidence: 0.99, counters: sketch.counters });
    for (const row of result.rows) expect(row.sum).toBeLessThan(sketch.streamTotal);
    expect(result.verdict).toMatch(/give the service's own total/);
    const given = analyseDump({ width: 64, depth: 3, errorBudget: 40, confidence: 0.99, counters: sketch.counters, streamTotal: sketch.streamTotal });
    expect(given).toMatchObject({ streamTotal: 2_000, streamTotalSource: 'given' });
  });

  it('when a dump is streamed in uneven chunks, then the result equals the whole-matrix analysis', () => {
    const random = mulberry32(2018);
    const counters = Uint32Array.from({ length: 7 * 333 }, () => (random() < 0.4 ? 0 : Math.floor(random() * 90)));
    const whole = analyseDump({ width: 333, depth: 7, errorBudget: 60, confidence: 0.999, counters });
    const accumulator = createDumpAccumulator({ width: 333, depth: 7, errorBudget: 60, confidence: 0.999 });
    for (let at = 0; at < counters.length; at += 250) accumulator.push(Array.from(counters.subarray(at, at + 250)));
    expect(accumulator.finish()).toEqual(whole);
  });

  it('when counters come as doubles, 64-bit integers or plain numbers, then the analysis is the same', () => {
    const big = 2 ** 40;
    const values = [0, big, 7, 3, big, 1];
    const base = { width: 3, depth: 2, errorBudget: 5, confidence: 0.9 };
    const asDoubles = analyseDump({ ...base, counters: Float64Array.from(values) });
    expect(analyseDump({ ...base, counters: BigUint64Array.from(values.map(BigInt)) })).toEqual(asDoubles);
    expect(analyseDump({ ...base, counters: values })).toEqual(asDoubles);
    // Row 0 = [0, 2^40, 7]: median 7, no truncation to 32 bits.
    expect(asDoubles.rows[0].median).toBe(7);
    expect(asDoubles.rows[0].sum).toBe(big + 7);
  });

  it('when every cell of a row is non-zero, then its distinct estimate is saturated and the verdict says so', () => {
    const result = analyseDump({ width: 3, depth: 2, errorBudget: 100, confidence: 0.9, counters: [1, 2, 3, 0, 4, 5] });
    expect(result.rows[0].occupancy.saturated).toBe(true);
    expect(result.verdict).toMatch(/1 of 2 rows have no zero cell left/);
  });

  it('when the dump is the wrong size or holds a bad counter, then the error says where and what to check', () => {
    const base = { width: 3, depth: 2, errorBudget: 5, confidence: 0.9 };
    expect(() => analyseDump({ ...base, counters: [1, 2, 3] })).toThrow(/holds 3 counters but width × depth = 6/);
    expect(() => analyseDump({ ...base, counters: [1, 2, 3, 4, 5, 6, 7] })).toThrow(/more than width × depth = 6/);
    expect(() => analyseDump({ ...base, counters: [1, 2, 3, 4, -5, 6] })).toThrow(/row 1, column 1 is -5/);
    expect(() => analyseDump({ ...base, counters: [1, 2, 3, 4, 5.5, 6] })).toThrow(SketchMathsError);
    expect(() => analyseDump({ ...base, counters: [1, Number.NaN, 3, 4, 5, 6] })).toThrow(/row 0, column 1/);
    expect(() => analyseDump({ ...base, width: 0, counters: [] })).toThrow(/width/);
  });

  it('when a finished dump is pushed to again, then it refuses', () => {
    const accumulator = createDumpAccumulator({ width: 1, depth: 1, errorBudget: 1, confidence: 0.5 });
    accumulator.push([4]);
    accumulator.finish();
    expect(() => accumulator.push([1])).toThrow(/already finished/);
  });
});
