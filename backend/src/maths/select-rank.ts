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
