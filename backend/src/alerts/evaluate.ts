import type { Knex } from 'knex';
import type { HealthLevel } from '../maths/health-levels';
import { alertById, alertFromRow, insertAlert, liveAlertOf, lockSketchPlace, updateAlert, type AlertRecord } from './alert-store';
import { recordAlertEvent } from './alert-events';
import { stepAlert, type SketchObservation } from './alert-step';
import { decideNotice } from './notify-decision';
import { systemClock, type Clock } from './clock';
import { formatLoad, formatWhen } from './email/figures';
import { sendNoticeIfDue } from './notice';
import { defaultAlertSettings, type AlertSettings } from './settings';

/** One sketch as the collector just judged it: its level (worst instance) and that judgement (null without a good reading). */
export interface SketchJudged {
  sketchId: number;
  level: HealthLevel;
  /** The collectors' Judgement; only `load` and `watchLine` are read here, the e-mail reads the stored status. */
  judgement: { load?: number | null; watchLine?: number | null } | null;
  at: Date | string;
}

/**
 * The hook the collector calls, in the transaction that stored a round's
 * readings and target status, for every sketch whose level it (re)judged.
 * Each sketch's alert follows its level (alert-step.ts: open, follow, settle,
 * resolve), and any notice that is due goes to the outbox in this same
 * transaction, so an alert change and its e-mail commit or roll back together.
 *
 * Most sketches in a round have nothing to do: clear with no alert, or an
 * alert already at their level with no notice owed. One unlocked read of the
 * sketches' live alerts finds them, and only the rest are locked and stepped,
 * under a savepoint of their own. A sketch passed over on a read that another
 * collector is changing at that moment is simply looked at again next round.
 */
export async function evaluateSketchAlerts(
  trx: Knex.Transaction,
  judged: readonly SketchJudged[],
  clock: Clock = systemClock,
  settings: AlertSettings = defaultAlertSettings(),
): Promise<void> {
  if (judged.length === 0) return;
  const now = clock.now();
  const { rows } = await trx.raw(
    `select s.id as judged_sketch_id, s.watch_line as sketch_watch_line, a.*
     from sketches s left join alerts a on a.sketch_id = s.id and a.state <> 'resolved'
     where s.id = any(?::bigint[])`,
    [judged.map((j) => Number(j.sketchId))],
  );
  const known = new Map<number, { watchLine: number; live: AlertRecord | null }>(
    rows.map((r: { judged_sketch_id: number; sketch_watch_line: number; id: number | null }) => [
      Number(r.judged_sketch_id),
      { watchLine: Number(r.sketch_watch_line), live: r.id === null ? null : alertFromRow(r as Record<string, unknown>) },
    ]),
  );
  // A sketch deleted since it was judged took its alerts with it.
  const acting = judged.filter((j) => {
    const k = known.get(Number(j.sketchId));
    return k !== undefined && mayAct(observationOf(j, k.watchLine), k.live, now, settings);
  });
  if (acting.length === 0) return;
  // One order for the sketch locks, so two collectors never wait on each other in a circle.
  const ordered = [...acting].sort((a, b) => Number(a.sketchId) - Number(b.sketchId));
  await trx.transaction(async (savepoint) => {
    for (const item of ordered) await evaluateOne(savepoint, item, now, settings);
  });
}

function observationOf(item: SketchJudged, sketchWatchLine: number): SketchObservation {
  return {
    level: item.level,
    load: typeof item.judgement?.load === 'number' ? item.judgement.load : null,
    watchLine: item.judgement?.watchLine ?? sketchWatchLine,
    at: new Date(item.at),
  };
}

/**
 * Whether stepping a sketch's alert could change anything now: a step to
 * take (open, follow, settle, resolve) or a notice owed. Quiet windows are
 * left out: they can only hold a notice back, so this errs towards acting.
 */
export function mayAct(obs: SketchObservation, live: AlertRecord | null, now: Date, settings: AlertSettings): boolean {
  if (stepAlert(live, obs, settings).action !== 'none') return true;
  return live !== null && decideNotice({ alert: live, last: live.last, quiet: [], now, settings }).notify;
}

/** Locks the sketch, reads its live alert again under the lock, steps it and sends what is owed. */
async function evaluateOne(trx: Knex.Transaction, item: SketchJudged, now: Date, settings: AlertSettings): Promise<void> {
  const sketchId = Number(item.sketchId);
  const place = await lockSketchPlace(trx, sketchId);
  if (!place) return; // deleted since it was read: its alerts went with it
  const obs = observationOf(item, place.watchLine);
  const alert = await applyStep(trx, sketchId, await liveAlertOf(trx, sketchId), obs, settings);
  if (alert) await sendNoticeIfDue(trx, alert, place, now, settings);
}

/** Stores what the lifecycle decided and returns the alert as it now stands. */
async function applyStep(
  trx: Knex.Transaction,
  sketchId: number,
  alert: AlertRecord | null,
  obs: SketchObservation,
  settings: AlertSettings,
): Promise<AlertRecord | null> {
  const step = stepAlert(alert, obs, settings);
  const load = obs.load === null ? 'no load reading' : `load ${formatLoad(obs.load)}`;
  if (step.action === 'open') {
    const opened = await insertAlert(trx, sketchId, step.level, obs.at);
    await recordAlertEvent(trx, { alertId: opened.id, sketchId: opened.sketchId, at: obs.at, kind: 'opened', level: step.level, actor: 'system', note: `opened at ${step.level}, ${load}`, after: opened });
    return opened;
  }
  if (alert === null || step.action === 'none') return alert;
  if (step.action === 'change_level') {
    await updateAlert(trx, alert.id, { level: step.level, level_since: obs.at, clear_since: null });
    await recordAlertEvent(trx, { alertId: alert.id, sketchId: alert.sketchId, at: obs.at, kind: 'level_changed', level: step.level, actor: 'system', note: `${alert.level} → ${step.level}, ${load}`, before: { level: alert.level }, after: { level: step.level } });
  } else if (step.action === 'start_settling') {
    await updateAlert(trx, alert.id, { clear_since: step.since });
  } else if (step.action === 'stop_settling') {
    await updateAlert(trx, alert.id, { clear_since: null });
  } else {
    await resolveAlert(trx, alert, obs.at, `clear since ${formatWhen(step.clearSince)} with the load below the watch line less the band; ${load}`);
  }
  return alertById(trx, alert.id);
}

export async function resolveAlert(trx: Knex.Transaction, alert: AlertRecord, at: Date, note: string): Promise<void> {
  await updateAlert(trx, alert.id, { state: 'resolved', resolved_at: at });
  await recordAlertEvent(trx, { alertId: alert.id, sketchId: alert.sketchId, at, kind: 'resolved', level: alert.level, actor: 'system', note, before: { state: alert.state }, after: { state: 'resolved' } });
}
