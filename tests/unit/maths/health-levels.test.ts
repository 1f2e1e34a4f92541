import { describe, expect, it } from 'vitest';
import { HEALTH_LEVELS_WORST_FIRST, compareWorstFirst, levelForLoad, severity, worstLevel, type HealthLevel } from '../../../backend/src/maths';

describe('health levels', () => {
  it('when levels are sorted worst first, then brimmed leads and clear trails', () => {
    const levels: HealthLevel[] = ['clear', 'stale', 'brimmed', 'watch', 'unreachable'];
    expect(levels.sort(compareWorstFirst)).toEqual(['brimmed', 'unreachable', 'stale', 'watch', 'clear']);
    expect(HEALTH_LEVELS_WORST_FIRST[0]).toBe('brimmed');
  });

  it('when severities are compared, then each level is strictly worse than the next in the list', () => {
    for (let i = 1; i < HEALTH_LEVELS_WORST_FIRST.length; i++) {
      expect(severity(HEALTH_LEVELS_WORST_FIRST[i - 1])).toBeGreaterThan(severity(HEALTH_LEVELS_WORST_FIRST[i]));
    }
  });

  it('when the worst of a set is asked for, then it is the most severe one, or undefined for none', () => {
    expect(worstLevel(['watch', 'stale', 'clear'])).toBe('stale');
    expect(worstLevel([])).toBeUndefined();
  });

  it('when load sits exactly on a boundary, then the higher level applies (DESIGN.md: "at or above")', () => {
    expect(levelForLoad(0.8)).toBe('watch');
    expect(levelForLoad(1)).toBe('brimmed');
    expect(levelForLoad(0.7999)).toBe('clear');
    expect(levelForLoad(0.95, 0.95)).toBe('watch');
  });
});
