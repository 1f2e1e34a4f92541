import type { Knex } from 'knex';
import { sketchDetail } from '../services/sketches/detail';
import { updateAlert, type AlertRecord } from './alert-store';
import { recordAlertEvent } from './alert-events';
import { composeAlertMail } from './email/alert-email';
import { decideNotice, type NoticeDecision } from './notify-decision';
import { enqueueMail } from './outbox';
import { quietSpansOver, type SketchPlace } from './quiet-spans';
import { recipientsOf } from './recipients';
import type { AlertSettings } from './settings';

/**
 * Asks the notice rule about one alert (locked by the caller) and, when it
 * says yes, writes the e-mail to the outbox, the notice to the alert and its
 * timeline, all in the caller's transaction.
 */
export async function sendNoticeIfDue(
  trx: Knex.Transaction,
  alert: AlertRecord,
  place: SketchPlace,
  now: Date,
  settings: AlertSettings,
): Promise<NoticeDecision> {
  // Quiet windows only ever hold a notice back: when nothing is owed, they need not be read.
  const unquiet = decideNotice({ alert, last: alert.last, quiet: [], now, settings });
  if (!unquiet.notify) return unquiet;
  const decision = decideNotice({ alert, last: alert.last, quiet: await quietSpansOver(trx, place, now), now, settings });
  if (!decision.notify) return decision;

  const detail = await sketchDetail(trx, place.sketchId, now);
  const mail = composeAlertMail({
    alert,
    kind: decision.kind,
    escalate: decision.escalate,
    facts: { ...detail, instanceCount: detail.instances.length },
    publicUrl: settings.publicUrl,
    now,
  });
  const recipients = await recipientsOf(trx, place.teamId, decision.escalate);
  const mailId = recipients.length
    ? await enqueueMail(trx, { kind: 'alert', alertId: alert.id, teamId: place.teamId, recipients, ...mail }, now)
    : null;

  const firstEscalation = decision.escalate && alert.escalatedAt === null;
  await updateAlert(trx, alert.id, {
    last_notified_at: now,
    last_notified_level: alert.level,
    last_notified_kind: decision.kind,
    ...(firstEscalation ? { escalated_at: now } : {}),
  });
  const base = { alertId: alert.id, sketchId: place.sketchId, at: now, level: alert.level, actor: 'system' as const };
  if (firstEscalation) {
    await recordAlertEvent(trx, { ...base, kind: 'escalated', note: `brimmed and unacknowledged since ${alert.levelSince.toISOString()}; the escalation address is added` });
  }
  const note = recipients.length
    ? `${decision.kind}: ${decision.reason}; to ${recipients.join(', ')}`
    : `${decision.kind}: ${decision.reason}; nobody to tell: the team has no alert address and no member asked for alert mail`;
  await recordAlertEvent(trx, { ...base, kind: 'notified', note, mailId });
  return decision;
}
