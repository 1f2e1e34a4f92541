import type { Knex } from 'knex';
import type { AlertState, LastNotice, NoticeKind } from './notify-decision';
import type { AlertLevel } from '../api-types';
import type { SketchPlace } from './quiet-spans';

export type Q = Knex | Knex.Transaction;

/** An alert row as the engine uses it. */
export interface AlertRecord {
  id: number;
  sketchId: number;
  state: AlertState;
  level: AlertLevel;
  openedAt: Date;
  levelSince: Date;
  clearSince: Date | null;
  acknowledgedAt: Date | null;
  acknowledgedBy: number | null;
  acknowledgeNote: string | null;
  resolvedAt: Date | null;
  escalatedAt: Date | null;
  last: LastNotice | null;
}

type Row = Record<string, unknown>;
const date = (v: unknown) => (v === null || v === undefined ? null : new Date(v as string | Date));

export function alertFromRow(r: Row): AlertRecord {
  return {
    id: Number(r.id),
    sketchId: Number(r.sketch_id),
    state: r.state as AlertState,
    level: r.level as AlertLevel,
    openedAt: date(r.opened_at) as Date,
    levelSince: date(r.level_since) as Date,
    clearSince: date(r.clear_since),
    acknowledgedAt: date(r.acknowledged_at),
    acknowledgedBy: r.acknowledged_by === null ? null : Number(r.acknowledged_by),
    acknowledgeNote: (r.acknowledge_note as string | null) ?? null,
    resolvedAt: date(r.resolved_at),
    escalatedAt: date(r.escalated_at),
    last:
      r.last_notified_at === null
        ? null
        : { at: date(r.last_notified_at) as Date, level: r.last_notified_level as AlertLevel, kind: r.last_notified_kind as NoticeKind },
  };
}

/**
 * Serialises the alert work of one sketch across collector processes (two
 * rounds judging instances of the same sketch would otherwise both open an
 * alert) and reads where the sketch sits and its watch line in the same round
 * trip; null when the sketch was deleted since it was judged. NO KEY UPDATE
 * leaves inserts that reference the sketch unblocked.
 */
export async function lockSketchPlace(trx: Knex.Transaction, sketchId: number): Promise<(SketchPlace & { watchLine: number }) | null> {
  const row = await trx('sketches').where({ id: sketchId }).forNoKeyUpdate().first('id', 'service_id', 'team_id', 'watch_line');
  return row ? { sketchId: Number(row.id), serviceId: Number(row.service_id), teamId: Number(row.team_id), watchLine: Number(row.watch_line) } : null;
}

export async function liveAlertOf(trx: Q, sketchId: number): Promise<AlertRecord | null> {
  const row = await trx('alerts').where({ sketch_id: sketchId }).whereNot({ state: 'resolved' }).forUpdate().first();
  return row ? alertFromRow(row) : null;
}

export async function alertById(trx: Q, id: number, lock: 'lock' | 'read' = 'read'): Promise<AlertRecord | null> {
  const query = trx('alerts').where({ id }).first();
  const row = await (lock === 'lock' ? query.forUpdate() : query);
  return row ? alertFromRow(row) : null;
}

export async function insertAlert(trx: Q, sketchId: number, level: AlertLevel, at: Date): Promise<AlertRecord> {
  const [row] = await trx('alerts').insert({ sketch_id: sketchId, state: 'open', level, opened_at: at, level_since: at }).returning('*');
  return alertFromRow(row);
}

export async function updateAlert(trx: Q, id: number, patch: Row): Promise<void> {
  await trx('alerts').where({ id }).update(patch);
}
