import { describe, expect, it } from 'vitest';
import { SketchMathsError, ceilIgnoringNoise, plan } from '../../../backend/src/maths';

function errorOf(run: () => unknown): SketchMathsError {
  try {
    run();
  } catch (error) {
    if (error instanceof SketchMathsError) return error;
    throw error;
  }
  throw new Error('expected a SketchMathsError');
}

describe('plan', () => {
  it('when ε = 0.01 and δ = 0.01, then the sketch is 272 wide and 5 deep', () => {
    // Cormode & Muthukrishnan, J. Algorithms 55(1) 2005: w = ⌈e/ε⌉ = ⌈271.83⌉ = 272, d = ⌈ln(1/δ)⌉ = ⌈ln 100 = 4.605⌉ = 5.
    const result = plan({ sizedTotal: 10_000, errorBudget: 100, confidence: 0.99 });
    expect(result.width).toBe(272);
    expect(result.depth).toBe(5);
    expect(result.epsilon).toBe(0.01);
    expect(result.delta).toBeCloseTo(0.01, 15);
    // Memory by hand: 272 · 5 · 4 bytes = 5,440.
    expect(result.memoryBytes).toBe(5440);
    // Capacity by hand: m·E·δ^(1/k) = 272 · 100 · 0.01^0.2 = 27,200 · 0.398107 = 10,828.5.
    expect(result.capacity).toBeCloseTo(10_828.515, 2);
  });

  it('when n₀ = 1,000,000, E = 1,000 and confidence 99.9 %, then 2,719 × 7', () => {
    // By hand from C&M 2005: ε = 1,000/1,000,000 = 0.001; e/ε = 2,718.28 → 2,719; ln(1/0.001) = 6.9078 → 7.
    const result = plan({ sizedTotal: 1_000_000, errorBudget: 1_000, confidence: 0.999 });
    expect([result.width, result.depth]).toEqual([2719, 7]);
    // 2,719 · 7 · 4 = 76,132 bytes.
    expect(result.memoryBytes).toBe(76_132);
    // 2,719 · 1,000 · 0.001^(1/7) = 2,719,000 · e^(−0.98682) = 2,719,000 · 0.372759 = 1,013,532.7.
    expect(result.capacity).toBeCloseTo(1_013_532.73, 1);
  });

  it('when n₀ = 10⁸, E = 25,000, confidence 90 % and 8-byte counters, then 10,874 × 3 and 260,976 bytes', () => {
    // By hand: ε = 2.5·10⁻⁴; e/ε = 10,873.13 → 10,874; ln 10 = 2.3026 → 3; memory 10,874 · 3 · 8 = 260,976.
    const result = plan({ sizedTotal: 1e8, errorBudget: 25_000, confidence: 0.9, counterBytes: 8 });
    expect([result.width, result.depth, result.memoryBytes]).toEqual([10_874, 3, 260_976]);
  });

  it('when confidence is 95 %, then ln 20 = 2.996 gives depth 3', () => {
    // By hand from C&M 2005: ⌈ln(1/0.05)⌉ = ⌈2.9957⌉ = 3.
    expect(plan({ sizedTotal: 1000, errorBudget: 10, confidence: 0.95 }).depth).toBe(3);
  });

  it('when the budget exceeds the total and confidence is 50 %, then a single counter in a single row', () => {
    // By hand: ε = 300/100 = 3; e/3 = 0.906 → 1; ln 2 = 0.693 → 1.
    const result = plan({ sizedTotal: 100, errorBudget: 300, confidence: 0.5 });
    expect([result.width, result.depth]).toEqual([1, 1]);
  });

  it('when δ is exactly e⁻⁷ or e⁻⁹, then float noise in ln(1/δ) does not add a row', () => {
    // ln(1/e⁻⁷) = 7 in real arithmetic, but with doubles 1 − (1 − e⁻⁷) gives ln(1/δ) = 7.000000000000047
    // and e⁻⁹ gives 9.000000000000245: a plain ceil would answer 8 and 10.
    expect(Math.ceil(Math.log(1 / (1 - (1 - Math.exp(-7)))))).toBe(8);
    expect(plan({ sizedTotal: 1000, errorBudget: 10, confidence: 1 - Math.exp(-7) }).depth).toBe(7);
    expect(plan({ sizedTotal: 1000, errorBudget: 10, confidence: 1 - Math.exp(-9) }).depth).toBe(9);
  });

  it('when counterBytes is left out, then counters are 4 bytes', () => {
    const result = plan({ sizedTotal: 1000, errorBudget: 10, confidence: 0.99 });
    expect(result.memoryBytes).toBe(result.width * result.depth * 4);
  });

  it.each([
    ['sizedTotal', { sizedTotal: 0, errorBudget: 1, confidence: 0.99 }],
    ['sizedTotal', { sizedTotal: -5, errorBudget: 1, confidence: 0.99 }],
    ['sizedTotal', { sizedTotal: Number.NaN, errorBudget: 1, confidence: 0.99 }],
    ['errorBudget', { sizedTotal: 100, errorBudget: Number.POSITIVE_INFINITY, confidence: 0.99 }],
    ['errorBudget', { sizedTotal: 100, errorBudget: 0, confidence: 0.99 }],
    ['confidence', { sizedTotal: 100, errorBudget: 1, confidence: 1 }],
    ['confidence', { sizedTotal: 100, errorBudget: 1, confidence: 0 }],
    ['confidence', { sizedTotal: 100, errorBudget: 1, confidence: 99 }],
    ['counterBytes', { sizedTotal: 100, errorBudget: 1, confidence: 0.99, counterBytes: 3 }],
  ])('when %s is out of range, then the error names that field', (field, input) => {
    const error = errorOf(() => plan(input));
    expect(error.field).toBe(field);
    expect(error.message).toContain(field);
  });

  it('when the width would pass 2^31 counters, then an "absurd size" error asks for a larger budget', () => {
    // e · 10¹⁵ / 1 ≈ 2.7·10¹⁵ counters per row.
    const error = errorOf(() => plan({ sizedTotal: 1e15, errorBudget: 1, confidence: 0.99 }));
    expect(error.field).toBe('errorBudget');
    expect(error.message).toMatch(/absurd size.*raise errorBudget/);
  });

  it('when the memory would pass 64 GiB, then an "absurd size" error', () => {
    // ⌈e · 4·10⁸⌉ = 1,087,312,731 per row (under 2^31), ⌈ln 10⁹⌉ = 21 rows, · 4 bytes ≈ 9.1·10¹⁰ > 2^36.
    const error = errorOf(() => plan({ sizedTotal: 4e8, errorBudget: 1, confidence: 1 - 1e-9 }));
    expect(error.message).toMatch(/absurd size.*64 GiB/);
  });
});

describe('ceilIgnoringNoise', () => {
  it('when a value is a whole number plus float noise, then it is that whole number', () => {
    expect(ceilIgnoringNoise(4.0000000001)).toBe(4);
    // The double just below 272 (one unit in the last place there is 2^-44).
    expect(ceilIgnoringNoise(272 - 2 ** -44)).toBe(272);
  });

  it('when a value is meaningfully above a whole number, then it rounds up', () => {
    expect(ceilIgnoringNoise(4.000001)).toBe(5);
    // C&M 2005 sizing: e/0.01 = 271.83 → 272, ln 100 = 4.605 → 5.
    expect(ceilIgnoringNoise(Math.E / 0.01)).toBe(272);
    expect(ceilIgnoringNoise(Math.log(100))).toBe(5);
  });

  it('when the width is near the 2^31 limit, then the tolerance stays under one counter', () => {
    expect(ceilIgnoringNoise(2 ** 31 - 1 + 0.5)).toBe(2 ** 31);
  });
});
