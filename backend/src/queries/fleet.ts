import type { Knex } from 'knex';
import type { Db } from '../db';
import type { HealthLevel } from '../maths/health-levels';
import { severitySql, UNREAD_LEVEL } from './level-order';

/** Columns the fleet list can be sorted by, each with the SQL it sorts on. */
export const FLEET_SORTS = {
  service: 'service',
  sketch: 'sketch',
  team: 'team',
  level: 'severity',
  load: 'load',
  streamTotal: 'stream_total',
  capacity: 'capacity',
  boundNow: 'bound_now',
  missRisk: 'miss_risk',
  brimDate: 'brim_date',
  lastReadingAt: 'taken_at',
  memoryBytes: 'memory_bytes',
  errorBudget: 'error_budget',
  width: 'width',
  depth: 'depth',
  instances: 'instances',
} as const;

export type FleetSort = keyof typeof FLEET_SORTS;

export interface FleetQuery {
  teams: string[];
  services: string[];
  levels: HealthLevel[];
  q: string | undefined;
  sort: FleetSort;
  order: 'asc' | 'desc';
  page: number;
  pageSize: number;
  now: Date;
}

export interface FleetRows {
  items: Record<string, unknown>[];
  total: number;
  perLevel: Record<string, number>;
  brimmingWithin7Days: number;
  brimmingWithin30Days: number;
  totalMemoryBytes: number;
}

const likePattern = (q: string) => `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/**
 * One statement for the page and its summary: the fleet (every sketch with its
 * worst instance's status) is built once, then paged and summed. The summary
 * covers the team/service/search filters but not the level filter, so the
 * counts per level stay visible while one level is shown.
 */
export async function queryFleet(db: Db, f: FleetQuery): Promise<FleetRows> {
  const where: string[] = [];
  const bindings: Knex.RawBinding[] = [];
  if (f.teams.length) {
    where.push('t.slug = any(?)');
    bindings.push(f.teams);
  }
  if (f.services.length) {
    where.push('sv.name = any(?)');
    bindings.push(f.services);
  }
  if (f.q) {
    where.push('(sv.name ilike ? or s.name ilike ? or t.slug ilike ? or t.name ilike ?)');
    bindings.push(...Array(4).fill(likePattern(f.q)));
  }
  const levelFilter = f.levels.length ? 'where level = any(?)' : '';
  const levelBindings: Knex.RawBinding[] = f.levels.length ? [f.levels] : [];
  const direction = f.order === 'asc' ? 'asc' : 'desc';
  const sortColumn = FLEET_SORTS[f.sort];

  const order = `${sortColumn} ${direction} nulls last, severity desc, load desc nulls last, id`;
  // Narrow rows for the whole fleet (numbers and names, no jsonb); the wide status only for the page shown.
  const sql = `
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
      select tg.sketch_id, count(*)::int as instances,
             coalesce(sum(ts.width::float8 * ts.depth * ts.counter_bytes), 0) as all_memory
      from targets tg left join target_status ts on ts.target_id = tg.id
      group by tg.sketch_id
    ),
    fleet as (
      select s.id, s.name as sketch, sv.name as service, t.slug as team, t.name as team_name,
             s.error_budget, s.confidence, s.watch_line, s.lead_time_days, s.scrape_interval_seconds, s.sized_total,
             w.target_id, coalesce(w.level, '${UNREAD_LEVEL}') as level, ${severitySql(`coalesce(w.level, '${UNREAD_LEVEL}')`)} as severity,
             w.taken_at, w.stream_total, w.width, w.depth, w.load, w.capacity, w.bound_now, w.miss_risk, w.brim_date, w.memory_bytes,
             coalesce(p.instances, 0) as instances, coalesce(p.all_memory, 0) as all_memory
      from sketches s
      join services sv on sv.id = s.service_id
      join teams t on t.id = s.team_id
      left join worst w on w.sketch_id = s.id
      left join per_sketch p on p.sketch_id = s.id
      ${where.length ? `where ${where.join(' and ')}` : ''}
    ),
    shown as (select * from fleet ${levelFilter}),
    page as (
      select f.id, f.sketch, f.service, f.team, f.team_name, f.error_budget, f.confidence, f.watch_line, f.lead_time_days,
             f.scrape_interval_seconds, f.sized_total, f.level, f.instances, row_number() over (order by ${order}) as position,
             ts.level_since, ts.taken_at, ts.last_ok_at, ts.last_error, ts.stream_total, ts.width, ts.depth, ts.counter_bytes,
             ts.window_seconds, ts.conservative, ts.judgement
      from (select * from shown order by ${order} limit ? offset ?) f
      left join target_status ts on ts.target_id = f.target_id
    )
    select
      (select coalesce(json_agg(page order by position), '[]'::json) from page) as items,
      (select count(*)::int from shown) as total,
      (select coalesce(json_object_agg(level, n), '{}'::json) from (select level, count(*)::int as n from fleet group by level) x) as per_level,
      (select count(*)::int from fleet where brim_date > ? and brim_date <= ?::timestamptz + interval '7 days' and level <> 'brimmed') as within_7,
      (select count(*)::int from fleet where brim_date > ? and brim_date <= ?::timestamptz + interval '30 days' and level <> 'brimmed') as within_30,
      (select coalesce(sum(all_memory), 0)::float8 from fleet) as total_memory`;

  const now = f.now.toISOString();
  const result = await db.raw(sql, [...bindings, ...levelBindings, f.pageSize, (f.page - 1) * f.pageSize, now, now, now, now]);
  const row = result.rows[0];
  return {
    items: row.items,
    total: row.total,
    perLevel: row.per_level,
    brimmingWithin7Days: row.within_7,
    brimmingWithin30Days: row.within_30,
    totalMemoryBytes: row.total_memory,
  };
}
