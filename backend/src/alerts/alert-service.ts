import type { Alert, AlertDetail, AlertWithEvents } from '../api-types';
import type { Caller } from '../auth/caller';
import type { Db } from '../db';
import { AppError } from '../http/errors';
import { findTeam } from '../queries/sketches';
import { alertById, updateAlert } from './alert-store';
import { recordAlertEvent } from './alert-events';
import { eventsOf, findAlerts } from './alert-views';

export type AlertStateFilter = 'live' | 'open' | 'acknowledged' | 'resolved' | 'all';

const STATES: Record<AlertStateFilter, string[]> = {
  live: ['open', 'acknowledged'],
  open: ['open'],
  acknowledged: ['acknowledged'],
  resolved: ['resolved'],
  all: ['open', 'acknowledged', 'resolved'],
};

export interface AlertListInput {
  state: AlertStateFilter;
  level: string[];
  team?: string;
  service?: string;
  sketch?: number;
  limit: number;
}

export async function teamIdOf(db: Db, team: string): Promise<number> {
  const found = await findTeam(db, team);
  if (found) return Number(found.id);
  const slugs: string[] = await db('teams').orderBy('slug').pluck('slug');
  throw new AppError(400, 'unknown_team', `There is no team '${team}'; use the slug of one of ${slugs.join(', ') || '(none yet: an admin creates teams)'}.`, 'team');
}

export async function listAlerts(db: Db, input: AlertListInput, now: Date): Promise<{ alerts: Alert[] }> {
  const teamId = input.team === undefined ? undefined : await teamIdOf(db, input.team);
  const alerts = await findAlerts(db, { states: STATES[input.state], levels: input.level, teamId, service: input.service, sketchId: input.sketch, limit: input.limit, now });
  return { alerts };
}

function notFound(id: number): AppError {
  return new AppError(404, 'alert_not_found', `There is no alert with id ${id}; GET /api/v1/alerts lists the open ones.`, 'id');
}

export async function alertDetail(db: Db, id: number, now: Date): Promise<AlertDetail> {
  const [alert] = await findAlerts(db, { states: STATES.all, levels: [], alertId: id, limit: 1, now });
  if (!alert) throw notFound(id);
  return { alert, events: (await eventsOf(db, [id])).get(id) ?? [] };
}

/** The sketch page's alert timeline: its alerts, newest first, each with its steps. */
export async function sketchAlerts(db: Db, sketchId: number, now: Date): Promise<{ sketchId: number; alerts: AlertWithEvents[] }> {
  const sketch = await db('sketches').where({ id: sketchId }).first('id');
  if (!sketch) throw new AppError(404, 'sketch_not_found', `There is no sketch with id ${sketchId}; GET /api/v1/sketches lists them.`, 'id');
  const alerts = await findAlerts(db, { states: STATES.all, levels: [], sketchId, limit: 20, now });
  alerts.sort((a, b) => b.openedAt.localeCompare(a.openedAt) || b.id - a.id);
  const events = await eventsOf(db, alerts.map((a) => a.id));
  return { sketchId, alerts: alerts.map((a) => ({ ...a, events: events.get(a.id) ?? [] })) };
}

/**
 * A responder takes the alert: reminders stop (a rise in level is still
 * sent), escalation stops, and who, when and why are kept on the alert, its
 * timeline and the audit log.
 */
export async function acknowledgeAlert(db: Db, caller: Caller, id: number, note: string | null, now: Date): Promise<AlertDetail> {
  await db.transaction(async (trx) => {
    const alert = await alertById(trx, id, 'lock');
    if (!alert) throw notFound(id);
    if (alert.state === 'resolved') {
      throw new AppError(409, 'alert_resolved', `Alert ${id} was resolved at ${alert.resolvedAt?.toISOString()}; there is nothing to acknowledge. If the sketch gets into trouble again, a new alert opens.`);
    }
    if (alert.state === 'acknowledged') {
      const who = alert.acknowledgedBy === null ? null : await trx('users').where({ id: alert.acknowledgedBy }).first('login');
      throw new AppError(409, 'already_acknowledged', `Alert ${id} was already acknowledged by ${who?.login ?? 'someone'} at ${alert.acknowledgedAt?.toISOString()}; nothing changed.`);
    }
    await updateAlert(trx, id, { state: 'acknowledged', acknowledged_at: now, acknowledged_by: caller.id, acknowledge_note: note });
    await recordAlertEvent(trx, {
      alertId: id,
      sketchId: alert.sketchId,
      at: now,
      kind: 'acknowledged',
      level: alert.level,
      actor: caller,
      note: note ?? '',
      before: { state: alert.state },
      after: { state: 'acknowledged', note },
    });
  });
  return alertDetail(db, id, now);
}
