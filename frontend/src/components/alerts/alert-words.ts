// How the Alerts page and the sketch's timeline put alerts into words.
import type { Role, SessionUser } from '@/api/auth';
import type { Alert, AlertEvent, AlertEventKind, QuietWindow } from '@brimwatch/api-types';
import { formatRelative } from '@/utils/format';

const RESPONDERS: readonly Role[] = ['responder', 'owner', 'sre', 'admin'];

/** Acknowledging and quieting are for responders and above; the server checks again. */
export function canRespond(user: SessionUser | null): boolean {
  return user !== null && RESPONDERS.includes(user.role);
}

export const EVENT_WORDS: Record<AlertEventKind, string> = {
  opened: 'opened',
  level_changed: 'level changed',
  acknowledged: 'acknowledged',
  resolved: 'resolved',
  notified: 'e-mail',
  escalated: 'escalated',
};

/** A moment in the reader's own zone, to the minute. */
export function localTime(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

/** Where an alert stands, in one line: who took it, whether it is settling, whether mail is held. */
export function alertStatus(alert: Alert, now: Date): string {
  const parts: string[] = [];
  if (alert.state === 'acknowledged') {
    const who = alert.acknowledgedBy?.login ?? 'someone';
    parts.push(`acknowledged by ${who} ${formatRelative(alert.acknowledgedAt ?? alert.openedAt, now)}${alert.acknowledgeNote ? `: “${alert.acknowledgeNote}”` : ''}`);
  } else if (alert.state === 'resolved') {
    parts.push(`resolved ${formatRelative(alert.resolvedAt ?? alert.openedAt, now)}`);
  } else {
    parts.push(alert.escalatedAt ? 'open, escalated' : 'open');
  }
  if (alert.clearSince && alert.state !== 'resolved') parts.push(`clear since ${formatRelative(alert.clearSince, now)}, resolving if it stays so`);
  if (alert.quietUntil) parts.push(`e-mail held by a quiet window until ${localTime(alert.quietUntil)}`);
  return parts.join(' · ');
}

/** How a notice's e-mail fared: sent, or still waiting with its last error. */
export function mailStatus(mail: NonNullable<AlertEvent['mail']>): string {
  const to = mail.recipients.join(', ');
  if (mail.sentAt) return `sent ${localTime(mail.sentAt)} to ${to}`;
  if (mail.attempts === 0) return `waiting to be sent to ${to}`;
  const next = mail.nextAttemptAt ? `; next try ${localTime(mail.nextAttemptAt)}` : '';
  return `not sent yet after ${mail.attempts} ${mail.attempts === 1 ? 'try' : 'tries'} (${mail.lastError ?? 'no reason given'})${next}`;
}

/** What a quiet window covers, in the product's words. */
export function quietTarget(w: QuietWindow): string {
  if (w.scope === 'team') return `team ${w.teamName ?? w.team}`;
  if (w.scope === 'service') return `service ${w.service}`;
  return `sketch ${w.service} / ${w.sketch}`;
}
