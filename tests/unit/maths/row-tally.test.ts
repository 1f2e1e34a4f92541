import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { RowTally } from '../../../backend/src/maths/row-tally';

/** The median by its definition: sort, take the middle (the mean of the two middle values for an even count). */
function sortedMedian(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

// Counters on both sides of the tally's split at 65,536, with many repeats, and the 64-bit range.
const counter = fc.oneof(fc.integer({ min: 0, max: 5 }), fc.integer({ min: 65_530, max: 65_540 }), fc.integer({ min: 0, max: 2 ** 32 - 1 }), fc.constantFrom(2 ** 40, 2 ** 53 - 1));

describe('RowTally', () => {
  it('when rows of counters stream through one tally in pieces, then each row’s median, sum, zeros and share over budget equal those of the sorted row', () => {
    fc.assert(
      fc.property(fc.array(fc.array(counter, { minLength: 1, maxLength: 60 }), { minLength: 1, maxLength: 4 }), fc.integer({ min: 1, max: 7 }), (rows, piece) => {
        const tally = new RowTally(65_536);
        return rows.every((values, r) => {
          for (let at = 0; at < values.length; at += piece) tally.add(values, at, Math.min(values.length, at + piece));
          const summary = tally.finish(r);
          return (
            summary.row === r &&
            summary.median === sortedMedian(values) &&
            summary.sum === values.reduce((a, b) => a + b, 0) &&
            summary.nonzeroCells === values.filter((v) => v !== 0).length &&
            summary.shareAtOrAboveBudget === values.filter((v) => v >= 65_536).length / values.length
          );
        });
      }),
      { numRuns: 300 },
    );
  });

  it('when a row holds more large counters than the first buffer, then it grows and the median is still exact', () => {
    const values = Array.from({ length: 5001 }, (_, i) => 70_000 + ((i * 7919) % 5001));
    const tally = new RowTally(1);
    tally.add(values, 0, values.length);
    // 70,000 + every residue 0…5000 once: the middle one is 70,000 + 2500 (by hand).
    expect(tally.finish(0).median).toBe(72_500);
  });
});
