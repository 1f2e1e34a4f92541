import type { Knex } from 'knex';

/**
 * Takes or renews the scheduler's lease for `owner`. True while this process
 * is the scheduler; another process wins only after the lease has run out.
 */
export async function holdSchedulerLease(db: Knex, owner: string, leaseSeconds: number): Promise<boolean> {
  const { rows } = await db.raw(
    `insert into collector_scheduler (role, owner, expires_at, elected_at)
     values ('maintenance', ?, now() + make_interval(secs => ?), now())
     on conflict (role) do update
       set owner = excluded.owner, expires_at = excluded.expires_at,
           elected_at = case when collector_scheduler.owner = excluded.owner then collector_scheduler.elected_at else now() end
       where collector_scheduler.owner = excluded.owner or collector_scheduler.expires_at < now()
     returning owner`,
    [owner, leaseSeconds],
  );
  return rows.length === 1;
}

/** On a clean shutdown the next scheduler need not wait for the lease to run out. */
export async function resignScheduler(db: Knex, owner: string): Promise<void> {
  await db('collector_scheduler').where({ role: 'maintenance', owner }).delete();
}
