import type { Db } from '../../backend/src/db';
import { seed as seedTeams } from '../../seeds/01_teams_and_services';
import { rollUpHours } from '../../collectors/maintenance/rollups';

export const FLEET_SKETCHES = 10_000;
export const HISTORY_DAYS = 90;
/** Other targets whose readings share the table with the charted sketch's. */
const NEIGHBOUR_TARGETS = 10;
const DAY_MS = 86_400_000;

/** The day partitions the collectors' maintenance keeps (collectors/maintenance/retention.ts names them so). */
async function dayPartitions(db: Db, days: number): Promise<void> {
  const today = Math.floor(Date.now() / DAY_MS) * DAY_MS;
  for (let day = -days; day <= 1; day++) {
    const start = today + day * DAY_MS;
    const name = `readings_p${new Date(start).toISOString().slice(0, 10).replace(/-/g, '')}`;
    await db.raw(`create table if not exists ${name} partition of readings for values from ('${new Date(start).toISOString()}') to ('${new Date(start + DAY_MS).toISOString()}')`);
  }
}

/** A judgement shaped as the collector stores it (collectors/judge.ts), built in SQL from the total. */
const judgementSql = (total: string, capacity: string) => `jsonb_build_object(
  'level', case when ${total} / ${capacity} >= 1 then 'brimmed' when ${total} / ${capacity} >= 0.8 then 'watch' else 'clear' end,
  'load', ${total} / ${capacity}, 'capacity', ${capacity}, 'boundNow', ${total} / 2719 / 0.3981, 'missRisk', least(1, power(${total} / 2719 / 100, 5)),
  'relativeError', 0.000924, 'brimAt', null, 'brimEarliest', null, 'brimLatest', null, 'trend', 'none', 'trendReason', 'not enough readings',
  'distinctEstimate', 1500, 'saturatedRows', 0, 'errorBudget', 100, 'confidence', 0.99, 'watchLine', 0.8, 'judgedTotal', ${total})`;

/**
 * A fleet of 10,000 sketches with two instances each and their latest word,
 * and 90 days of 30-second readings for the first sketch (one instance),
 * beside 10 other targets' readings every 5 minutes in the same daily
 * partitions. The secondary indexes are built after the rows are in (as a
 * bulk load would), from their definitions in the migrations. Returns the charted sketch's id.
 */
export async function loadFleetForApi(db: Db): Promise<{ chartedSketchId: number; readings: number; rollupHours: number }> {
  await seedTeams(db);
  await db.raw(
    `insert into sketches (service_id, team_id, name, error_budget, confidence, scrape_interval_seconds)
     select sv.id, sv.team_id, 'sketch-' || g, 100, 0.99, 30
     from generate_series(0, ? - 1) g
     join (select id, team_id, row_number() over (order by id) - 1 as k from services) sv on sv.k = g % 5`,
    [FLEET_SKETCHES],
  );
  const charted = Number((await db('sketches').min('id as id').first())!.id);
  await db.raw(
    `insert into targets (sketch_id, url, instance)
     select s.id, 'http://127.0.0.1:9/metrics/' || s.id || '/' || i, 'replica-' || i
     from sketches s cross join generate_series(0, 1) i where s.id <> ? or i = 0`,
    [charted],
  );
  // Capacity of a 2719 × 5 sketch with a budget of 100 at 99 %: 2719 · 100 · 0.01^(1/5) = 108,245.
  await db.raw(
    `insert into target_status (target_id, sketch_id, level, taken_at, last_ok_at, stream_total, width, depth, counter_bytes,
                                window_seconds, conservative, nonzero_cells, judgement, level_since)
     select t.id, t.sketch_id, j.judgement->>'level', now() - interval '10 seconds', now() - interval '10 seconds', v.total, 2719, 5, 4, 0, false,
            array[1500, 1490, 1510, 1502, 1497], j.judgement, now() - interval '2 days'
     from targets t
     cross join lateral (select (t.id * 7919 % 1000) / 1000.0 * 120000.0 as total) v
     cross join lateral (select ${judgementSql('v.total', '108245.0')} as judgement) j`,
  );
  await dayPartitions(db, HISTORY_DAYS);
  const chartedTarget = Number((await db('targets').where({ sketch_id: charted }).first('id'))!.id);
  const insertSeries = (targetIds: string, stepSeconds: number) =>
    db.raw(
      `insert into readings (target_id, sketch_id, taken_at, ok, stream_total, width, depth, counter_bytes, window_seconds,
                             conservative, nonzero_cells, scrape_ms, is_reset, judgement)
       select t.id, t.sketch_id, g.at, true, v.total, 2719, 5, 4, 0, false, array[1500, 1490, 1510, 1502, 1497], 3.1, false,
              ${judgementSql('v.total', '108245.0')}
       from targets t
       cross join generate_series(now() - interval '${HISTORY_DAYS} days', now(), interval '${stepSeconds} seconds') as g(at)
       cross join lateral (select 20000 + extract(epoch from g.at - (now() - interval '${HISTORY_DAYS} days')) / 86400 * 900 as total) v
       where ${targetIds}`,
    );
  const { rows: indexes } = await db.raw(
    `select indexname, indexdef from pg_indexes where schemaname = 'public' and tablename = 'readings'
     and indexname not in (select conname from pg_constraint where conrelid = 'readings'::regclass)`,
  );
  for (const { indexname } of indexes) await db.raw(`drop index ${indexname}`);
  await insertSeries(`t.id = ${chartedTarget}`, 30);
  await insertSeries(`t.id in (select id from targets where id <> ${chartedTarget} order by id limit ${NEIGHBOUR_TARGETS})`, 300);
  // pg_indexes names a partitioned table's index ON ONLY the parent; built ON the parent it covers every partition.
  for (const { indexdef } of indexes) await db.raw(String(indexdef).replace(' ON ONLY ', ' ON '));
  // The collectors' maintenance keeps the hourly rollups within a minute of the readings; here they are made once.
  await rollUpHours(db);
  await db.raw('vacuum analyze');
  const [{ n }] = await db('readings').count('* as n');
  const [{ h }] = await db('reading_rollups_hourly').count('* as h');
  return { chartedSketchId: charted, readings: Number(n), rollupHours: Number(h) };
}
