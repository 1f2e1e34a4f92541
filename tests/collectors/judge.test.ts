import { describe, expect, it } from 'vitest';
import { assess } from '../../backend/src/maths';
import { judgeReading, levelAfterFailure } from '../../collectors/judge';
import { sketchVerdicts } from '../../collectors/sketch-level';
import type { SketchSample } from '../../collectors/exposition/read-sketch';

const TERMS = { errorBudget: 100, confidence: 0.99, watchLine: 0.8, leadTimeDays: 7 };
const sample = (streamTotal: number, windowSeconds = 0): SketchSample => ({
  width: 2719, depth: 5, streamTotal, nonzeroCells: [2719, 2000, 2000, 2000, 2000], counterBytes: 4, windowSeconds, conservative: false,
});
const HOUR = 3_600_000;
const DAY = 24 * HOUR;
const now = Date.parse('2026-12-01T12:00:00Z');

describe('judgeReading', () => {
  it('when a windowed sketch has just reset, then it is judged on the last window peak, not on the small new total', () => {
    // Hourly windows: the last finished one peaked at 120,000, above the capacity of 108,245 (m·E·δ^(1/k), DESIGN.md).
    const history = [
      { t: now - 70 * 60_000, total: 40_000 },
      { t: now - 30 * 60_000, total: 90_000 },
      { t: now - 11 * 60_000, total: 120_000 },
    ];
    const j = judgeReading(sample(2_000, 3600), history, TERMS, now);
    expect(j.judgedTotal).toBe(120_000);
    expect(j.load).toBe(assess({ width: 2719, depth: 5, errorBudget: 100, confidence: 0.99, streamTotal: 120_000 }).load);
    expect(j.level).toBe('brimmed');
    // The same reading of a cumulative sketch is judged on its own total.
    expect(judgeReading(sample(2_000), [], TERMS, now).judgedTotal).toBe(2_000);
  });

  it('when the brim date falls inside or beyond the lead time, then the level is watch or stays clear', () => {
    // 1,000 a day for a week from 50,000: the brim (108,245) is about 51 days out; at 10,000 a day about 5 days.
    const slow = Array.from({ length: 7 }, (_, i) => ({ t: now - (7 - i) * DAY, total: 50_000 + i * 1000 }));
    const fast = Array.from({ length: 7 }, (_, i) => ({ t: now - (7 - i) * DAY, total: 8_000 + i * 10_000 }));
    const calm = judgeReading(sample(57_000), slow, TERMS, now);
    expect(calm.trend).toBe('rising');
    expect((Date.parse(calm.brimAt as string) - now) / DAY).toBeCloseTo(51.2, 0);
    expect(calm.level).toBe('clear');
    const hurried = judgeReading(sample(78_000), fast, TERMS, now);
    expect((Date.parse(hurried.brimAt as string) - now) / DAY).toBeCloseTo(3.0, 0);
    expect(hurried.load).toBeLessThan(0.8);
    expect(hurried.level).toBe('watch');
  });

  it('when a row has no zero cell left, then it counts as saturated and the distinct estimate still comes from the pooled rows', () => {
    const j = judgeReading(sample(1000), [], TERMS, now);
    expect(j.saturatedRows).toBe(1);
    // Pooled linear counting (Whang et al. 1990): V = 4·719 / (5·2719), D = −2719·ln V.
    expect(j.distinctEstimate).toBeCloseTo(-2719 * Math.log((4 * 719) / (5 * 2719)), 6);
  });
});

describe('levels from scraping', () => {
  it('when a scrape fails, then one failure keeps the level and the second makes it unreachable', () => {
    expect(levelAfterFailure('watch', 1)).toBe('watch');
    expect(levelAfterFailure('watch', 2)).toBe('unreachable');
    expect(levelAfterFailure('stale', 3)).toBe('unreachable');
  });

  it('when instances disagree, then the sketch takes the worst, and among equals the higher load', () => {
    const at = new Date(now);
    const row = (sketch_id: number, level: 'clear' | 'watch' | 'brimmed' | 'stale' | 'unreachable', load: number | null) =>
      ({ sketch_id, level, judgement: load === null ? null : ({ load } as never) });
    const verdicts = sketchVerdicts([row(1, 'clear', 0.2), row(1, 'unreachable', null), row(1, 'watch', 0.9), row(2, 'watch', 0.85), row(2, 'watch', 0.95), row(3, 'stale', null), row(3, 'brimmed', 1.2)], at);
    expect(verdicts.map((v) => [v.sketchId, v.level, v.judgement?.load ?? null])).toEqual([[1, 'unreachable', null], [2, 'watch', 0.95], [3, 'brimmed', 1.2]]);
  });
});
