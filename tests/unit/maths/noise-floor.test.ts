import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { medianInPlace, mulberry32, neighbouringRanks, selectInPlace } from '../../../backend/src/maths';

/** The textbook median: sort a copy, take the middle (or the mean of the two middles). */
function sortedMedian(values: number[]): number {
  const sorted = values.slice().sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

const counters = fc.array(fc.oneof(fc.constant(0), fc.integer({ min: 0, max: 20 }), fc.integer({ min: 0, max: 0xffffffff })), { minLength: 1, maxLength: 300 });

describe('row median', () => {
  it('when 32-bit counters are counted, then the median equals the sorted median and the row is untouched', () => {
    fc.assert(
      fc.property(counters, (values) => {
        const row = Uint32Array.from(values);
        const before = row.slice();
        return medianInPlace(row) === sortedMedian(values) && row.every((v, i) => v === before[i]);
      }),
      { seed: 1961, numRuns: 400 },
    );
  });

  it('when counters are doubles, then quickselect gives the sorted median', () => {
    fc.assert(
      fc.property(counters, (values) => medianInPlace(Float64Array.from(values)) === sortedMedian(values)),
      { seed: 1962, numRuns: 400 },
    );
  });

  it('when any rank is selected, then it matches the sorted order and the array is split around it', () => {
    fc.assert(
      fc.property(counters, fc.nat(), (values, pick) => {
        const k = pick % values.length;
        const sorted = values.slice().sort((a, b) => a - b);
        const row = Float64Array.from(values);
        const chosen = selectInPlace(row, k);
        const [kth, next] = neighbouringRanks(Uint32Array.from(values), k);
        return chosen === sorted[k] && kth === sorted[k] && next === sorted[Math.min(k + 1, sorted.length - 1)] && row.subarray(k + 1).every((v) => v >= chosen) && row.subarray(0, k).every((v) => v <= chosen);
      }),
      { seed: 1963, numRuns: 100 },
    );
  });

  it('when a row is all zeros but one, then the median is 0', () => {
    const row = new Uint32Array(100_001);
    row[7] = 99;
    expect(medianInPlace(row)).toBe(0);
  });

  it('when a long row of 32-bit counters is counted, then its median equals the sorted median and the row is untouched', () => {
    const random = mulberry32(7);
    for (const length of [65_536, 70_001]) {
      const values = Array.from({ length }, () => (random() < 0.3 ? 0 : Math.floor(random() * 2 ** (random() < 0.5 ? 8 : 32))));
      const row = Uint32Array.from(values);
      expect(medianInPlace(row)).toBe(sortedMedian(values));
      expect(row.every((v, i) => v === values[i])).toBe(true);
    }
  });
});
