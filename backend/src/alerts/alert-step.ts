import type { HealthLevel } from '../maths/health-levels';
import type { AlertLevel } from '../api-types';

/** What the lifecycle needs to know of a live (open or acknowledged) alert. */
export interface LiveAlertState {
  level: AlertLevel;
  levelSince: Date;
  /** Since when the sketch has been calmly clear; null while it is not. */
  clearSince: Date | null;
}

/** One judgement of a sketch: its level (worst instance) and, when a good reading exists, its load. */
export interface SketchObservation {
  level: HealthLevel;
  load: number | null;
  watchLine: number;
  at: Date;
}

export interface StepSettings {
  settlingMs: number;
  clearBand: number;
}

export type AlertStep =
  | { action: 'none' }
  | { action: 'open'; level: AlertLevel }
  | { action: 'change_level'; level: AlertLevel }
  /** The sketch is calmly clear: start (or keep) the settling clock. */
  | { action: 'start_settling'; since: Date }
  /** It was settling, but the load came back within the band: the clock stops. */
  | { action: 'stop_settling' }
  | { action: 'resolve'; clearSince: Date };

/**
 * The level a live alert holds, given a new observation. Hysteresis: a live
 * alert lets go of a line only once the load is a band below it, so a sketch
 * hovering at its watch line (or at its brim) keeps one alert at one level
 * instead of flipping every scrape. Stale and unreachable carry no load and
 * are taken as they come.
 */
export function heldLevel(alert: AlertLevel, obs: SketchObservation, band: number): HealthLevel {
  if (obs.load === null) return obs.level;
  const nearBrim = alert === 'brimmed' && obs.load >= 1 - band;
  if (obs.level === 'watch' && nearBrim) return 'brimmed';
  if (obs.level === 'clear' && obs.load >= obs.watchLine - band) return nearBrim ? 'brimmed' : 'watch';
  return obs.level;
}

/** True once a sketch that is calmly clear has stayed so for the settling period. */
export function isSettled(clearSince: Date | null, now: Date, settlingMs: number): boolean {
  return clearSince !== null && now.getTime() - clearSince.getTime() >= settlingMs;
}

/**
 * The next step of a sketch's alert: open one when the sketch leaves clear,
 * follow its level while live, and resolve it only after the settling period
 * of calm (clear, and the load a band below the watch line).
 */
export function stepAlert(alert: LiveAlertState | null, obs: SketchObservation, settings: StepSettings): AlertStep {
  if (alert === null) return obs.level === 'clear' ? { action: 'none' } : { action: 'open', level: obs.level };

  const level = heldLevel(alert.level, obs, settings.clearBand);
  if (level === 'clear') {
    if (alert.clearSince === null) return { action: 'start_settling', since: obs.at };
    if (isSettled(alert.clearSince, obs.at, settings.settlingMs)) return { action: 'resolve', clearSince: alert.clearSince };
    return { action: 'none' };
  }
  if (level !== alert.level) return { action: 'change_level', level };
  return alert.clearSince === null ? { action: 'none' } : { action: 'stop_settling' };
}
