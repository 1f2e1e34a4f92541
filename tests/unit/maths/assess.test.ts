import { describe, expect, it } from 'vitest';
import { NO_GUARANTEE, SketchMathsError, assess, plan } from '../../../backend/src/maths';

// A 272 × 5 sketch: Cormode & Muthukrishnan's sizing for ε = δ = 0.01 (J. Algorithms 55(1), 2005).
const sketch = { width: 272, depth: 5, errorBudget: 100, confidence: 0.99 };

describe('assess', () => {
  it('when a 272 × 5 sketch holds 5,000, then every figure matches the hand calculation', () => {
    const result = assess({ ...sketch, streamTotal: 5_000 });
    // By hand: δ^(1/k) = 0.01^(1/5) = 10^(−0.4) = 0.398107.
    // bound now = n/(m·δ^(1/k)) = 5,000/(272 · 0.398107) = 5,000/108.285 = 46.174.
    expect(result.boundNow).toBeCloseTo(46.1744, 3);
    // capacity = m·E·δ^(1/k) = 272 · 100 · 0.398107 = 10,828.5.
    expect(result.capacity).toBeCloseTo(10_828.515, 2);
    // load = 5,000/10,828.5 = 0.46174.
    expect(result.load).toBeCloseTo(0.461744, 5);
    // Markov over k independent rows: (n/(m·E))^k = (5,000/27,200)^5 = 0.183824^5 = 2.0990·10⁻⁴.
    expect(result.missRisk).toBeCloseTo(2.099e-4, 7);
    expect(result.missRiskNote).toBeUndefined();
    // relative error = δ^(−1/k)/m = 1/108.285 = 0.0092349.
    expect(result.relativeError).toBeCloseTo(0.0092349, 6);
    expect(result.level).toBe('clear');
  });

  it('when the stream total equals capacity, then the bound equals the budget and the miss risk equals δ', () => {
    // Identities of the Markov bound: B(n_cap) = E and (n_cap/(m·E))^k = (δ^(1/k))^k = δ.
    const { capacity } = assess({ ...sketch, streamTotal: 0 });
    const atCapacity = assess({ ...sketch, streamTotal: capacity });
    expect(atCapacity.boundNow).toBeCloseTo(100, 9);
    expect(atCapacity.missRisk).toBeCloseTo(0.01, 12);
    expect(atCapacity.load).toBeCloseTo(1, 12);
  });

  it('when n reaches m·E, then there is no guarantee and the miss risk is null', () => {
    const result = assess({ ...sketch, streamTotal: 272 * 100 });
    expect(result.missRisk).toBeNull();
    expect(result.missRiskNote).toBe(NO_GUARANTEE);
    expect(result.level).toBe('brimmed');
  });

  it('when the stream total grows, then the relative error stays the same and the absolute bound grows', () => {
    const small = assess({ ...sketch, streamTotal: 1_000 });
    const large = assess({ ...sketch, streamTotal: 9_000 });
    expect(large.relativeError).toBe(small.relativeError);
    expect(large.boundNow).toBeCloseTo(small.boundNow * 9, 9);
  });

  it('when load crosses the watch line and then 100 %, then the level goes clear → watch → brimmed', () => {
    const capacity = assess({ ...sketch, streamTotal: 0 }).capacity;
    expect(assess({ ...sketch, streamTotal: capacity * 0.79 }).level).toBe('clear');
    expect(assess({ ...sketch, streamTotal: capacity * 0.8001 }).level).toBe('watch');
    expect(assess({ ...sketch, streamTotal: capacity * 0.999 }).level).toBe('watch');
    expect(assess({ ...sketch, streamTotal: capacity * 1.001 }).level).toBe('brimmed');
    expect(assess({ ...sketch, streamTotal: capacity * 0.6, watchLine: 0.5 }).level).toBe('watch');
  });

  it('when a sketch is assessed at the total it was planned for, then its load is at most 100 %', () => {
    const planned = plan({ sizedTotal: 2_000_000, errorBudget: 500, confidence: 0.999 });
    const result = assess({ ...planned, errorBudget: 500, confidence: 0.999, streamTotal: 2_000_000 });
    expect(result.load).toBeLessThanOrEqual(1);
    expect(result.capacity).toBe(planned.capacity);
  });

  it.each([
    ['width', { width: 0 }],
    ['width', { width: 27.5 }],
    ['depth', { depth: -1 }],
    ['streamTotal', { streamTotal: -1 }],
    ['streamTotal', { streamTotal: Number.NaN }],
    ['confidence', { confidence: 1.5 }],
    ['watchLine', { watchLine: 1.2 }],
    ['watchLine', { watchLine: 0 }],
  ])('when %s is invalid, then a SketchMathsError names it', (field, change) => {
    const run = () => assess({ ...sketch, streamTotal: 10, ...change });
    expect(run).toThrow(SketchMathsError);
    try {
      run();
    } catch (error) {
      expect((error as SketchMathsError).field).toBe(field);
    }
  });
});
