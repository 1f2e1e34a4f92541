import type { Knex } from 'knex';

type Q = Knex | Knex.Transaction;

export interface SketchRow {
  id: number;
  name: string;
  service_id: number;
  service: string;
  team_id: number;
  team: string;
  team_name: string;
  error_budget: number;
  confidence: number;
  watch_line: number;
  lead_time_days: number;
  scrape_interval_seconds: number;
  sized_total: number | null;
  created_at: Date;
  updated_at: Date;
}

export interface SketchSettings {
  name: string;
  error_budget: number;
  confidence: number;
  watch_line: number;
  lead_time_days: number;
  scrape_interval_seconds: number;
  sized_total: number | null;
}

export interface TargetSpec {
  instance: string;
  url: string;
}

/** A team by slug, or by id when the caller passed digits. */
export function findTeam(db: Q, team: string): Promise<{ id: number; slug: string; name: string } | undefined> {
  const query = db('teams').select('id', 'slug', 'name');
  return (/^\d+$/.test(team) ? query.where({ id: Number(team) }) : query.where({ slug: team })).first();
}

export function findService(db: Q, name: string): Promise<{ id: number; team_id: number } | undefined> {
  return db('services').where({ name }).first('id', 'team_id');
}

export async function insertService(db: Q, name: string, teamId: number): Promise<number> {
  const [row] = await db('services').insert({ name, team_id: teamId }).returning('id');
  return Number(row.id);
}

export function sketchExists(db: Q, serviceId: number, name: string, exceptId?: number): Promise<boolean> {
  const query = db('sketches').where({ service_id: serviceId, name });
  if (exceptId !== undefined) query.whereNot({ id: exceptId });
  return query.first('id').then(Boolean);
}

export async function insertSketch(db: Q, serviceId: number, teamId: number, settings: SketchSettings): Promise<number> {
  const [row] = await db('sketches').insert({ ...settings, service_id: serviceId, team_id: teamId }).returning('id');
  return Number(row.id);
}

export async function insertTargets(db: Q, sketchId: number, targets: TargetSpec[]): Promise<void> {
  if (targets.length) await db('targets').insert(targets.map((t) => ({ sketch_id: sketchId, instance: t.instance, url: t.url })));
}

export function findSketch(db: Q, id: number, options: { forUpdate?: boolean } = {}): Promise<SketchRow | undefined> {
  const query = db('sketches as s')
    .join('services as sv', 'sv.id', 's.service_id')
    .join('teams as t', 't.id', 's.team_id')
    .where('s.id', id)
    .first('s.*', 'sv.name as service', 't.slug as team', 't.name as team_name');
  return options.forUpdate ? query.forUpdate('s') : query;
}

/** Every target of a sketch with its status (null columns when never read), in instance order. */
export function targetsWithStatus(db: Q, sketchId: number) {
  return db('targets as tg')
    .leftJoin('target_status as ts', 'ts.target_id', 'tg.id')
    .where('tg.sketch_id', sketchId)
    .orderBy('tg.instance')
    .select('tg.id as target_id', 'tg.instance', 'tg.url', 'ts.level', 'ts.level_since', 'ts.taken_at', 'ts.last_ok_at', 'ts.last_error',
      'ts.stream_total', 'ts.width', 'ts.depth', 'ts.counter_bytes', 'ts.window_seconds', 'ts.conservative', 'ts.nonzero_cells', 'ts.judgement');
}

export async function updateSketch(db: Q, id: number, settings: Partial<SketchSettings>): Promise<void> {
  if (Object.keys(settings).length) await db('sketches').where({ id }).update({ ...settings, updated_at: db.fn.now() });
}

export async function updateTargetUrl(db: Q, targetId: number, url: string): Promise<void> {
  // A new address is read at once rather than at the old schedule.
  await db('targets').where({ id: targetId }).update({ url, next_scrape_at: db.fn.now(), updated_at: db.fn.now() });
}

export async function deleteTargets(db: Q, targetIds: number[]): Promise<void> {
  if (!targetIds.length) return;
  await db('readings').whereIn('target_id', targetIds).delete();
  await db('targets').whereIn('id', targetIds).delete();
}

/** The sketch, its targets (their status and alerts cascade) and its readings, which have no foreign key. */
export async function deleteSketch(db: Q, id: number): Promise<void> {
  await db('readings').where({ sketch_id: id }).delete();
  await db('sketches').where({ id }).delete();
}
