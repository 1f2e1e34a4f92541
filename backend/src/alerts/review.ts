import type { Db } from '../db';
import { alertById, alertFromRow } from './alert-store';
import { isSettled } from './alert-step';
import type { Clock } from './clock';
import { resolveAlert } from './evaluate';
import { formatWhen } from './email/figures';
import { sendNoticeIfDue } from './notice';
import { placeOf } from './quiet-spans';
import type { AlertSettings } from './settings';

/** An all-clear held by a quiet window is still sent within this long after the alert resolved. */
const HELD_ALL_CLEAR_DAYS = 7;

/**
 * The periodic pass over alerts, for what no new reading will prompt:
 * reminders that fall due, escalation after the delay, notices held by a quiet
 * window that has ended, and alerts whose settling period ran out since the
 * last reading. Each alert is handled in its own transaction, locked with
 * SKIP LOCKED, so collectors running the same pass share the work.
 */
export async function reviewAlerts(db: Db, clock: Clock, settings: AlertSettings): Promise<number> {
  const now = clock.now();
  const heldSince = new Date(now.getTime() - HELD_ALL_CLEAR_DAYS * 86_400_000);
  const ids: number[] = await db('alerts')
    .whereNot({ state: 'resolved' })
    .orWhere((w) => w.where('resolved_at', '>', heldSince).whereNotNull('last_notified_at').whereNot({ last_notified_kind: 'resolved' }))
    .orderBy('id')
    .pluck('id');
  let notices = 0;
  for (const id of ids) {
    const told = await db.transaction(async (trx) => {
      const row = await trx('alerts').where({ id }).forUpdate().skipLocked().first();
      if (!row) return false;
      let alert = alertFromRow(row);
      const place = await placeOf(trx, alert.sketchId);
      if (!place) return false;
      if (alert.state !== 'resolved' && isSettled(alert.clearSince, now, settings.settlingMs)) {
        await resolveAlert(trx, alert, now, `clear since ${formatWhen(alert.clearSince)} with no reading since to say otherwise`);
        alert = (await alertById(trx, id)) ?? alert;
      }
      return (await sendNoticeIfDue(trx, alert, place, now, settings)).notify;
    });
    if (told) notices += 1;
  }
  return notices;
}
