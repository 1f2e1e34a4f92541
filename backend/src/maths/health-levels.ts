import { requireWatchLine } from './errors';

/** The levels a reading of load can give. */
export type LoadLevel = 'clear' | 'watch' | 'brimmed';

/** Every level a sketch can show, including the two that come from scraping rather than maths. */
export type HealthLevel = LoadLevel | 'stale' | 'unreachable';

/**
 * Worst first, the order of the fleet table. `brimmed` leads: the guarantee is
 * known to be gone. `unreachable` comes next because the last scrapes failed
 * outright, so the sketch may be brimmed and nobody can tell; `stale` is the
 * quieter form of the same blindness (no good reading lately, no failure
 * either). `watch` is seen and still within budget; `clear` is fine.
 */
export const HEALTH_LEVELS_WORST_FIRST: readonly HealthLevel[] = ['brimmed', 'unreachable', 'stale', 'watch', 'clear'];

export const DEFAULT_WATCH_LINE = 0.8;

/** Higher is worse: clear 0, watch 1, stale 2, unreachable 3, brimmed 4. */
export function severity(level: HealthLevel): number {
  return HEALTH_LEVELS_WORST_FIRST.length - 1 - HEALTH_LEVELS_WORST_FIRST.indexOf(level);
}

/** For Array.prototype.sort: worst level first. */
export function compareWorstFirst(a: HealthLevel, b: HealthLevel): number {
  return severity(b) - severity(a);
}

export function worstLevel(levels: Iterable<HealthLevel>): HealthLevel | undefined {
  let worst: HealthLevel | undefined;
  for (const level of levels) {
    if (worst === undefined || severity(level) > severity(worst)) worst = level;
  }
  return worst;
}

/** Load is a share of capacity: at 1 the bound reaches the error budget. */
export function levelForLoad(load: number, watchLine: number = DEFAULT_WATCH_LINE): LoadLevel {
  requireWatchLine(watchLine);
  if (load >= 1) return 'brimmed';
  if (load >= watchLine) return 'watch';
  return 'clear';
}
