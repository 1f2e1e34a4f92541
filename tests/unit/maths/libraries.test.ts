import createCountMinSketch from 'count-min-sketch';
import { CountMin } from 'datalib-sketch';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { plan } from '../../../backend/src/maths';

/*
 * Both libraries were read before comparing (node_modules/count-min-sketch/count-min.js,
 * node_modules/datalib-sketch/src/count-min.js). Both size as Cormode & Muthukrishnan:
 * width = ⌈e/ε⌉, depth = ⌈−ln p⌉ with p the probability of a wrong answer (δ, not the
 * confidence). count-min-sketch takes (ε, δ); datalib-sketch takes (n, e, p) with e the
 * absolute error and forms ε = e/n itself, the same convention as plan's sizedTotal and
 * errorBudget. Both replace a 0 argument with a default, so the grid holds none.
 */
// Both libraries allocate their table when sized, so widths stay under 2^18 to keep the run light.
const totals = [1_000, 10_000, 123_457, 1_000_000, 35_000_000, 1e9];
const budgets = [1, 7, 50, 1_000, 25_000];
const confidences = [0.5, 0.8, 0.9, 0.95, 0.99, 0.999, 0.9999, 0.999999];
const grid = totals.flatMap((sizedTotal) =>
  budgets.flatMap((errorBudget) => confidences.map((confidence) => ({ sizedTotal, errorBudget, confidence }))),
).filter(({ sizedTotal, errorBudget }) => (Math.E * sizedTotal) / errorBudget < 2 ** 18);

describe('sizing against independent libraries', () => {
  it('when the grid of inputs is sized, then count-min-sketch gives the same width and depth', () => {
    expect(grid.length).toBeGreaterThan(150);
    for (const input of grid) {
      const ours = plan(input);
      const theirs = createCountMinSketch(input.errorBudget / input.sizedTotal, 1 - input.confidence);
      expect([ours.width, ours.depth], JSON.stringify(input)).toEqual([theirs.width, theirs.depth]);
    }
  });

  it('when the grid of inputs is sized, then datalib-sketch gives the same width and depth', () => {
    for (const input of grid) {
      const ours = plan(input);
      const theirs = CountMin.create(input.sizedTotal, input.errorBudget, 1 - input.confidence);
      expect([ours.width, ours.depth], JSON.stringify(input)).toEqual([theirs._w, theirs._d]);
    }
  });

  it('when inputs are drawn at random, then both libraries agree with plan', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 10, max: 1e7, noNaN: true }),
        fc.double({ min: 0.5, max: 1e4, noNaN: true }),
        fc.double({ min: 0.01, max: 0.999999, noNaN: true }),
        (sizedTotal, errorBudget, confidence) => {
          fc.pre((Math.E * sizedTotal) / errorBudget < 2 ** 16);
          const ours = plan({ sizedTotal, errorBudget, confidence });
          const a = createCountMinSketch(errorBudget / sizedTotal, 1 - confidence);
          const b = CountMin.create(sizedTotal, errorBudget, 1 - confidence);
          return ours.width === a.width && ours.depth === a.depth && ours.width === b._w && ours.depth === b._d;
        },
      ),
      { seed: 20_240_611, numRuns: 300 },
    );
  });
});
