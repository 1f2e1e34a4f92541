import type { Knex } from 'knex';
import type { HealthLevel } from '../maths/health-levels';
import { alertById, insertAlert, liveAlertOf, lockSketchPlace, updateAlert, type AlertRecord } from './alert-store';
import { recordAlertEvent } from './alert-events';
import { stepAlert, type SketchObservation } from './alert-step';
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
 */
export async function evaluateSketchAlerts(
  trx: Knex.Transaction,
  judged: readonly SketchJudged[],
  clock: Clock = systemClock,
  settings: AlertSettings = defaultAlertSettings(),
): Promise<void> {
  // A clear sketch without a live alert has nothing to step (stepAlert gives 'none'); most of a fleet is
  // clear, so one query spares their locks and lookups. An alert another collector opens meanwhile
  // is seen on its next round.
  const quiet = judged.filter((j) => j.level === 'clear').map((j) => Number(j.sketchId));
  const live = new Set<number>(
    quiet.length === 0 ? [] : (await trx('alerts').whereIn('sketch_id', quiet).whereNot({ state: 'resolved' }).pluck('sketch_id')).map(Number),
  );
  const due = judged.filter((j) => j.level !== 'clear' || live.has(Number(j.sketchId)));
  // One order for the sketch locks, so two collectors never wait on each other in a circle.
  const ordered = [...due].sort((a, b) => Number(a.sketchId) - Number(b.sketchId));
  for (const item of ordered) await evaluateOne(trx, item, clock.now(), settings);
}

async function evaluateOne(trx: Knex.Transaction, item: SketchJudged, now: Date, settings: AlertSettings): Promise<void> {
  const sketchId = Number(item.sketchId);
  const place = await lockSketchPlace(trx, sketchId);
  if (!place) return; // deleted since it was read: its alerts went with it
  const obs: SketchObservation = {
    level: item.level,
    load: typeof item.judgement?.load === 'number' ? item.judgement.load : null,
    watchLine: item.judgement?.watchLine ?? place.watchLine,
    at: new Date(item.at),
  };
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
