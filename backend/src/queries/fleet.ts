import type { Db } from '../db';
import { severitySql, UNREAD_LEVEL } from './level-order';

/** One sketch of the fleet, judged by its worst instance: the narrow figures the table filters, sorts and sums. */
export interface FleetRow {
  id: number;
  sketch: string;
  service: string;
  team: string;
  team_name: string;
  error_budget: number;
  confidence: number;
  watch_line: number;
  lead_time_days: number;
  scrape_interval_seconds: number;
  sized_total: number | null;
  /** The worst instance's target, or null when no instance has been read or marked yet. */
  target_id: number | null;
  level: string;
  severity: number;
  /** Milliseconds since the epoch: numbers parse far faster than dates when thousands of rows arrive. */
  taken_at: number | null;
  stream_total: number | null;
  width: number | null;
  depth: number | null;
  load: number | null;
  capacity: number | null;
  bound_now: number | null;
  miss_risk: number | null;
  brim_date: number | null;
  memory_bytes: number | null;
  instances: number;
  /** The memory of every instance's copy of the sketch. */
  all_memory: number;
}

/** Every sketch with its worst instance (highest severity, then highest load), its instance count and memory. */
export async function fleetRows(db: Db): Promise<FleetRow[]> {
  const result = await db.raw(`
    with worst as (
      select distinct on (ts.sketch_id) ts.sketch_id, ts.target_id, ts.level, ts.taken_at, ts.stream_total, ts.width, ts.depth,
             (ts.judgement->>'load')::float8 as load, (ts.judgement->>'capacity')::float8 as capacity,
             (ts.judgement->>'boundNow')::float8 as bound_now, (ts.judgement->>'missRisk')::float8 as miss_risk,
             (ts.judgement->>'brimAt')::timestamptz as brim_date,
             ts.width::float8 * ts.depth * ts.counter_bytes as memory_bytes
      from target_status ts
      order by ts.sketch_id, ${severitySql('ts.level')} desc, (ts.judgement->>'load')::float8 desc nulls last, ts.target_id
    ),
    per_sketch as (
      select tg.sketch_id, count(*)::int as instances, coalesce(sum(ts.width::float8 * ts.depth * ts.counter_bytes), 0) as all_memory
      from targets tg left join target_status ts on ts.target_id = tg.id
      group by tg.sketch_id
    )
    select s.id, s.name as sketch, sv.name as service, t.slug as team, t.name as team_name,
           s.error_budget, s.confidence, s.watch_line, s.lead_time_days, s.scrape_interval_seconds, s.sized_total,
           w.target_id, coalesce(w.level, '${UNREAD_LEVEL}') as level, ${severitySql(`coalesce(w.level, '${UNREAD_LEVEL}')`)} as severity,
           extract(epoch from w.taken_at)::float8 * 1000 as taken_at, w.stream_total, w.width, w.depth, w.load, w.capacity, w.bound_now,
           w.miss_risk, extract(epoch from w.brim_date)::float8 * 1000 as brim_date, w.memory_bytes,
           coalesce(p.instances, 0) as instances, coalesce(p.all_memory, 0) as all_memory
    from sketches s
    join services sv on sv.id = s.service_id
    join teams t on t.id = s.team_id
    left join worst w on w.sketch_id = s.id
    left join per_sketch p on p.sketch_id = s.id`);
  return result.rows;
}

/** The full status rows (judgement included) of the targets on the page shown. */
export function statusesOf(db: Db, targetIds: number[]) {
  return targetIds.length === 0 ? Promise.resolve([]) : db('target_status').whereIn('target_id', targetIds).select('*');
}
