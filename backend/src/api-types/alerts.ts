import type { HealthLevel } from '../maths/health-levels';

export type AlertState = 'open' | 'acknowledged' | 'resolved';

/** An alert is raised for every level but clear. */
export type AlertLevel = Exclude<HealthLevel, 'clear'>;

export interface Alert {
  id: number;
  sketchId: number;
  sketch: string;
  service: string;
  team: string;
  teamName: string;
  state: AlertState;
  level: AlertLevel;
  /** The fullest instance's load now, as a fraction of capacity. */
  load: number | null;
  openedAt: string;
  levelSince: string;
  clearSince: string | null;
  acknowledgedAt: string | null;
  acknowledgedBy: { login: string; name: string } | null;
  acknowledgeNote: string | null;
  resolvedAt: string | null;
  escalatedAt: string | null;
  lastNotifiedAt: string | null;
  lastNotifiedKind: string | null;
  /** When a quiet window in force now over this sketch ends; e-mail waits until then. */
  quietUntil: string | null;
}

export type AlertEventKind = 'opened' | 'level_changed' | 'acknowledged' | 'resolved' | 'notified' | 'escalated';

/** One step of an alert's timeline; a notice carries how its e-mail fared. */
export interface AlertEvent {
  id: number;
  at: string;
  kind: AlertEventKind;
  level: AlertLevel;
  actor: string;
  note: string | null;
  mail: { id: number; subject: string; recipients: string[]; attempts: number; sentAt: string | null; nextAttemptAt: string | null; lastError: string | null } | null;
}

/** GET /api/v1/alerts/:id and the answer to acknowledging one. */
export interface AlertDetail {
  alert: Alert;
  events: AlertEvent[];
}

export type AlertWithEvents = Alert & { events: AlertEvent[] };

export type QuietScope = 'sketch' | 'service' | 'team';

export interface QuietWindow {
  id: number;
  scope: QuietScope;
  sketchId: number | null;
  sketch: string | null;
  service: string | null;
  team: string | null;
  teamName: string | null;
  startsAt: string;
  endsAt: string;
  reason: string;
  createdBy: string;
  createdAt: string;
  cancelledAt: string | null;
  cancelledBy: string | null;
  status: 'upcoming' | 'in force' | 'over' | 'ended early';
}
