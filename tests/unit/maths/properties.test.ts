import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { SketchMathsError, analyseDump, assess, forecastBrim, plan, severity } from '../../../backend/src/maths';

const realistic = {
  sizedTotal: fc.double({ min: 1, max: 1e12, noNaN: true }),
  errorBudget: fc.double({ min: 1e-3, max: 1e9, noNaN: true }),
  confidence: fc.double({ min: 1e-3, max: 1 - 1e-9, noNaN: true }),
};

/** Runs `fn`; a SketchMathsError is an answer, anything else thrown is a defect, and so is a non-finite figure. */
function answersOrExplains(fn: () => object): boolean {
  try {
    const answer = fn();
    return Object.values(answer).every((v) => typeof v !== 'number' || Number.isFinite(v));
  } catch (error) {
    return error instanceof SketchMathsError && error.field.length > 0 && error.message.length > 0;
  }
}

describe('properties', () => {
  it('when the stream total grows, then bound, load, miss risk and level never go down', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 2 ** 24 }),
        fc.integer({ min: 1, max: 30 }),
        realistic.errorBudget,
        realistic.confidence,
        fc.double({ min: 0, max: 1e15, noNaN: true }),
        fc.double({ min: 0, max: 1e15, noNaN: true }),
        (width, depth, errorBudget, confidence, a, b) => {
          const [low, high] = a <= b ? [a, b] : [b, a];
          const x = assess({ width, depth, errorBudget, confidence, streamTotal: low });
          const y = assess({ width, depth, errorBudget, confidence, streamTotal: high });
          return (
            x.boundNow <= y.boundNow &&
            x.load <= y.load &&
            (x.missRisk ?? 1) <= (y.missRisk ?? 1) &&
            severity(x.level) <= severity(y.level) &&
            x.relativeError === y.relativeError
          );
        },
      ),
      { seed: 2005, numRuns: 1_000 },
    );
  });

  it('when a plan is assessed at its own sized total, then it is never brimmed', () => {
    fc.assert(
      fc.property(realistic.sizedTotal, realistic.errorBudget, realistic.confidence, fc.constantFrom(1, 2, 4, 8), (sizedTotal, errorBudget, confidence, counterBytes) => {
        let planned;
        try {
          planned = plan({ sizedTotal, errorBudget, confidence, counterBytes });
        } catch (error) {
          // Designs past the size limits are refused, which is not a plan to assess.
          return error instanceof SketchMathsError && /absurd size/.test(error.message);
        }
        const result = assess({ width: planned.width, depth: planned.depth, errorBudget, confidence, streamTotal: sizedTotal });
        return result.level !== 'brimmed' && planned.capacity >= sizedTotal * (1 - 1e-9);
      }),
      { seed: 2006, numRuns: 2_000 },
    );
  });

  it('when plan or assess get any numbers at all, then they answer or throw a SketchMathsError naming a field', () => {
    const anything = fc.oneof(fc.double(), fc.integer(), fc.constantFrom(0, -1, Number.NaN, Number.POSITIVE_INFINITY, 1e308, 5e-324));
    fc.assert(
      fc.property(anything, anything, anything, anything, (a, b, c, d) =>
        answersOrExplains(() => plan({ sizedTotal: a, errorBudget: b, confidence: c, counterBytes: d })) &&
        answersOrExplains(() => assess({ width: a, depth: d, errorBudget: b, confidence: c, streamTotal: a })),
      ),
      { seed: 2007, numRuns: 2_000 },
    );
  });

  it('when any matrix of counters is analysed, then it answers with finite figures and the empirical risk under the Markov one', () => {
    const matrix = fc.record({ width: fc.integer({ min: 1, max: 40 }), depth: fc.integer({ min: 1, max: 8 }) }).chain(({ width, depth }) =>
      fc.record({
        width: fc.constant(width),
        depth: fc.constant(depth),
        counters: fc.array(fc.oneof(fc.constant(0), fc.integer({ min: 0, max: 100 }), fc.constantFrom(0xffffffff, 2 ** 53, 2 ** 64)), {
          minLength: width * depth,
          maxLength: width * depth,
        }),
        errorBudget: fc.double({ min: 1e-6, max: 1e20, noNaN: true }),
        confidence: realistic.confidence,
      }),
    );
    fc.assert(
      fc.property(matrix, (input) => {
        const result = analyseDump(input);
        const figures = [result.empiricalMissRisk, result.markovMissRisk, result.streamTotal, result.assessment.load, ...result.rows.flatMap((r) => [r.sum, r.mean, r.median, r.zeroFraction, r.shareAtOrAboveBudget])];
        const occupancies = [result.distinct, ...result.rows.map((r) => r.occupancy)];
        return (
          figures.every(Number.isFinite) &&
          occupancies.every((o) => o.saturated || (Number.isFinite(o.distinctEstimate) && Number.isFinite(o.standardError))) &&
          result.empiricalMissRisk <= result.markovMissRisk &&
          result.verdict.length > 0
        );
      }),
      { seed: 2018, numRuns: 500 },
    );
  });

  it('when a dump holds arbitrary values, then it answers or throws a SketchMathsError, never anything else', () => {
    fc.assert(
      fc.property(fc.array(fc.oneof(fc.double(), fc.integer()), { maxLength: 30 }), fc.integer({ min: -2, max: 10 }), (counters, width) =>
        answersOrExplains(() => analyseDump({ width, depth: 3, errorBudget: 5, confidence: 0.9, counters })),
      ),
      { seed: 2019, numRuns: 1_000 },
    );
  });

  it('when any readings are forecast, then the answer is "no trend" or a rising trend with finite dates in order', () => {
    const reading = fc.record({ t: fc.integer({ min: 0, max: 1e7 }), total: fc.integer({ min: 0, max: 1e6 }) });
    fc.assert(
      fc.property(fc.array(reading, { maxLength: 60 }), fc.double({ min: 1, max: 2e6, noNaN: true }), fc.constantFrom(0, 60, 3_600), (points, capacity, windowSeconds) => {
        const forecast = forecastBrim({ points, capacity, windowSeconds, now: 2e7 });
        if (forecast.trend === 'none') return forecast.reason.length > 0;
        const dates = [forecast.brimAt, forecast.brimEarliest, ...(forecast.brimLatest === null ? [] : [forecast.brimLatest])];
        return (
          dates.every(Number.isFinite) &&
          forecast.slopePerSecond > 0 &&
          forecast.brimEarliest <= forecast.brimAt + 1e-6 &&
          (forecast.brimLatest === null || forecast.brimAt <= forecast.brimLatest + 1e-6)
        );
      }),
      { seed: 1950, numRuns: 1_000 },
    );
  });
});

describe('property test self-check', () => {
  it('when a defect is thrown as a plain Error or a figure is not finite, then the helper reports it', () => {
    expect(
      answersOrExplains(() => {
        throw new Error('boom');
      }),
    ).toBe(false);
    expect(answersOrExplains(() => ({ load: Number.NaN }))).toBe(false);
    expect(answersOrExplains(() => ({ load: 0.5, level: 'clear' }))).toBe(true);
  });
});
