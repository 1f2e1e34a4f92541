import { describe, expect, it } from 'vitest';
import { createZipfSampler, mulberry32 } from '../../../backend/src/maths';

describe('seeded random source', () => {
  it('when the same seed is used twice, then the same numbers come out, and another seed differs', () => {
    const a = mulberry32(123);
    const b = mulberry32(123);
    const c = mulberry32(124);
    const first = Array.from({ length: 5 }, a);
    expect(Array.from({ length: 5 }, b)).toEqual(first);
    expect(Array.from({ length: 5 }, c)).not.toEqual(first);
  });

  it('when 100,000 numbers are drawn, then they lie in [0, 1) and fill ten bins evenly', () => {
    const random = mulberry32(2024);
    const bins = new Array(10).fill(0);
    let outside = 0;
    for (let i = 0; i < 100_000; i++) {
      const v = random();
      if (v >= 0 && v < 1) bins[Math.floor(v * 10)]++;
      else outside++;
    }
    expect(outside).toBe(0);
    // Pearson's χ² with 9 degrees of freedom: the 99.9 % point is 27.88 (standard χ² tables).
    const chiSquare = bins.reduce((sum, c) => sum + (c - 10_000) ** 2 / 10_000, 0);
    expect(chiSquare).toBeLessThan(27.88);
  });
});

describe('Zipf sampler', () => {
  it.each([0, 0.8, 1.1, 1.6])('when skew is %s, then rank frequencies follow (i + 1)^(−s) / H', (skew) => {
    const keys = 50;
    const draw = createZipfSampler(keys, skew, mulberry32(31));
    const counts = new Array(keys).fill(0);
    const draws = 200_000;
    for (let i = 0; i < draws; i++) counts[draw()]++;
    // Zipf's law over a finite set: P(i) = (i + 1)^(−s) / Σ_j (j + 1)^(−s), computed here directly.
    const weights = Array.from({ length: keys }, (_, i) => (i + 1) ** -skew);
    const total = weights.reduce((a, b) => a + b, 0);
    const chiSquare = counts.reduce((sum, c, i) => {
      const expected = (draws * weights[i]) / total;
      return sum + (c - expected) ** 2 / expected;
    }, 0);
    // χ² with 49 degrees of freedom: the 99.9 % point is 85.35 (standard χ² tables).
    expect(chiSquare).toBeLessThan(85.35);
  });

  it('when the key space is too large or the skew negative, then the error names the field', () => {
    expect(() => createZipfSampler(2 ** 21, 1, Math.random)).toThrow(/keyCount/);
    expect(() => createZipfSampler(10, -1, Math.random)).toThrow(/skew/);
  });
});
