import type { Knex } from 'knex';

/** A target this process holds the lease on, with what judging it needs from its sketch. */
export interface ClaimedTarget {
  targetId: number;
  sketchId: number;
  url: string;
  instance: string;
  sketchLabel: string;
  intervalSeconds: number;
  dueAt: Date;
  errorBudget: number;
  confidence: number;
  watchLine: number;
  leadTimeDays: number;
}

/**
 * Leases up to `limit` due targets to `owner`. SKIP LOCKED lets several
 * collectors claim at once without waiting on each other or taking the same
 * row; the lease outlasts one scrape (its timeout) by `marginSeconds`, and a
 * lease left by a process that died simply expires and the target is due again.
 */
export async function claimDueTargets(db: Knex, owner: string, limit: number, marginSeconds: number): Promise<ClaimedTarget[]> {
  const { rows } = await db.raw(
    `with due as (
       select id from targets
       where next_scrape_at <= now() and (lease_expires_at is null or lease_expires_at < now())
       order by next_scrape_at
       limit ?
       for update skip locked
     ), claimed as (
       update targets t
       set lease_owner = ?, lease_expires_at = now() + make_interval(secs => least(10, 0.8 * s.scrape_interval_seconds) + ?)
       from due, sketches s
       where t.id = due.id and s.id = t.sketch_id
       returning t.id, t.sketch_id, t.url, t.instance, t.next_scrape_at, s.name, s.scrape_interval_seconds,
                 s.error_budget, s.confidence, s.watch_line, s.lead_time_days
     )
     select * from claimed order by next_scrape_at`,
    [limit, owner, marginSeconds],
  );
  return rows.map((r: Record<string, unknown>) => ({
    targetId: Number(r.id),
    sketchId: Number(r.sketch_id),
    url: String(r.url),
    instance: String(r.instance),
    sketchLabel: String(r.name),
    intervalSeconds: Number(r.scrape_interval_seconds),
    dueAt: r.next_scrape_at as Date,
    errorBudget: Number(r.error_budget),
    confidence: Number(r.confidence),
    watchLine: Number(r.watch_line),
    leadTimeDays: Number(r.lead_time_days),
  }));
}

/** On shutdown: give unfinished targets back at once rather than making them wait for the lease to expire. */
export async function releaseLeases(db: Knex, owner: string, targetIds: number[]): Promise<number> {
  if (targetIds.length === 0) return 0;
  return db('targets').whereIn('id', targetIds).andWhere('lease_owner', owner).update({ lease_owner: null, lease_expires_at: null });
}
