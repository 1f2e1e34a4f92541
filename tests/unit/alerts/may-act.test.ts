import { describe, expect, it } from 'vitest';
import { mayAct } from '../../../backend/src/alerts/evaluate';
import type { AlertRecord } from '../../../backend/src/alerts/alert-store';
import type { SketchObservation } from '../../../backend/src/alerts/alert-step';
import type { AlertSettings } from '../../../backend/src/alerts/settings';
import type { HealthLevel } from '../../../backend/src/maths/health-levels';

const T0 = new Date('2026-12-01T08:00:00Z');
const at = (minutes: number) => new Date(T0.getTime() + minutes * 60_000);
const HOUR = 60;

// The shipped defaults (config.ts): repeats brimmed 4 h, unreachable 4 h, stale 12 h, watch 24 h; escalation after
// 30 min; 15 min of settling; a band of 5 points below the watch line.
const settings: AlertSettings = {
  repeatMs: { brimmed: 4 * 3_600_000, unreachable: 4 * 3_600_000, stale: 12 * 3_600_000, watch: 24 * 3_600_000 },
  escalationDelayMs: 30 * 60_000,
  settlingMs: 15 * 60_000,
  clearBand: 0.05,
  retryBaseMs: 30_000,
  retryMaxMs: 30 * 60_000,
  publicUrl: 'http://127.0.0.1:8080',
  from: 'Brimwatch <brimwatch@brimwatch.test>',
};

const seen = (level: HealthLevel, load: number | null, minutes: number): SketchObservation => ({ level, load, watchLine: 0.8, at: at(minutes) });
const alert = (over: Partial<AlertRecord> = {}): AlertRecord => ({
  id: 1,
  sketchId: 7,
  state: 'open',
  level: 'watch',
  openedAt: T0,
  levelSince: T0,
  clearSince: null,
  acknowledgedAt: null,
  acknowledgedBy: null,
  acknowledgeNote: null,
  resolvedAt: null,
  escalatedAt: null,
  last: { at: T0, level: 'watch', kind: 'opened' },
  ...over,
});

describe('whether a judged sketch needs its alert stepped (the batch writer skips the rest without a lock)', () => {
  it('when a sketch is clear and has no alert, then there is nothing to do', () => {
    expect(mayAct(seen('clear', 0.4, 5), null, at(5), settings)).toBe(false);
  });

  it('when a sketch reaches watch with no alert, then an alert must open', () => {
    expect(mayAct(seen('watch', 0.85, 5), null, at(5), settings)).toBe(true);
  });

  it('when a watch alert sees watch again an hour after it was told, then there is nothing to do', () => {
    expect(mayAct(seen('watch', 0.86, HOUR), alert(), at(HOUR), settings)).toBe(false);
  });

  it('when a watch alert was told 24 h ago and nobody acknowledged it, then a reminder is owed', () => {
    expect(mayAct(seen('watch', 0.86, 24 * HOUR), alert(), at(24 * HOUR), settings)).toBe(true);
  });

  it('when a watch alert sees brimmed, then its level must change', () => {
    expect(mayAct(seen('brimmed', 1.02, 10), alert(), at(10), settings)).toBe(true);
  });

  it('when a brimmed alert stays unacknowledged for 30 min, then it must escalate', () => {
    const brimmed = alert({ level: 'brimmed', last: { at: T0, level: 'brimmed', kind: 'opened' } });
    expect(mayAct(seen('brimmed', 1.05, 29), brimmed, at(29), settings)).toBe(false);
    expect(mayAct(seen('brimmed', 1.05, 30), brimmed, at(30), settings)).toBe(true);
  });

  it('when a watch alert sees the load fall well below the line, then settling must start', () => {
    // 0.70 is below the watch line (0.8) less the band (0.05).
    expect(mayAct(seen('clear', 0.7, 10), alert(), at(10), settings)).toBe(true);
  });

  it('when a watch alert sees clear just under the line, inside the band, then there is nothing to do', () => {
    expect(mayAct(seen('clear', 0.78, 10), alert(), at(10), settings)).toBe(false);
  });
});
