import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { selectInPlace } from '../../../backend/src/maths';

const counters = fc.array(fc.oneof(fc.constant(0), fc.integer({ min: 0, max: 20 }), fc.integer({ min: 0, max: 0xffffffff })), { minLength: 1, maxLength: 300 });

describe('selecting a rank in place', () => {
  it('when any rank is selected, then it matches the sorted order and the array is split around it', () => {
    fc.assert(
      fc.property(counters, fc.nat(), (values, pick) => {
        const k = pick % values.length;
        const sorted = values.slice().sort((a, b) => a - b);
        const row = Float64Array.from(values);
        const chosen = selectInPlace(row, k);
        return chosen === sorted[k] && row.subarray(k + 1).every((v) => v >= chosen) && row.subarray(0, k).every((v) => v <= chosen);
      }),
      { seed: 1963, numRuns: 400 },
    );
  });

  it('when a long row is mostly zeros, then its middle rank is 0 and the largest is the one non-zero counter', () => {
    const row = new Uint32Array(100_001);
    row[7] = 99;
    expect(selectInPlace(row.slice(), 50_000)).toBe(0);
    expect(selectInPlace(row.slice(), 100_000)).toBe(99);
  });
});
