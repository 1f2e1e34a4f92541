import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { SEN_INTERVAL_Z, atRank, mulberry32, theilSen, thinEvenly } from '../../../backend/src/maths';

/** Every pairwise slope, sorted: the brute-force definition of Theil (1950) and Sen (1968). */
function bruteForceSlopes(xs: number[], ys: number[]): number[] {
  const slopes: number[] = [];
  for (let i = 0; i < xs.length; i++) {
    for (let j = i + 1; j < xs.length; j++) if (xs[j] !== xs[i]) slopes.push((ys[j] - ys[i]) / (xs[j] - xs[i]));
  }
  return slopes.sort((a, b) => a - b);
}

function bruteForceMedian(sorted: number[]): number {
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

function fitOf(xs: number[], ys: number[]) {
  const fit = theilSen(xs, ys);
  if (fit === null) throw new Error('expected a fit');
  return fit;
}

describe('Theil–Sen slope', () => {
  it('when one point of five is wild, then the slope ignores it and the interval spans it (hand-computed)', () => {
    // Slopes by hand: six pairs among (0,0)…(3,3) give 1; pairs with (4,40) give 40/4 = 10, 39/3 = 13, 38/2 = 19, 37/1 = 37.
    // Sorted: 1,1,1,1,1,1,10,13,19,37 → median 1 (Theil 1950).
    const fit = fitOf([0, 1, 2, 3, 4], [0, 1, 2, 3, 40]);
    expect(fit.slope).toBe(1);
    // Sen 1968 with n = 5: Var(S) = 5·4·15/18 = 16.667; C = 1.96 · 4.0825 = 8.0015; N = 10;
    // M1 = (10 − 8.0015)/2 = 0.999 → rank 1; M2 + 1 = 9.0008 + 1 → rank 10 (clamped): [1, 37].
    expect(fit.slopeLow).toBe(1);
    expect(fit.slopeHigh).toBe(37);
    // Intercept: median of y − x = 0,0,0,0,36 → 0.
    expect(fit.intercept).toBe(0);
  });

  it('when ten points are fitted, then Sen\'s limits sit at the hand-computed fractional ranks', () => {
    const xs = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9];
    const ys = [0, 3, 4, 9, 10, 15, 15, 21, 24, 26];
    const sorted = bruteForceSlopes(xs, ys);
    // Sen 1968, n = 10: Var(S) = 10·9·25/18 = 125; C = 1.959964 · 11.18034 = 21.9131; N = 45;
    // M1 = (45 − 21.9131)/2 = 11.5435; M2 + 1 = (45 + 21.9131)/2 + 1 = 34.4565.
    const m1 = (45 - SEN_INTERVAL_Z * Math.sqrt(125)) / 2;
    expect(m1).toBeCloseTo(11.5435, 4);
    const fit = fitOf(xs, ys);
    // Between the 11th and 12th ordered slopes, 54 % of the way; and between the 34th and 35th.
    expect(fit.slopeLow).toBeCloseTo(sorted[10] + 0.5435 * (sorted[11] - sorted[10]), 3);
    expect(fit.slopeHigh).toBeCloseTo(sorted[33] + 0.4565 * (sorted[34] - sorted[33]), 3);
    expect(fit.slope).toBe(bruteForceMedian(sorted));
    expect(fit.pairs).toBe(45);
  });

  it('when points are arbitrary, then the slope is the brute-force median of pairwise slopes', () => {
    const point = fc.tuple(fc.integer({ min: 0, max: 50 }), fc.integer({ min: -1000, max: 1000 }));
    fc.assert(
      fc.property(fc.array(point, { minLength: 2, maxLength: 40 }), (points) => {
        const xs = points.map((p) => p[0]);
        const ys = points.map((p) => p[1]);
        const sorted = bruteForceSlopes(xs, ys);
        const fit = theilSen(xs, ys);
        if (sorted.length === 0) return fit === null;
        if (fit === null) return false;
        // Sen's limits straight from the definition (JASA 63, 1968): fractional ranks of the fully sorted slopes.
        const n = xs.length;
        const spread = SEN_INTERVAL_Z * Math.sqrt((n * (n - 1) * (2 * n + 5)) / 18);
        const atSortedRank = (rank: number) => {
          const r = Math.min(sorted.length, Math.max(1, rank));
          const below = Math.floor(r);
          return below >= sorted.length ? sorted[below - 1] : sorted[below - 1] + (r - below) * (sorted[below] - sorted[below - 1]);
        };
        const near = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * (1 + Math.abs(b));
        return (
          near(fit.slope, bruteForceMedian(sorted)) &&
          near(fit.slopeLow, atSortedRank((sorted.length - spread) / 2)) &&
          near(fit.slopeHigh, atSortedRank((sorted.length + spread) / 2 + 1)) &&
          fit.slopeLow <= fit.slope &&
          fit.slope <= fit.slopeHigh
        );
      }),
      { seed: 1968, numRuns: 300 },
    );
  });

  it('when noisy lines of known slope are fitted many times, then Sen\'s 95 % interval covers the slope about 95 % of the time', () => {
    const random = mulberry32(1950);
    // Box–Muller normal noise, σ = 5, around y = 2x over 20 points.
    const normal = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
    const xs = Array.from({ length: 20 }, (_, i) => i);
    let covered = 0;
    const trials = 300;
    for (let trial = 0; trial < trials; trial++) {
      const fit = fitOf(xs, xs.map((x) => 2 * x + 5 * normal()));
      if (fit.slopeLow <= 2 && 2 <= fit.slopeHigh) covered++;
    }
    // Sen 1968: nominal coverage 95 %; ±4 binomial standard errors of 300 trials is about ±5 %.
    expect(covered / trials).toBeGreaterThan(0.9);
    expect(covered / trials).toBeLessThan(0.995);
  });

  it('when no two points differ in x, then there is no fit', () => {
    expect(theilSen([5, 5, 5], [1, 2, 3])).toBeNull();
  });

  it('when a rank is fractional or out of range, then it interpolates or clamps', () => {
    const sorted = [10, 20, 30];
    expect(atRank(sorted, 1.25)).toBe(12.5);
    expect(atRank(sorted, 0.2)).toBe(10);
    expect(atRank(sorted, 7)).toBe(30);
  });

  it('when the values are in no order, then a rank still reads them as if sorted (hand-computed)', () => {
    // Sorted by hand: 10, 20, 30, 40, 50; rank 2.5 lies halfway between 20 and 30, rank 4 is 40.
    const values = [50, 10, 40, 30, 20];
    const settled: number[] = [];
    expect(atRank(values, 4, settled)).toBe(40);
    expect(atRank(values, 2.5, settled)).toBe(25);
    expect(atRank(values, 1, settled)).toBe(10);
    expect(atRank(values, 5, settled)).toBe(50);
  });

  it('when 2,000 points are thinned to 400, then the first and last are kept and the spacing is even', () => {
    const items = Array.from({ length: 2_000 }, (_, i) => i);
    const kept = thinEvenly(items, 400);
    expect(kept).toHaveLength(400);
    expect(kept[0]).toBe(0);
    expect(kept[399]).toBe(1_999);
    const gaps = kept.slice(1).map((v, i) => v - kept[i]);
    expect(Math.min(...gaps)).toBeGreaterThanOrEqual(4);
    expect(Math.max(...gaps)).toBeLessThanOrEqual(6);
  });
});
