import type { Knex } from 'knex';
import { rejudgeSketches, type AlertsHook } from '../sketch-level';

/** DESIGN.md: `stale` is no good reading for 3 scrape intervals. */
export const STALE_AFTER_INTERVALS = 3;

/**
 * Marks targets stale that have had no good reading for three intervals
 * (including targets never read at all, and those whose collectors were all
 * down), and re-judges their sketches for the alerts. `unreachable` is left
 * alone: it says more (the scrapes fail) than `stale` would.
 *
 * The clock starts no earlier than `watchingSince` (when this process became
 * the scheduler): after the whole system restarts, collectors get their three
 * intervals to read every target before anything is called stale — otherwise
 * every restart would open a stale alert per sketch.
 */
export async function markStaleTargets(db: Knex, hook: AlertsHook, log: (message: string) => void, watchingSince: Date = new Date(0)): Promise<number> {
  return db.transaction(async (trx) => {
    await trx.raw(
      `insert into target_status (target_id, sketch_id, level, level_since)
       select t.id, t.sketch_id, 'stale', now() from targets t
       where not exists (select 1 from target_status s where s.target_id = t.id)
       on conflict (target_id) do nothing`,
    );
    const { rows } = await trx.raw(
      `update target_status ts set level = 'stale', level_since = now()
       from targets t join sketches s on s.id = t.sketch_id
       where ts.target_id = t.id and ts.level not in ('stale', 'unreachable')
         and greatest(coalesce(ts.last_ok_at, t.created_at), ?::timestamptz) < now() - make_interval(secs => ? * s.scrape_interval_seconds)
       returning ts.sketch_id`,
      [watchingSince, STALE_AFTER_INTERVALS],
    );
    const sketchIds = [...new Set<number>(rows.map((r: { sketch_id: number }) => Number(r.sketch_id)))];
    await rejudgeSketches(trx, sketchIds, hook, log);
    return rows.length;
  });
}
