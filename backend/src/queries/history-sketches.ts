import type { Knex } from 'knex';

type Q = Knex | Knex.Transaction;

export interface HistoryFilter {
  teams: string[];
  services: string[];
  sketchIds: number[];
}

export interface HistorySketchRow {
  id: number;
  sketch: string;
  service: string;
  team: string;
  team_name: string;
}

function filtered(db: Q, f: HistoryFilter) {
  const query = db('sketches as s').join('services as sv', 'sv.id', 's.service_id').join('teams as t', 't.id', 's.team_id');
  if (f.teams.length) query.whereIn('t.slug', f.teams);
  if (f.services.length) query.whereIn('sv.name', f.services);
  if (f.sketchIds.length) query.whereIn('s.id', f.sketchIds);
  return query;
}

/** The sketches a history covers, by service then sketch name, one page of them. */
export async function historySketches(db: Q, f: HistoryFilter, offset: number, limit: number): Promise<{ rows: HistorySketchRow[]; total: number }> {
  const [{ n }] = await filtered(db, f).count('s.id as n');
  const rows = await filtered(db, f)
    .orderBy([{ column: 'sv.name' }, { column: 's.name' }, { column: 's.id' }])
    .offset(offset)
    .limit(limit)
    .select('s.id', 's.name as sketch', 'sv.name as service', 't.slug as team', 't.name as team_name');
  return { rows, total: Number(n) };
}

export interface AlertEventRow {
  sketch_id: number;
  alert_id: number;
  at: Date;
  kind: string;
  level: string;
  actor: string;
  note: string | null;
}

export function alertEventsIn(db: Q, sketchIds: number[], from: Date, to: Date, limit: number): Promise<AlertEventRow[]> {
  return db('alert_events')
    .whereIn('sketch_id', sketchIds)
    .where('at', '>=', from)
    .where('at', '<=', to)
    .orderBy([{ column: 'at' }, { column: 'id' }])
    .limit(limit)
    .select('sketch_id', 'alert_id', 'at', 'kind', 'level', 'actor', 'note');
}
