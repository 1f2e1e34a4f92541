import type { HistogramBin } from '../../api-types';

/**
 * Bins that double in width (see HistogramBin): a dump mixes a sea of small
 * counters with a few heavy keys, so equal-width bins would put nearly
 * everything in the first one.
 */
const BINS = 66; // 0, then one per power of two up to 2^64

function binOf(value: number): number {
  if (value === 0) return 0;
  // Below 2^32 the bin is the bit length, exactly and without a logarithm (this runs once per counter).
  if (value < 4_294_967_296) return 32 - Math.clz32(value);
  // Math.log2 may round across a power of two for large values; correct by one step either way.
  let bin = Math.floor(Math.log2(value)) + 1;
  if (2 ** (bin - 1) > value) bin -= 1;
  else if (2 ** bin <= value) bin += 1;
  return Math.min(bin, BINS - 1);
}

export class CounterHistogram {
  private readonly counts = new Float64Array(BINS);

  add(values: ArrayLike<number> | BigUint64Array): void {
    if (values instanceof BigUint64Array) {
      for (let i = 0; i < values.length; i++) this.counts[binOf(Number(values[i]))]++;
      return;
    }
    for (let i = 0; i < values.length; i++) this.counts[binOf(values[i])]++;
  }

  /** The bins from 0 up to the highest one that holds a counter. */
  bins(): HistogramBin[] {
    let last = 0;
    for (let b = 0; b < BINS; b++) if (this.counts[b] > 0) last = b;
    const out: HistogramBin[] = [];
    for (let b = 0; b <= last; b++) {
      out.push({ from: b === 0 ? 0 : 2 ** (b - 1), to: b === 0 ? 0 : 2 ** b - 1, cells: this.counts[b] });
    }
    return out;
  }
}
