export type CounterRow = Uint32Array | Float64Array;

/**
 * The k-th smallest value (0-based) by quickselect (Hoare, CACM 4(7), 1961),
 * rearranging `values` in place; afterwards every value past index k is at
 * least the answer. The three-way split keeps long runs of equal counters
 * (a dump is often mostly zeros) from turning it quadratic, and a fixed-seed
 * xorshift picks pivots, so sorted or crafted rows cost the same as any other.
 */
export function selectInPlace(values: CounterRow, k: number): number {
  let lo = 0;
  let hi = values.length - 1;
  let state = 0x9e3779b9;
  while (lo < hi) {
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    const pivot = values[lo + ((state >>> 0) % (hi - lo + 1))];
    let below = lo;
    let i = lo;
    let above = hi;
    while (i <= above) {
      const v = values[i];
      if (v < pivot) {
        values[i] = values[below];
        values[below++] = v;
        i++;
      } else if (v > pivot) {
        values[i] = values[above];
        values[above--] = v;
      } else {
        i++;
      }
    }
    if (k < below) hi = below - 1;
    else if (k > above) lo = above + 1;
    else return pivot;
  }
  return values[lo];
}

/**
 * The k-th and (k+1)-th smallest 32-bit counters by counting, without moving
 * them: one pass tallies the high 16 bits to find the buckets holding those
 * ranks, a second tallies the low 16 bits inside them. Two linear passes
 * whatever the values, several times faster than quickselect on a million cells.
 */
export function neighbouringRanks(values: Uint32Array, k: number): [number, number] {
  const high = new Uint32Array(65536);
  for (let i = 0; i < values.length; i++) high[values[i] >>> 16]++;
  const bucketOf = (rank: number): [number, number] => {
    let bucket = 0;
    while (rank >= high[bucket]) rank -= high[bucket++];
    return [bucket, rank];
  };
  const [firstBucket, firstRank] = bucketOf(k);
  const [secondBucket, secondRank] = bucketOf(Math.min(k + 1, values.length - 1));
  const first = new Uint32Array(65536);
  const second = firstBucket === secondBucket ? first : new Uint32Array(65536);
  for (let i = 0; i < values.length; i++) {
    const bucket = values[i] >>> 16;
    if (bucket === firstBucket) first[values[i] & 0xffff]++;
    else if (bucket === secondBucket) second[values[i] & 0xffff]++;
  }
  const valueAt = (tally: Uint32Array, bucket: number, rank: number) => {
    let low = 0;
    while (rank >= tally[low]) rank -= tally[low++];
    return bucket * 65536 + low;
  };
  return [valueAt(first, firstBucket, firstRank), valueAt(second, secondBucket, secondRank)];
}

/** Below this many cells, two 65,536-bucket tallies cost more than quickselect on a copy. */
const COUNTING_FROM = 65_536;

/**
 * The row median in linear time. A row of 32-bit counters is left as it is
 * (it may be the caller's own dump); a row of doubles is rearranged, so pass
 * one you no longer need in order.
 */
export function medianInPlace(values: CounterRow): number {
  const n = values.length;
  if (n === 0) return Number.NaN;
  if (values instanceof Uint32Array) {
    if (n < COUNTING_FROM) return medianInPlace(Float64Array.from(values));
    if (n % 2 === 1) return neighbouringRanks(values, n >> 1)[0];
    const [lower, upper] = neighbouringRanks(values, (n >> 1) - 1);
    return (lower + upper) / 2;
  }
  const upper = selectInPlace(values, n >> 1);
  if (n % 2 === 1) return upper;
  let lower = values[0];
  for (let i = 1; i < n >> 1; i++) if (values[i] > lower) lower = values[i];
  return (lower + upper) / 2;
}
