// The shapes of the alerts API's answers (backend/src/alerts/alert-views.ts and
// quiet-windows.ts), written out here because the server's own types pull in Knex.
import type { Level } from '@/utils/levels';

export type AlertState = 'open' | 'acknowledged' | 'resolved';

export interface Alert {
  id: number;
  sketchId: number;
  sketch: string;
  service: string;
  team: string;
  teamName: string;
  state: AlertState;
  level: Exclude<Level, 'clear'>;
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
  quietUntil: string | null;
}

export type AlertEventKind = 'opened' | 'level_changed' | 'acknowledged' | 'resolved' | 'notified' | 'escalated';

export interface AlertEvent {
  id: number;
  at: string;
  kind: AlertEventKind;
  level: Exclude<Level, 'clear'>;
  actor: string;
  note: string | null;
  mail: { id: number; subject: string; recipients: string[]; attempts: number; sentAt: string | null; nextAttemptAt: string | null; lastError: string | null } | null;
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

export interface QuietWindowInput {
  scope: QuietScope;
  sketchId?: number;
  service?: string;
  team?: string;
  startsAt?: string;
  endsAt: string;
  reason: string;
}
