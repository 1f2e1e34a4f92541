import type { Db } from '../db';
import { severitySql } from '../queries/level-order';
import type { Figures } from '../api-types';
import { figuresOf, type StatusRow } from '../services/sketches/figures';

export interface DigestRow {
  id: number;
  sketch: string;
  service: string;
  team: string;
  instances: number;
  /** width · depth · counter bytes summed over every instance read so far. */
  memoryBytes: number;
  /** The worst instance's figures (the fleet table's rule: highest severity, then highest load). */
  figures: Figures;
}

/** Every sketch of the fleet with what the digest says of it, in one statement. */
export async function digestRows(db: Db): Promise<DigestRow[]> {
  const result = await db.raw(`
    select s.id, s.name as sketch, sv.name as service, t.slug as team,
           (select count(*)::int from targets tg where tg.sketch_id = s.id) as instances,
           (select coalesce(sum(ts.width::float8 * ts.depth * ts.counter_bytes), 0) from target_status ts where ts.sketch_id = s.id) as memory_bytes,
           w.level, w.level_since, w.taken_at, w.last_ok_at, w.last_error, w.stream_total, w.width, w.depth,
           w.counter_bytes, w.window_seconds, w.conservative, w.judgement
    from sketches s
    join services sv on sv.id = s.service_id
    join teams t on t.id = s.team_id
    left join lateral (
      select ts.* from target_status ts where ts.sketch_id = s.id
      order by ${severitySql('ts.level')} desc, (ts.judgement->>'load')::float8 desc nulls last, ts.target_id
      limit 1
    ) w on true
    order by s.id`);
  return result.rows.map((r: StatusRow & { id: number; sketch: string; service: string; team: string; instances: number; memory_bytes: number }) => ({
    id: Number(r.id),
    sketch: r.sketch,
    service: r.service,
    team: r.team,
    instances: Number(r.instances),
    memoryBytes: Number(r.memory_bytes),
    figures: figuresOf(r.level === null ? null : r),
  }));
}
