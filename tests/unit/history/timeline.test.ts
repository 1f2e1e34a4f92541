import { describe, expect, it } from 'vitest';
import { sketchSpans, targetSpans, timeAtLevels, type LevelPoint } from '../../../backend/src/services/history/timeline';

const MIN = 60_000;
const point = (minute: number, level: LevelPoint['level'], extra: Partial<LevelPoint> = {}): LevelPoint => ({
  at: minute * MIN,
  level,
  seenUntil: minute * MIN,
  gapFrom: null,
  staleAfterMs: 3 * MIN,
  last: false,
  ...extra,
});

describe('a target timeline', () => {
  it('when the first point lies before the period, then it sets the level at the start', () => {
    expect(targetSpans([point(-30, 'watch'), point(10, 'clear', { last: true, seenUntil: 59 * MIN })], 0, 60 * MIN)).toEqual([
      { from: 0, to: 10 * MIN, level: 'watch' },
      { from: 10 * MIN, to: 60 * MIN, level: 'clear' },
    ]);
  });

  it('when readings broke off, then the target is stale from three intervals after the last one until the next', () => {
    const spans = targetSpans([point(0, 'clear'), point(20, 'clear', { gapFrom: 5 * MIN, last: true, seenUntil: 59 * MIN })], 0, 60 * MIN);
    expect(spans).toEqual([
      { from: 0, to: 8 * MIN, level: 'clear' },
      { from: 8 * MIN, to: 20 * MIN, level: 'stale' },
      { from: 20 * MIN, to: 60 * MIN, level: 'clear' },
    ]);
  });

  it('when nothing was read before a point, then that time is left without a level', () => {
    expect(targetSpans([point(30, 'brimmed', { last: true, seenUntil: 60 * MIN })], 0, 60 * MIN)).toEqual([
      { from: 0, to: 30 * MIN, level: null },
      { from: 30 * MIN, to: 60 * MIN, level: 'brimmed' },
    ]);
  });
});

describe('a sketch timeline', () => {
  it('when replicas differ, then each moment takes the worse by the severity order, and an unread replica does not count', () => {
    const a = [
      { from: 0, to: 30 * MIN, level: 'clear' as const },
      { from: 30 * MIN, to: 60 * MIN, level: 'watch' as const },
    ];
    const b = [
      { from: 0, to: 10 * MIN, level: null },
      { from: 10 * MIN, to: 20 * MIN, level: 'stale' as const },
      { from: 20 * MIN, to: 60 * MIN, level: 'clear' as const },
    ];
    const spans = sketchSpans([a, b], 0, 60 * MIN);
    // DESIGN.md: brimmed, unreachable, stale, watch, clear, worst first.
    expect(spans).toEqual([
      { from: 0, to: 10 * MIN, level: 'clear' },
      { from: 10 * MIN, to: 20 * MIN, level: 'stale' },
      { from: 20 * MIN, to: 30 * MIN, level: 'clear' },
      { from: 30 * MIN, to: 60 * MIN, level: 'watch' },
    ]);
    expect(timeAtLevels(spans)).toEqual({ clear: 1200, stale: 600, watch: 1800, brimmed: 0, unreachable: 0 });
  });

  it('when a sketch has no target read at all, then the whole period is one span without a level', () => {
    expect(sketchSpans([], 0, 60 * MIN)).toEqual([{ from: 0, to: 60 * MIN, level: null }]);
    expect(timeAtLevels([{ from: 0, to: 60 * MIN, level: null }])).toEqual({ clear: 0, watch: 0, brimmed: 0, stale: 0, unreachable: 0 });
  });
});
