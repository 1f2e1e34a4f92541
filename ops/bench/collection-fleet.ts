import type { Db } from '../../backend/src/db';
import { seed as seedTeams } from '../../seeds/01_teams_and_services';
import { baseTotal, CONFIDENCE, ERROR_BUDGET, GROWTH_PER_SCRAPE, INSTANCES_PER_SKETCH, SKETCH_DEPTH, SKETCH_WIDTH, sketchName } from './sim-fleet';

/** Readings of history each target starts with: what the forecast is fitted to in steady state (COLLECTOR_HISTORY_READINGS). */
export const HISTORY_READINGS = 60;
/** Long enough that no target comes due twice within one measured round. */
export const BENCH_INTERVAL_S = 300;

export interface BenchFleet {
  /** Target ids, in the order of the simulated fleet's paths /t/0, /t/1, … */
  targetIds: number[];
}

/**
 * Registers `targets` instances of sketches served by the simulated fleet on
 * `port`, each with a target status and an hour's worth of good readings, as a
 * fleet looks after the collectors have run for a while. Nothing is due yet.
 */
export async function loadCollectionFleet(db: Db, port: number, targets: number): Promise<BenchFleet> {
  await seedTeams(db);
  const services: { id: number; team_id: number }[] = await db('services').orderBy('id').select('id', 'team_id');
  const sketchCount = Math.ceil(targets / INSTANCES_PER_SKETCH);
  const sketchRows = Array.from({ length: sketchCount }, (_, s) => ({
    service_id: services[s % services.length].id,
    team_id: services[s % services.length].team_id,
    name: sketchName(s),
    error_budget: ERROR_BUDGET,
    confidence: CONFIDENCE,
    scrape_interval_seconds: BENCH_INTERVAL_S,
  }));
  const sketchIds: number[] = [];
  for (let i = 0; i < sketchRows.length; i += 1000) {
    const ids = await db('sketches').insert(sketchRows.slice(i, i + 1000)).returning('id');
    sketchIds.push(...ids.map((r: { id: number }) => Number(r.id)));
  }
  const targetRows = Array.from({ length: targets }, (_, t) => ({
    sketch_id: sketchIds[Math.floor(t / INSTANCES_PER_SKETCH)],
    url: `http://127.0.0.1:${port}/t/${t}`,
    instance: `replica-${t % INSTANCES_PER_SKETCH}`,
    next_scrape_at: db.raw("now() + interval '1 day'"),
  }));
  const targetIds: number[] = [];
  for (let i = 0; i < targetRows.length; i += 1000) {
    const ids = await db('targets').insert(targetRows.slice(i, i + 1000)).returning('id');
    targetIds.push(...ids.map((r: { id: number }) => Number(r.id)));
  }
  const bases = targetIds.map((_, t) => baseTotal(t));
  // An hour of history one interval apart, ending one interval ago, growing as the fleet will go on growing.
  await db.raw(
    `insert into readings (target_id, sketch_id, taken_at, ok, stream_total, width, depth, counter_bytes, window_seconds,
                           conservative, nonzero_cells, scrape_ms, judgement)
     select t.id, t.sketch_id, now() - make_interval(secs => (? - j + 1) * ?), true, v.base - (? - j) * ?, ?, ?, 4, 0, false,
            array_fill(8000, array[?::int]), 2.5, jsonb_build_object('level', 'clear', 'load', 0.3)
     from unnest(?::bigint[], ?::float8[]) as v(id, base)
     join targets t on t.id = v.id
     cross join generate_series(1, ?) as j`,
    [HISTORY_READINGS, BENCH_INTERVAL_S, HISTORY_READINGS, GROWTH_PER_SCRAPE, SKETCH_WIDTH, SKETCH_DEPTH, SKETCH_DEPTH, targetIds, bases, HISTORY_READINGS],
  );
  await db.raw(
    `insert into target_status (target_id, sketch_id, level, taken_at, last_ok_at, stream_total, width, depth, counter_bytes,
                                window_seconds, conservative, nonzero_cells, judgement, level_since)
     select t.id, t.sketch_id, 'clear', now() - make_interval(secs => ?), now() - make_interval(secs => ?), v.base, ?, ?, 4, 0, false,
            array_fill(8000, array[?::int]), jsonb_build_object('level', 'clear', 'load', 0.3), now() - interval '1 hour'
     from unnest(?::bigint[], ?::float8[]) as v(id, base) join targets t on t.id = v.id`,
    [BENCH_INTERVAL_S, BENCH_INTERVAL_S, SKETCH_WIDTH, SKETCH_DEPTH, SKETCH_DEPTH, targetIds, bases],
  );
  await db.raw('analyze');
  return { targetIds };
}

/** Makes the first `count` targets due (an hour overdue, so no clock can mistake them for done), with no leases held. */
export async function makeDue(db: Db, targetIds: number[], count: number): Promise<void> {
  await db('targets').update({ lease_owner: null, lease_expires_at: null, next_scrape_at: db.raw("now() + interval '1 day'") });
  await db('targets').whereIn('id', targetIds.slice(0, count)).update({ next_scrape_at: db.raw("now() - interval '1 hour'") });
}

/** Targets stored since they were made due: their next slot moved from an hour ago to the coming minutes (those not due sit a day ahead). */
export async function doneCount(db: Db): Promise<number> {
  const [{ n }] = await db('targets').where('next_scrape_at', '>', db.raw("now() - interval '30 minutes'")).andWhere('next_scrape_at', '<', db.raw("now() + interval '12 hours'")).count('* as n');
  return Number(n);
}
