import { describe, expect, it } from 'vitest';
import { SketchMathsError, combinedOccupancy, distinctFromNonzeroCells, distinctFromZeroFraction, mulberry32 } from '../../../backend/src/maths';

function estimateOf(result: ReturnType<typeof distinctFromZeroFraction>) {
  if (result.saturated) throw new Error('expected an unsaturated estimate');
  return result;
}

/** Throws `keys` distinct keys into `width` cells uniformly at random and returns the zero fraction. */
function simulatedZeroFraction(width: number, keys: number, random: () => number): number {
  const cells = new Uint8Array(width);
  for (let i = 0; i < keys; i++) cells[Math.floor(random() * width)] = 1;
  let zeros = 0;
  for (const cell of cells) if (cell === 0) zeros++;
  return zeros / width;
}

function meanAndSd(values: number[]): [number, number] {
  const mean = values.reduce((a, b) => a + b, 0) / values.length;
  const variance = values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1);
  return [mean, Math.sqrt(variance)];
}

describe('linear counting', () => {
  it('when half the cells of 1,000 are zero, then the estimate and its standard error match the hand calculation', () => {
    const result = estimateOf(distinctFromZeroFraction(0.5, 1_000));
    // Whang, Vander-Zanden & Taylor, ACM TODS 15(2) 1990: D̂ = −m·ln V = 1,000 · ln 2 = 693.147.
    expect(result.distinctEstimate).toBeCloseTo(693.147, 3);
    // Same paper: StdErr(D̂) = √(m·(e^t − t − 1)), t = ln 2: √(1,000 · (2 − 0.693147 − 1)) = √306.853 = 17.517.
    expect(result.standardError).toBeCloseTo(17.5172, 3);
    expect(result.loadFactor).toBeCloseTo(Math.LN2, 12);
  });

  it('when counted from non-zero cells, then the estimate is the same as from the zero fraction', () => {
    // 4 cells, 3 non-zero: V = 0.25, D̂ = −4 · ln 0.25 = 5.545 (by hand).
    expect(estimateOf(distinctFromNonzeroCells(3, 4)).distinctEstimate).toBeCloseTo(5.5452, 4);
  });

  it('when no cell is zero, then the row is reported saturated instead of a number', () => {
    expect(distinctFromZeroFraction(0, 1_000)).toEqual({ saturated: true, zeroFraction: 0 });
    expect(distinctFromNonzeroCells(64, 64).saturated).toBe(true);
  });

  it('when every cell is zero, then the estimate is 0 with no spread', () => {
    const result = estimateOf(distinctFromNonzeroCells(0, 100));
    expect(result.distinctEstimate).toBe(0);
    expect(result.standardError).toBe(0);
  });

  it('when rows are pooled, then the estimate is unchanged and the standard error shrinks by √k', () => {
    const pooled = estimateOf(combinedOccupancy([500, 500], 1_000));
    // Two independent rows of the same keys: variance halves, 17.517/√2 = 12.387 (by hand).
    expect(pooled.distinctEstimate).toBeCloseTo(693.147, 3);
    expect(pooled.standardError).toBeCloseTo(12.3865, 3);
  });

  it('when one row of several is saturated, then the pooled estimate still uses the other rows', () => {
    const pooled = estimateOf(combinedOccupancy([1_000, 500, 500], 1_000));
    // Zero cells 0 + 500 + 500 of 3,000: V̄ = 1/3, D̂ = 1,000 · ln 3 = 1,098.6 (by hand).
    expect(pooled.distinctEstimate).toBeCloseTo(1_098.612, 2);
    expect(combinedOccupancy([1_000, 1_000], 1_000).saturated).toBe(true);
  });

  it('when keys are thrown at random into 1,000 cells, then mean and spread match the paper at t = 1 and t = 3', () => {
    const random = mulberry32(1990);
    for (const keys of [1_000, 3_000]) {
      const estimates: number[] = [];
      const zeroFractions: number[] = [];
      for (let trial = 0; trial < 400; trial++) {
        const v = simulatedZeroFraction(1_000, keys, random);
        zeroFractions.push(v);
        estimates.push(estimateOf(distinctFromZeroFraction(v, 1_000)).distinctEstimate);
      }
      const t = keys / 1_000;
      // Whang et al. 1990: E[V] = (1 − 1/m)^n exactly (0.367695 at t = 1, 0.049563 at t = 3, by hand).
      expect(meanAndSd(zeroFractions)[0]).toBeCloseTo((1 - 1 / 1_000) ** keys, 2);
      // Same paper: StdErr(D̂) = √(m·(e^t − t − 1)) = 26.80 at t = 1, 126.83 at t = 3 (by hand).
      const published = Math.sqrt(1_000 * (Math.exp(t) - t - 1));
      const [mean, sd] = meanAndSd(estimates);
      // Same paper: bias E[D̂] − D ≈ (e^t − t − 1)/2, under 9 here; allow 3 standard errors of a 400-trial mean.
      expect(Math.abs(mean - keys - (Math.exp(t) - t - 1) / 2)).toBeLessThan((3 * published) / Math.sqrt(400));
      // The sample SD of 400 trials is within ±15 % of the true SD with overwhelming probability (~4 of its SEs).
      expect(sd / published).toBeGreaterThan(0.85);
      expect(sd / published).toBeLessThan(1.15);
      // The formula evaluated at the estimate itself stays close to the one at the true load factor.
      expect(estimateOf(distinctFromZeroFraction(meanAndSd(zeroFractions)[0], 1_000)).standardError / published).toBeCloseTo(1, 1);
    }
  });

  it('when the inputs are impossible, then the error names the field', () => {
    expect(() => distinctFromZeroFraction(1.5, 10)).toThrow(SketchMathsError);
    expect(() => distinctFromNonzeroCells(11, 10)).toThrow(/nonzeroCells/);
    expect(() => combinedOccupancy([], 10)).toThrow(/one count per row/);
  });
});
