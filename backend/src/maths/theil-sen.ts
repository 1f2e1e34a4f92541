import quickselect from 'quickselect';

/** Φ⁻¹(0.975): the two-sided 95 % normal quantile used for Sen's interval. */
export const SEN_INTERVAL_Z = 1.959963984540054;

/**
 * Every pair of points is compared, so the work grows with n²; 400 points make
 * 79,800 slopes, ordered in a few milliseconds, while a year of one-minute
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

const ascending = (a: number, b: number) => a - b;

/**
 * The value that would sit at 0-based `index` if `values` were sorted, found
 * by selection (Floyd–Rivest, via quickselect) instead of a full sort: a fit
 * needs only five or six order statistics of its n(n−1)/2 slopes. Each
 * selection leaves its value in its sorted place with nothing larger before
 * it and nothing smaller after it, so `settled` (the places found so far)
 * narrows every later search to the stretch between two of them.
 */
function valueAt(values: number[], index: number, settled: number[]): number {
  let left = 0;
  let right = values.length - 1;
  for (const at of settled) {
    if (at === index) return values[index];
    if (at < index) left = Math.max(left, at + 1);
    else right = Math.min(right, at - 1);
  }
  quickselect(values, index, left, right, ascending);
  settled.push(index);
  return values[index];
}

/** The median of `values`, which it reorders. */
function median(values: number[], settled: number[] = []): number {
  const mid = values.length >> 1;
  return values.length % 2 === 1 ? valueAt(values, mid, settled) : (valueAt(values, mid - 1, settled) + valueAt(values, mid, settled)) / 2;
}

/**
 * The value at a 1-based rank of `values` in ascending order, interpolating
 * between neighbours for a fractional rank and clamping to the ends. Reorders
 * `values`; pass the same `settled` to every call on one array.
 */
export function atRank(values: number[], rank: number, settled: number[] = []): number {
  const clamped = Math.min(values.length, Math.max(1, rank));
  const below = Math.floor(clamped);
  const fraction = clamped - below;
  const low = valueAt(values, below - 1, settled);
  if (fraction === 0 || below >= values.length) return low;
  return low + fraction * (valueAt(values, below, settled) - low);
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
  const slopes: number[] = [];
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const dx = xs[j] - xs[i];
      if (dx !== 0) slopes.push((ys[j] - ys[i]) / dx);
    }
  }
  const count = slopes.length;
  if (count === 0) return null;
  const settled: number[] = [];
  const slope = median(slopes, settled);

  const spread = z * Math.sqrt((n * (n - 1) * (2 * n + 5)) / 18);
  const residuals: number[] = [];
  for (let i = 0; i < n; i++) residuals.push(ys[i] - slope * xs[i]);
  return {
    slope,
    slopeLow: atRank(slopes, (count - spread) / 2, settled),
    slopeHigh: atRank(slopes, (count + spread) / 2 + 1, settled),
    intercept: median(residuals),
    pairs: count,
  };
}
