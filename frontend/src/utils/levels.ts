// How each health level of DESIGN.md is shown: the shape that carries its
// meaning beside the colour, so nothing depends on colour alone.
import type { HealthLevel } from '@brimwatch/maths';

export type Level = HealthLevel;

export const LEVEL_SHAPE: Record<Level, string> = {
  clear: '○',
  watch: '◔',
  brimmed: '●',
  stale: '◌',
  unreachable: '⊘',
};

export const LEVEL_MEANING: Record<Level, string> = {
  clear: 'load below the watch line',
  watch: 'load at or above the watch line',
  brimmed: 'the error budget no longer holds at the target confidence',
  stale: 'no good reading for 3 scrape intervals',
  unreachable: 'the last scrapes failed',
};
