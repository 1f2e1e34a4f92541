import { describe, expect, it } from 'vitest';
import { SketchMathsError, formatBytes, formatCount, formatPercent, resizePlan } from '../../../backend/src/maths';

// A 272 × 5 sketch of 4-byte counters: C&M 2005 sizing for ε = δ = 0.01 (n₀ = 10,000, E = 100).
const current = { width: 272, depth: 5, counterBytes: 4, errorBudget: 100, confidence: 0.99 };

describe('resizePlan', () => {
  it('when the forecast outgrows the sketch, then the new size keeps the budget at the forecast plus headroom', () => {
    const result = resizePlan({ ...current, forecastTotal: 20_000, horizonDays: 90 });
    // By hand: target 20,000 · 1.25 = 25,000; ε = 100/25,000 = 0.004; e/0.004 = 679.57 → 680; ln 100 → 5.
    expect(result.targetTotal).toBe(25_000);
    expect([result.width, result.depth]).toEqual([680, 5]);
    // Memory: 272 · 5 · 4 = 5,440 before; 680 · 5 · 4 = 13,600 after; +8,160.
    expect(result.memoryBytesBefore).toBe(5_440);
    expect(result.memoryBytes).toBe(13_600);
    expect(result.memoryChangeBytes).toBe(8_160);
    // Capacity before: 272 · 100 · 0.01^0.2 = 10,828.5 (C&M bound with Markov over k rows).
    expect(result.capacityBefore).toBeCloseTo(10_828.5, 1);
    expect(result.capacity).toBeGreaterThanOrEqual(25_000);
    expect(result.resizeNeeded).toBe(true);
    // New capacity by hand: 680 · 100 · 0.398107 = 27,071.3.
    expect(result.reason).toBe(
      'The current capacity of 10,829 is below the forecast stream total of 20,000 in 90 days (25,000 with 25 % headroom). ' +
        'Width 680 and depth 5 (now 272 × 5) keep the error budget of 100 at 99 % confidence up to 27,071; ' +
        'memory goes from 5.31 KiB to 13.3 KiB (+7.97 KiB).',
    );
  });

  it('when the sketch already holds the forecast, then no resize is needed and the reason says so', () => {
    const result = resizePlan({ ...current, forecastTotal: 4_000, headroom: 1.5 });
    // 4,000 · 1.5 = 6,000 ≤ 10,828.5; plan for 6,000: e/(100/6,000) = 163.1 → 164.
    expect(result.resizeNeeded).toBe(false);
    expect(result.width).toBe(164);
    expect(result.memoryChangeBytes).toBeLessThan(0);
    expect(result.reason).toMatch(/already covers .* no resize needed\. The smallest sketch that would do is 164 × 5/);
  });

  it('when headroom is below 1, then the error asks for a factor of 1 or more', () => {
    expect(() => resizePlan({ ...current, forecastTotal: 10, headroom: 0.9 })).toThrow(SketchMathsError);
    expect(() => resizePlan({ ...current, forecastTotal: 10, headroom: 0.9 })).toThrow(/headroom must be a factor of 1 or more/);
  });
});

describe('formatting', () => {
  it('when numbers are written into sentences, then thousands are separated and memory is in binary units', () => {
    expect(formatCount(1234567.4)).toBe('1,234,567');
    expect(formatCount(0.0123456)).toBe('0.0123');
    expect(formatBytes(5_440)).toBe('5.31 KiB');
    expect(formatBytes(3 * 1024 ** 2)).toBe('3 MiB');
    expect(formatBytes(512)).toBe('512 bytes');
    expect(formatPercent(0.999)).toBe('99.9 %');
    expect(formatPercent(0.123456, 3)).toBe('12.3 %');
  });
});
