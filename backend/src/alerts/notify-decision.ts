import { severity } from '../maths/health-levels';
import type { AlertLevel } from '../api-types';

export type AlertState = 'open' | 'acknowledged' | 'resolved';

/** What a notice says: the alert opened, rose, is still there, went unacknowledged too long, or is over. */
export type NoticeKind = 'opened' | 'rose' | 'repeat' | 'escalated' | 'resolved';

export interface AlertForNotice {
  state: AlertState;
  level: AlertLevel;
  /** When the alert reached its current level (escalation counts from here). */
  levelSince: Date;
  escalatedAt: Date | null;
}

export interface LastNotice {
  at: Date;
  level: AlertLevel;
  kind: NoticeKind;
}

export interface QuietSpan {
  startsAt: Date;
  endsAt: Date;
}

export interface NoticeSettings {
  repeatMs: Record<AlertLevel, number>;
  escalationDelayMs: number;
}

export interface NoticeInput {
  alert: AlertForNotice;
  last: LastNotice | null;
  quiet: readonly QuietSpan[];
  now: Date;
  settings: NoticeSettings;
}

export type NoticeDecision =
  | { notify: true; kind: NoticeKind; escalate: boolean; reason: string }
  | { notify: false; reason: string; heldUntil?: Date };

const at = (date: Date) => date.toISOString();

/** The end of the quiet window in force now, or null when none is. Overlapping windows hold until the last ends. */
export function quietUntil(quiet: readonly QuietSpan[], now: Date): Date | null {
  let until: Date | null = null;
  for (const span of quiet) {
    if (span.startsAt <= now && now < span.endsAt && (until === null || span.endsAt > until)) until = span.endsAt;
  }
  return until;
}

/** A brimmed alert nobody has acknowledged within the delay also goes to the team's escalation address. */
export function escalationDue(alert: AlertForNotice, now: Date, delayMs: number): boolean {
  return alert.state === 'open' && alert.level === 'brimmed' && now.getTime() - alert.levelSince.getTime() >= delayMs;
}

type Trigger = { kind: NoticeKind; reason: string } | { kind: null; reason: string };

function triggerOf({ alert, last, now, settings }: NoticeInput): Trigger {
  if (alert.state === 'resolved') {
    if (last === null) return { kind: null, reason: 'the team was never told of this alert, so no all-clear is owed' };
    if (last.kind === 'resolved') return { kind: null, reason: 'the all-clear was already sent' };
    return { kind: 'resolved', reason: 'the alert resolved' };
  }
  if (last === null) return { kind: 'opened', reason: `the alert opened at level ${alert.level}` };
  if (severity(alert.level) > severity(last.level)) return { kind: 'rose', reason: `the level rose from ${last.level} to ${alert.level}` };
  if (escalationDue(alert, now, settings.escalationDelayMs) && alert.escalatedAt === null) {
    return { kind: 'escalated', reason: `brimmed and unacknowledged since ${at(alert.levelSince)}` };
  }
  if (alert.state === 'acknowledged') return { kind: null, reason: 'acknowledged: only a rise in level is sent' };
  const due = new Date(last.at.getTime() + settings.repeatMs[alert.level]);
  if (now >= due) return { kind: 'repeat', reason: `still ${alert.level}, last told at ${at(last.at)}` };
  return { kind: null, reason: `nothing new; the next reminder is due at ${at(due)}` };
}

/**
 * Whether to e-mail about an alert now, and why. Notices go out on open, on a
 * rise in level (a fall, or a return to a level already told, is not news),
 * on escalation, on resolve (only if the team heard of the alert), and as
 * reminders after the level's repeat interval while nobody has acknowledged.
 * A quiet window holds every notice; the reminder logic sends what is still
 * due once it ends.
 */
export function decideNotice(input: NoticeInput): NoticeDecision {
  const trigger = triggerOf(input);
  if (trigger.kind === null) return { notify: false, reason: trigger.reason };
  const until = quietUntil(input.quiet, input.now);
  if (until !== null) return { notify: false, reason: `${trigger.reason}, but a quiet window holds e-mail until ${at(until)}`, heldUntil: until };
  const escalate = input.alert.state !== 'resolved' && escalationDue(input.alert, input.now, input.settings.escalationDelayMs);
  return { notify: true, kind: trigger.kind, escalate, reason: trigger.reason };
}
