import { SketchMathsError, requireNonNegative, requirePositiveInteger } from './errors';

/**
 * A small seeded generator (mulberry32, a public-domain 32-bit generator by
 * Tommy Ettinger) so the demo fleet and the tests replay the same stream from
 * the same seed; Math.random cannot be seeded.
 */
export function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Largest key space the sampler tabulates: 8 MiB of cumulative weights. */
export const MAX_ZIPF_KEYS = 2 ** 20;

/**
 * Draws ranks 0 … keyCount − 1 with P(rank i) ∝ (i + 1)^(−skew), Zipf's law
 * over a finite key space; skew 0 is uniform. Inverts a table of cumulative
 * weights by binary search: exact, and O(log keyCount) per draw.
 */
export function createZipfSampler(keyCount: number, skew: number, random: () => number): () => number {
  requirePositiveInteger('keyCount', keyCount);
  requireNonNegative('skew', skew);
  if (keyCount > MAX_ZIPF_KEYS) {
    throw new SketchMathsError('keyCount', `keyCount must be at most ${MAX_ZIPF_KEYS} (got ${keyCount}).`);
  }
  const cumulative = new Float64Array(keyCount);
  let sum = 0;
  for (let i = 0; i < keyCount; i++) {
    sum += (i + 1) ** -skew;
    cumulative[i] = sum;
  }
  return () => {
    const target = random() * sum;
    let lo = 0;
    let hi = keyCount - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (cumulative[mid] > target) hi = mid;
      else lo = mid + 1;
    }
    return lo;
  };
}
