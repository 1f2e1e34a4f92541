import type { Knex } from 'knex';
import type { AlertEventKind, AlertLevel } from '../api-types';
import type { Caller } from '../auth/caller';
import { recordAudit } from '../audit/record';

/** A step to record; the API shows it back as an `AlertEvent`. */
export interface NewAlertEvent {
  alertId: number;
  sketchId: number;
  at: Date;
  kind: AlertEventKind;
  level: AlertLevel;
  actor: Caller | 'system';
  note: string;
  mailId?: number | null;
  /** The audit entry's before/after, when the event changed the alert row. */
  before?: unknown;
  after?: unknown;
}

/** Stores one step of an alert's timeline and its audit entry, in the caller's transaction. */
export async function recordAlertEvent(trx: Knex.Transaction, event: NewAlertEvent): Promise<void> {
  const person = event.actor === 'system' ? null : event.actor;
  await trx('alert_events').insert({
    alert_id: event.alertId,
    sketch_id: event.sketchId,
    at: event.at,
    kind: event.kind,
    level: event.level,
    actor: person ? person.login : 'system',
    actor_user_id: person ? person.id : null,
    note: event.note,
    mail_id: event.mailId ?? null,
  });
  await recordAudit(trx, {
    actor: event.actor,
    action: `alert.${event.kind}`,
    subjectType: 'alert',
    subjectId: event.alertId,
    before: event.before,
    after: event.after ?? { sketchId: event.sketchId, level: event.level, note: event.note },
  });
}
