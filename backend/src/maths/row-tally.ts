import { selectInPlace } from './select-rank';
import { distinctFromNonzeroCells } from './occupancy';
import type { DumpRowSummary } from './dump-verdict';

/** Counters below this are tallied by value; the rest are kept to be selected from. */
const SMALL = 65_536;

/**
 * One row's summary gathered as its counters stream past, without holding
 * the row: a tally of the small counters by value, plus a list of the large
 * ones, which in a count-min sketch are the few heavy cells. The sum, the
 * zeros, the cells at or above the budget and the median are all exact from
 * those two whatever the values; only a row of mostly large counters keeps
 * most of them. One tally serves every row of a dump in turn: its two
 * buffers are allocated once and reused.
 */
export class RowTally {
  private readonly small = new Uint32Array(SMALL);
  private large = new Float64Array(1024);
  private largeCount = 0;
  private count = 0;
  private sum = 0;

  constructor(private readonly errorBudget: number) {}

  /**
   * Counters already checked to be whole numbers from 0 up. The loop adds
   * to the sum in row order (so a sum past 2^53 rounds as it always has) and
   * sorts each counter into the tally or the list; the zeros and the cells
   * over budget are read off those two when the row ends.
   */
  add(values: ArrayLike<number>, from: number, to: number): void {
    const small = this.small;
    let sum = this.sum;
    for (let i = from; i < to; i++) {
      const v = values[i];
      sum += v;
      if (v < SMALL) small[v]++;
      else this.keepLarge(v);
    }
    this.sum = sum;
    this.count += to - from;
  }

  private keepLarge(v: number): void {
    if (this.largeCount === this.large.length) {
      const grown = new Float64Array(this.large.length * 2);
      grown.set(this.large);
      this.large = grown;
    }
    this.large[this.largeCount++] = v;
  }

  /** The row's summary; the tally is then empty, ready for the next row. */
  finish(row: number): DumpRowSummary {
    const { small, large, largeCount, errorBudget } = this;
    const width = this.count;
    const sum = this.sum;
    let atOrAbove = 0;
    // A zero is never over budget (the budget is above 0), so counting starts at 1 at least.
    for (let v = Math.max(1, Math.ceil(errorBudget)); v < SMALL; v++) atOrAbove += small[v];
    for (let i = 0; i < largeCount; i++) if (large[i] >= errorBudget) atOrAbove++;
    const zeros = small[0];
    const k = width >> 1;
    const median = width % 2 === 1 ? this.valueAtRank(k) : (this.valueAtRank(k - 1) + this.valueAtRank(k)) / 2;
    const summary: DumpRowSummary = {
      row,
      sum,
      mean: sum / width,
      zeroFraction: zeros / width,
      nonzeroCells: width - zeros,
      median,
      shareAtOrAboveBudget: atOrAbove / width,
      occupancy: distinctFromNonzeroCells(width - zeros, width),
    };
    small.fill(0);
    this.largeCount = this.count = this.sum = 0;
    return summary;
  }

  /** The rank-th smallest counter of the row (0-based). */
  private valueAtRank(rank: number): number {
    const smallCount = this.count - this.largeCount;
    if (rank >= smallCount) return selectInPlace(this.large.subarray(0, this.largeCount), rank - smallCount);
    let left = rank;
    let value = 0;
    while (left >= this.small[value]) left -= this.small[value++];
    return value;
  }
}
