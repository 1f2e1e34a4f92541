import { describe, expect, it } from 'vitest';
import { decideNotice, quietUntil, type AlertForNotice, type LastNotice, type NoticeInput, type QuietSpan } from '../../../backend/src/alerts/notify-decision';

const T0 = new Date('2026-12-01T08:00:00Z');
const min = (n: number) => new Date(T0.getTime() + n * 60_000);
const hours = (n: number) => min(n * 60);

// The shipped defaults (config.ts): brimmed 4 h, unreachable 4 h, stale 12 h, watch 24 h; escalation after 30 min.
const settings = {
  repeatMs: { brimmed: 4 * 3_600_000, unreachable: 4 * 3_600_000, stale: 12 * 3_600_000, watch: 24 * 3_600_000 },
  escalationDelayMs: 30 * 60_000,
};

const alert = (over: Partial<AlertForNotice> = {}): AlertForNotice => ({ state: 'open', level: 'watch', levelSince: T0, escalatedAt: null, ...over });
const told = (at: Date, level: LastNotice['level'], kind: LastNotice['kind'] = 'opened'): LastNotice => ({ at, level, kind });
const window = (from: Date, to: Date): QuietSpan => ({ startsAt: from, endsAt: to });

interface Case {
  name: string;
  input: Omit<NoticeInput, 'settings'>;
  notify: boolean;
  kind?: string;
  escalate?: boolean;
  heldUntil?: Date;
}

const cases: Case[] = [
  { name: 'when an alert has just opened, then it is sent as opened', input: { alert: alert(), last: null, quiet: [], now: T0 }, notify: true, kind: 'opened', escalate: false },
  { name: 'when the level rises from watch to brimmed, then the rise is sent', input: { alert: alert({ level: 'brimmed', levelSince: hours(2) }), last: told(T0, 'watch'), quiet: [], now: hours(2) }, notify: true, kind: 'rose', escalate: false },
  { name: 'when the level falls from brimmed to watch, then nothing is sent', input: { alert: alert({ level: 'watch', levelSince: min(20) }), last: told(T0, 'brimmed'), quiet: [], now: min(20) }, notify: false },
  { name: 'when a flapping sketch is back at the level already told, then nothing is sent', input: { alert: alert({ level: 'brimmed', levelSince: min(9) }), last: told(min(5), 'brimmed', 'rose'), quiet: [], now: min(10) }, notify: false },
  { name: 'when watch was told 23 h 59 min ago, then no reminder yet', input: { alert: alert(), last: told(T0, 'watch'), quiet: [], now: min(24 * 60 - 1) }, notify: false },
  { name: 'when watch was told 24 h ago and nobody acknowledged, then a reminder goes', input: { alert: alert(), last: told(T0, 'watch'), quiet: [], now: hours(24) }, notify: true, kind: 'repeat' },
  { name: 'when brimmed was told 4 h ago, then a reminder goes (with the escalation address, long past the delay)', input: { alert: alert({ level: 'brimmed', escalatedAt: min(30) }), last: told(T0, 'brimmed'), quiet: [], now: hours(4) }, notify: true, kind: 'repeat', escalate: true },
  { name: 'when brimmed was told 3 h ago, then no reminder yet', input: { alert: alert({ level: 'brimmed', escalatedAt: min(30) }), last: told(T0, 'brimmed'), quiet: [], now: hours(3) }, notify: false },
  { name: 'when stale was told 12 h ago, then a reminder goes', input: { alert: alert({ level: 'stale' }), last: told(T0, 'stale'), quiet: [], now: hours(12) }, notify: true, kind: 'repeat' },
  { name: 'when an acknowledged alert is due a reminder, then none goes', input: { alert: alert({ state: 'acknowledged', level: 'brimmed' }), last: told(T0, 'brimmed'), quiet: [], now: hours(30) }, notify: false },
  { name: 'when an acknowledged alert rises, then the rise is sent', input: { alert: alert({ state: 'acknowledged', level: 'brimmed', levelSince: hours(1) }), last: told(T0, 'watch'), quiet: [], now: hours(1) }, notify: true, kind: 'rose', escalate: false },
  { name: 'when brimmed stays unacknowledged for 29 min, then it does not escalate yet', input: { alert: alert({ level: 'brimmed' }), last: told(T0, 'brimmed'), quiet: [], now: min(29) }, notify: false },
  { name: 'when brimmed stays unacknowledged for 30 min, then it escalates', input: { alert: alert({ level: 'brimmed' }), last: told(T0, 'brimmed'), quiet: [], now: min(30) }, notify: true, kind: 'escalated', escalate: true },
  { name: 'when an acknowledged brimmed alert passes the delay, then it does not escalate', input: { alert: alert({ state: 'acknowledged', level: 'brimmed' }), last: told(T0, 'brimmed'), quiet: [], now: min(45) }, notify: false },
  { name: 'when it already escalated, then the delay does not send again', input: { alert: alert({ level: 'brimmed', escalatedAt: min(30) }), last: told(min(30), 'brimmed', 'escalated'), quiet: [], now: min(40) }, notify: false },
  { name: 'when an alert opens inside a quiet window, then it is held until the window ends', input: { alert: alert(), last: null, quiet: [window(min(-10), hours(2))], now: T0 }, notify: false, heldUntil: hours(2) },
  { name: 'when the quiet window has ended and the alert is still open, then the held opening goes', input: { alert: alert(), last: null, quiet: [], now: hours(2) }, notify: true, kind: 'opened' },
  { name: 'when a window has not started yet, then it holds nothing', input: { alert: alert(), last: null, quiet: [window(hours(1), hours(2))], now: T0 }, notify: true, kind: 'opened' },
  { name: 'when a rise happens in a quiet window, then it is held', input: { alert: alert({ level: 'brimmed' }), last: told(T0, 'watch'), quiet: [window(T0, hours(1))], now: min(5) }, notify: false, heldUntil: hours(1) },
  { name: 'when the alert resolves after the team was told, then the all-clear goes', input: { alert: alert({ state: 'resolved' }), last: told(T0, 'watch'), quiet: [], now: hours(1) }, notify: true, kind: 'resolved', escalate: false },
  { name: 'when the all-clear was already sent, then nothing more goes', input: { alert: alert({ state: 'resolved' }), last: told(hours(1), 'watch', 'resolved'), quiet: [], now: hours(9) }, notify: false },
  { name: 'when the alert resolves and the team never heard of it, then no all-clear goes', input: { alert: alert({ state: 'resolved' }), last: null, quiet: [], now: hours(1) }, notify: false },
  { name: 'when the alert resolves inside a quiet window, then the all-clear waits for its end', input: { alert: alert({ state: 'resolved' }), last: told(T0, 'watch'), quiet: [window(min(30), hours(3))], now: hours(1) }, notify: false, heldUntil: hours(3) },
];

describe('decideNotice', () => {
  for (const c of cases) {
    it(c.name, () => {
      const decision = decideNotice({ ...c.input, settings });
      expect(decision.notify).toBe(c.notify);
      expect(decision.reason.length).toBeGreaterThan(10);
      if (decision.notify) {
        expect(decision.kind).toBe(c.kind);
        if (c.escalate !== undefined) expect(decision.escalate).toBe(c.escalate);
      } else if (c.heldUntil) {
        expect(decision.heldUntil).toEqual(c.heldUntil);
        expect(decision.reason).toMatch(/quiet window/);
      } else {
        expect(decision.heldUntil).toBeUndefined();
      }
    });
  }

  it('when two quiet windows overlap, then e-mail is held until the later one ends', () => {
    expect(quietUntil([window(T0, hours(1)), window(min(30), hours(3))], min(45))).toEqual(hours(3));
    expect(quietUntil([window(T0, hours(1))], hours(1))).toBeNull();
  });
});
