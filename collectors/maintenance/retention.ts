import type { Knex } from 'knex';

const DAY_MS = 86_400_000;
const partitionName = (dayStart: number) => `readings_p${new Date(dayStart).toISOString().slice(0, 10).replace(/-/g, '')}`;
const dayOf = (ms: number) => Math.floor(ms / DAY_MS) * DAY_MS;

/**
 * Creates tomorrow's and the next days' partitions of `readings` before any
 * row arrives for them, so retention can later drop a whole day at once.
 * Today's rows already sit in the default partition (PostgreSQL refuses a new
 * partition whose rows the default already holds); those are deleted row by
 * row when they age out.
 */
export async function ensureDailyPartitions(db: Knex, now: number, daysAhead: number, log: (message: string) => void): Promise<string[]> {
  const created: string[] = [];
  for (let day = 1; day <= daysAhead; day++) {
    const start = dayOf(now) + day * DAY_MS;
    const name = partitionName(start);
    try {
      const exists = await db.raw('select to_regclass(?) as found', [name]);
      if (exists.rows[0].found) continue;
      // DDL takes no bind parameters; both bounds are ISO strings made here, not input.
      const from = new Date(start).toISOString();
      const to = new Date(start + DAY_MS).toISOString();
      await db.raw(`create table ${name} partition of readings for values from ('${from}') to ('${to}')`);
      created.push(name);
    } catch (err) {
      log(`partition ${name} not created (readings for that day may already sit in the default partition): ${err instanceof Error ? err.message : String(err)}`);
    }
  }
  return created;
}

/** Drops daily partitions wholly older than the retention and deletes old rows from the default partition in small chunks. */
export async function dropOldReadings(db: Knex, now: number, retentionDays: number): Promise<{ droppedPartitions: string[]; deletedRows: number }> {
  const cutoff = now - retentionDays * DAY_MS;
  const { rows } = await db.raw(
    `select c.relname as name from pg_inherits i join pg_class c on c.oid = i.inhrelid
     where i.inhparent = 'readings'::regclass and c.relname ~ '^readings_p[0-9]{8}$'`,
  );
  const droppedPartitions: string[] = [];
  for (const { name } of rows as { name: string }[]) {
    const digits = name.slice('readings_p'.length);
    const dayStart = Date.UTC(Number(digits.slice(0, 4)), Number(digits.slice(4, 6)) - 1, Number(digits.slice(6, 8)));
    if (dayStart + DAY_MS <= cutoff) {
      await db.raw(`drop table ${name}`);
      droppedPartitions.push(name);
    }
  }
  let deletedRows = 0;
  for (;;) {
    const deleted = await db.raw(
      'delete from readings_default where ctid = any(array(select ctid from readings_default where taken_at < ? limit 5000))',
      [new Date(cutoff).toISOString()],
    );
    deletedRows += deleted.rowCount ?? 0;
    if ((deleted.rowCount ?? 0) < 5000) break;
  }
  return { droppedPartitions, deletedRows };
}

/**
 * Deletes hourly rollups older than their own retention (ROLLUP_RETENTION_DAYS,
 * always at least the raw retention), in chunks so no long lock holds up the
 * minute's rollup.
 */
export async function dropOldRollups(db: Knex, now: number, retentionDays: number): Promise<number> {
  const cutoff = new Date(now - retentionDays * DAY_MS).toISOString();
  let deleted = 0;
  for (;;) {
    const result = await db.raw(
      'delete from reading_rollups_hourly where ctid = any(array(select ctid from reading_rollups_hourly where hour < ? limit 5000))',
      [cutoff],
    );
    deleted += result.rowCount ?? 0;
    if ((result.rowCount ?? 0) < 5000) return deleted;
  }
}
