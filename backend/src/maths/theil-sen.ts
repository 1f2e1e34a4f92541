/** Φ⁻¹(0.975): the two-sided 95 % normal quantile used for Sen's interval. */
export const SEN_INTERVAL_Z = 1.959963984540054;

/**
 * Every pair of points is compared, so the work grows with n²; 400 points make
 * 79,800 slopes, sorted in a few milliseconds, while a year of one-minute
 * readings would make 10¹¹. Thinning evenly keeps the span (first and last
 * point stay) and the trend; the fit's interval widens a little, honestly.
 */
export const MAX_FIT_POINTS = 400;

export function thinEvenly<T>(items: readonly T[], max: number = MAX_FIT_POINTS): T[] {
  if (items.length <= max) return items.slice();
  const kept: T[] = [];
  const step = (items.length - 1) / (max - 1);
  for (let i = 0; i < max; i++) kept.push(items[Math.round(i * step)]);
  return kept;
}

export interface TheilSenFit {
  slope: number;
  slopeLow: number;
  slopeHigh: number;
  /** Median of y − slope·x, so the line passes through the middle of the points. */
  intercept: number;
  /** Pairs with distinct x, i.e. slopes the median was taken over. */
  pairs: number;
}

function median(sorted: Float64Array): number {
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** The value at a 1-based rank, interpolating between neighbours for a fractional rank. */
export function atRank(sorted: Float64Array, rank: number): number {
  const clamped = Math.min(sorted.length, Math.max(1, rank));
  const below = Math.floor(clamped);
  const fraction = clamped - below;
  if (fraction === 0 || below >= sorted.length) return sorted[below - 1];
  return sorted[below - 1] + fraction * (sorted[below] - sorted[below - 1]);
}

/**
 * Theil's slope (Proc. KNAW 53, 1950) as generalised by Sen (JASA 63, 1968):
 * the median of all pairwise slopes. Sen's interval uses the Mann–Kendall
 * statistic's variance without ties, Var(S) = n(n−1)(2n+5)/18, C = z·√Var(S),
 * M1 = (N − C)/2, M2 = (N + C)/2; the limits are the M1-th and (M2+1)-th of
 * the N ordered slopes. Ties would shrink Var(S), so ignoring them can only
 * widen the interval. Returns null when no two points have distinct x.
 */
export function theilSen(xs: ArrayLike<number>, ys: ArrayLike<number>, z: number = SEN_INTERVAL_Z): TheilSenFit | null {
  const n = xs.length;
  const slopes = new Float64Array((n * (n - 1)) / 2);
  let count = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const dx = xs[j] - xs[i];
      if (dx !== 0) slopes[count++] = (ys[j] - ys[i]) / dx;
    }
  }
  if (count === 0) return null;
  const sorted = slopes.subarray(0, count).sort();
  const slope = median(sorted);

  const spread = z * Math.sqrt((n * (n - 1) * (2 * n + 5)) / 18);
  const residuals = new Float64Array(n);
  for (let i = 0; i < n; i++) residuals[i] = ys[i] - slope * xs[i];
  return {
    slope,
    slopeLow: atRank(sorted, (count - spread) / 2),
    slopeHigh: atRank(sorted, (count + spread) / 2 + 1),
    intercept: median(residuals.sort()),
    pairs: count,
  };
}
