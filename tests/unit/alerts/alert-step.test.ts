import { describe, expect, it } from 'vitest';
import { heldLevel, stepAlert, type LiveAlertState, type SketchObservation } from '../../../backend/src/alerts/alert-step';
import { decideNotice, type LastNotice } from '../../../backend/src/alerts/notify-decision';
import type { HealthLevel } from '../../../backend/src/maths/health-levels';

const T0 = new Date('2026-12-01T08:00:00Z');
const at = (minutes: number) => new Date(T0.getTime() + minutes * 60_000);
// The shipped defaults: a 15-minute settling period and a band of 5 points (0.05 of capacity).
const settings = { settlingMs: 15 * 60_000, clearBand: 0.05 };
const obs = (level: HealthLevel, load: number | null, minutes: number): SketchObservation => ({ level, load, watchLine: 0.8, at: at(minutes) });
const live = (over: Partial<LiveAlertState> = {}): LiveAlertState => ({ level: 'watch', levelSince: T0, clearSince: null, ...over });

describe('heldLevel (hysteresis)', () => {
  it('when a watch alert sees clear at 78 %, inside the band, then it holds watch', () => {
    expect(heldLevel('watch', obs('clear', 0.78, 1), 0.05)).toBe('watch');
  });
  it('when a watch alert sees clear at 74 %, below the band, then it lets go', () => {
    expect(heldLevel('watch', obs('clear', 0.74, 1), 0.05)).toBe('clear');
  });
  it('when a brimmed alert sees watch at 97 %, then it holds brimmed; at 94 %, watch', () => {
    expect(heldLevel('brimmed', obs('watch', 0.97, 1), 0.05)).toBe('brimmed');
    expect(heldLevel('brimmed', obs('watch', 0.94, 1), 0.05)).toBe('watch');
  });
  it('when the level carries no load (unreachable), then it is taken as it comes', () => {
    expect(heldLevel('brimmed', obs('unreachable', null, 1), 0.05)).toBe('unreachable');
  });
});

describe('stepAlert', () => {
  it('when there is no alert and the sketch is clear, then nothing happens', () => {
    expect(stepAlert(null, obs('clear', 0.5, 0), settings)).toEqual({ action: 'none' });
  });
  it('when there is no alert and the sketch reaches watch, then an alert opens at watch', () => {
    expect(stepAlert(null, obs('watch', 0.81, 0), settings)).toEqual({ action: 'open', level: 'watch' });
  });
  it('when a live alert sees a higher level, then its level changes', () => {
    expect(stepAlert(live(), obs('brimmed', 1.02, 3), settings)).toEqual({ action: 'change_level', level: 'brimmed' });
  });
  it('when the sketch is calmly clear, then settling starts, and it resolves only after 15 minutes of calm', () => {
    expect(stepAlert(live(), obs('clear', 0.6, 10), settings)).toEqual({ action: 'start_settling', since: at(10) });
    expect(stepAlert(live({ clearSince: at(10) }), obs('clear', 0.6, 24), settings)).toEqual({ action: 'none' });
    expect(stepAlert(live({ clearSince: at(10) }), obs('clear', 0.6, 25), settings)).toEqual({ action: 'resolve', clearSince: at(10) });
  });
  it('when the load comes back within the band while settling, then the settling clock stops', () => {
    expect(stepAlert(live({ clearSince: at(10) }), obs('clear', 0.77, 12), settings)).toEqual({ action: 'stop_settling' });
  });

  it('when a sketch hovers around its watch line for two hours, then one alert opens, none resolves, and one e-mail goes', () => {
    // 79 %, 81 %, 79 %, 81 % … every 5 minutes: the flapping input hysteresis exists for.
    let alert: LiveAlertState | null = null;
    let last: LastNotice | null = null;
    const counts = { open: 0, resolve: 0, change_level: 0, mails: 0 };
    for (let i = 0; i < 24; i++) {
      const load = i % 2 === 0 ? 0.79 : 0.81;
      const o = obs(load >= 0.8 ? 'watch' : 'clear', load, 5 * i);
      const step = stepAlert(alert, o, settings);
      if (step.action === 'open') alert = { level: step.level, levelSince: o.at, clearSince: null };
      if (step.action === 'resolve') alert = null;
      if (step.action === 'change_level' && alert) alert = { ...alert, level: step.level };
      if (step.action === 'start_settling' && alert) alert = { ...alert, clearSince: step.since };
      if (step.action === 'stop_settling' && alert) alert = { ...alert, clearSince: null };
      if (step.action in counts) counts[step.action as keyof typeof counts] += 1;
      if (alert) {
        const d = decideNotice({ alert: { state: 'open', escalatedAt: null, ...alert }, last, quiet: [], now: o.at, settings: { repeatMs: { brimmed: 4 * 3_600_000, unreachable: 4 * 3_600_000, stale: 12 * 3_600_000, watch: 24 * 3_600_000 }, escalationDelayMs: 30 * 60_000 } });
        if (d.notify) {
          counts.mails += 1;
          last = { at: o.at, level: alert.level, kind: d.kind };
        }
      }
    }
    expect(counts).toEqual({ open: 1, resolve: 0, change_level: 0, mails: 1 });
    expect(alert?.level).toBe('watch');
  });
});
