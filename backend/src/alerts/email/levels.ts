import type { HealthLevel } from '../../maths/health-levels';

/** Each level's shape (LOOK.md), so a level never depends on colour alone, not even in plain text. */
export const LEVEL_SHAPE: Record<HealthLevel, string> = {
  clear: '○',
  watch: '◔',
  brimmed: '●',
  stale: '◌',
  unreachable: '⊘',
};

/** What the level means for the team, in a sentence for the top of the message. */
export const LEVEL_SENTENCE: Record<HealthLevel, string> = {
  clear: 'The sketch is back below its watch line.',
  watch: 'The load is at or above the watch line, or the trend brims within the lead time: plan a resize.',
  brimmed: 'The error budget no longer holds at the target confidence: estimates may overcount by more than the budget.',
  stale: 'No good reading for 3 scrape intervals: Brimwatch cannot tell how full the sketch is.',
  unreachable: 'The last scrapes failed: the sketch may be filling and nobody can see it.',
};

export const LEVEL_COLOUR: Record<HealthLevel, { fill: string; ink: string; border: string }> = {
  clear: { fill: '#3f7f7a', ink: '#ffffff', border: '#3f7f7a' },
  watch: { fill: '#c98a12', ink: '#1e2326', border: '#c98a12' },
  brimmed: { fill: '#a83a2c', ink: '#ffffff', border: '#a83a2c' },
  stale: { fill: '#fffdf8', ink: '#1e2326', border: '#8a8f93' },
  unreachable: { fill: '#6e5a78', ink: '#ffffff', border: '#6e5a78' },
};

export const CAUTION =
  'The guarantee is probabilistic and assumes independent hash functions and non-negative updates. ' +
  'An undersized sketch overcounts, so a limiter built on it throttles innocent keys and a billing counter overcharges. ' +
  "Brimwatch's figures guide sizing; the service's own tests and load tests decide.";
