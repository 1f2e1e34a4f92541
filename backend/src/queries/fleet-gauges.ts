import type { Db } from '../db';
import { severitySql, UNREAD_LEVEL } from './level-order';

export interface SketchGaugeRow {
  service: string;
  sketch: string;
  team: string;
  level: string;
  load: number | null;
}

/** Every sketch's level (worst instance) and load, for the web server's own /metrics. */
export async function sketchGauges(db: Db): Promise<SketchGaugeRow[]> {
  const result = await db.raw(`
    with worst as (
      select distinct on (sketch_id) sketch_id, level, (judgement->>'load')::float8 as load
      from target_status
      order by sketch_id, ${severitySql('level')} desc, (judgement->>'load')::float8 desc nulls last, target_id
    )
    select sv.name as service, s.name as sketch, t.slug as team, coalesce(w.level, '${UNREAD_LEVEL}') as level, w.load
    from sketches s join services sv on sv.id = s.service_id join teams t on t.id = s.team_id
    left join worst w on w.sketch_id = s.id`);
  return result.rows;
}
