import type { Knex } from 'knex';
import type { Alert, AlertEvent } from '../api-types';
import { severitySql } from '../queries/level-order';
import type { Q } from './alert-store';

export interface AlertFilter {
  states: string[];
  levels: string[];
  teamId?: number;
  service?: string;
  sketchId?: number;
  alertId?: number;
  limit: number;
  now: Date;
}

const iso = (v: unknown) => (v === null || v === undefined ? null : new Date(v as string).toISOString());

function viewOf(r: Record<string, unknown>): Alert {
  return {
    id: Number(r.id),
    sketchId: Number(r.sketch_id),
    sketch: String(r.sketch),
    service: String(r.service),
    team: String(r.team),
    teamName: String(r.team_name),
    state: r.state as Alert['state'],
    level: String(r.level) as Alert['level'],
    load: r.load === null ? null : Number(r.load),
    openedAt: iso(r.opened_at) as string,
    levelSince: iso(r.level_since) as string,
    clearSince: iso(r.clear_since),
    acknowledgedAt: iso(r.acknowledged_at),
    acknowledgedBy: r.ack_login ? { login: String(r.ack_login), name: String(r.ack_name) } : null,
    acknowledgeNote: (r.acknowledge_note as string | null) ?? null,
    resolvedAt: iso(r.resolved_at),
    escalatedAt: iso(r.escalated_at),
    lastNotifiedAt: iso(r.last_notified_at),
    lastNotifiedKind: (r.last_notified_kind as string | null) ?? null,
    quietUntil: r.state === 'resolved' ? null : iso(r.quiet_until),
  };
}

/** Live alerts first, worst level first, unacknowledged before acknowledged, oldest first; then resolved ones, newest first. */
export async function findAlerts(q: Q, f: AlertFilter): Promise<Alert[]> {
  const query = q('alerts as a')
    .join('sketches as s', 's.id', 'a.sketch_id')
    .join('services as sv', 'sv.id', 's.service_id')
    .join('teams as t', 't.id', 's.team_id')
    .leftJoin('users as u', 'u.id', 'a.acknowledged_by')
    .select('a.*', 's.name as sketch', 'sv.name as service', 't.slug as team', 't.name as team_name', 'u.login as ack_login', 'u.name as ack_name')
    .select(q.raw(`(select max((ts.judgement->>'load')::float8) from target_status ts where ts.sketch_id = a.sketch_id) as load`))
    .select(
      q.raw(
        `(select max(w.ends_at) from quiet_windows w where w.cancelled_at is null and w.starts_at <= ? and w.ends_at > ?
          and ((w.scope = 'sketch' and w.sketch_id = s.id) or (w.scope = 'service' and w.service_id = s.service_id)
            or (w.scope = 'team' and w.team_id = s.team_id))) as quiet_until`,
        [f.now, f.now],
      ),
    )
    .whereIn('a.state', f.states)
    .orderByRaw(
      `(a.state = 'resolved'), case when a.state <> 'resolved' then ${severitySql('a.level')} end desc nulls last,
       (a.state = 'acknowledged'), a.resolved_at desc nulls first, a.level_since, a.id`,
    )
    .limit(f.limit);
  if (f.levels.length) query.whereIn('a.level', f.levels);
  if (f.teamId !== undefined) query.where('s.team_id', f.teamId);
  if (f.service !== undefined) query.where('sv.name', f.service);
  if (f.sketchId !== undefined) query.where('a.sketch_id', f.sketchId);
  if (f.alertId !== undefined) query.where('a.id', f.alertId);
  return (await query).map(viewOf);
}

/** The timelines of some alerts, oldest step first, each notice with how its e-mail fared. */
export async function eventsOf(q: Q | Knex, alertIds: number[]): Promise<Map<number, AlertEvent[]>> {
  const rows = await q('alert_events as e')
    .leftJoin('mail_outbox as m', 'm.id', 'e.mail_id')
    .whereIn('e.alert_id', alertIds)
    .orderBy([{ column: 'e.at' }, { column: 'e.id' }])
    .select('e.*', 'm.subject', 'm.recipients', 'm.attempts', 'm.sent_at', 'm.next_attempt_at', 'm.last_error');
  const byAlert = new Map<number, AlertEvent[]>(alertIds.map((id) => [id, []]));
  for (const r of rows) {
    byAlert.get(Number(r.alert_id))?.push({
      id: Number(r.id),
      at: iso(r.at) as string,
      kind: r.kind,
      level: r.level,
      actor: r.actor,
      note: r.note,
      mail:
        r.mail_id === null
          ? null
          : { id: Number(r.mail_id), subject: r.subject, recipients: r.recipients, attempts: r.attempts, sentAt: iso(r.sent_at), nextAttemptAt: r.sent_at ? null : iso(r.next_attempt_at), lastError: r.last_error },
    });
  }
  return byAlert;
}
