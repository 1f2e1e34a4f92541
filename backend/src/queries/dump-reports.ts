import type { Knex } from 'knex';

type Q = Knex | Knex.Transaction;

export interface NewDumpReport {
  userId: number | null;
  userLogin: string;
  sketchId: number | null;
  fileName: string;
  format: string;
  byteSize: number;
  width: number;
  depth: number;
  level: string;
  report: unknown;
}

export interface DumpReportRow {
  id: number;
  created_at: Date;
  user_login: string;
  sketch_id: number | null;
  service: string | null;
  sketch: string | null;
  team: string | null;
  file_name: string;
  format: string;
  byte_size: number;
  width: number;
  depth: number;
  level: string;
}

export async function insertDumpReport(db: Q, r: NewDumpReport): Promise<number> {
  const [row] = await db('dump_reports')
    .insert({
      user_id: r.userId,
      user_login: r.userLogin,
      sketch_id: r.sketchId,
      file_name: r.fileName,
      format: r.format,
      byte_size: r.byteSize,
      width: r.width,
      depth: r.depth,
      level: r.level,
      report: JSON.stringify(r.report),
    })
    .returning('id');
  return Number(row.id);
}

function withSketch(db: Q) {
  return db('dump_reports as d')
    .leftJoin('sketches as s', 's.id', 'd.sketch_id')
    .leftJoin('services as sv', 'sv.id', 's.service_id')
    .leftJoin('teams as t', 't.id', 's.team_id')
    .select('d.id', 'd.created_at', 'd.user_login', 'd.sketch_id', 'sv.name as service', 's.name as sketch', 't.slug as team',
      'd.file_name', 'd.format', 'd.byte_size', 'd.width', 'd.depth', 'd.level');
}

/** Newest first; `before` is the id of the last report already shown. */
export function listDumpReports(db: Q, q: { limit: number; before?: number; sketchId?: number }): Promise<(DumpReportRow & { load: number })[]> {
  const query = withSketch(db).select(db.raw(`(d.report->>'load')::float8 as load`)).orderBy('d.id', 'desc').limit(q.limit);
  if (q.before !== undefined) query.where('d.id', '<', q.before);
  if (q.sketchId !== undefined) query.where('d.sketch_id', q.sketchId);
  return query;
}

export function findDumpReport(db: Q, id: number): Promise<(DumpReportRow & { report: Record<string, unknown> }) | undefined> {
  return withSketch(db).select('d.report').where('d.id', id).first();
}
