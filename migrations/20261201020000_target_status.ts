import type { Knex } from 'knex';

/**
 * The latest word on every target (one instance of a sketch): its level, the
 * figures of its last good reading and the reason of its last failure. The
 * fleet list reads this table rather than searching the readings for the
 * newest row of every target.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`create table target_status (
    target_id bigint primary key references targets (id) on delete cascade,
    sketch_id bigint not null,
    level text not null default 'stale',
    taken_at timestamptz,
    last_ok_at timestamptz,
    last_error text,
    failures_in_row integer not null default 0,
    stream_total double precision,
    width integer,
    depth integer,
    counter_bytes smallint,
    window_seconds integer,
    conservative boolean,
    nonzero_cells integer[],
    judgement jsonb,
    level_since timestamptz not null default now(),
    constraint target_status_level_known check (level in ('clear','watch','brimmed','stale','unreachable'))
  )`);
  await knex.raw('create index target_status_sketch on target_status (sketch_id)');
  // The claim query scans due targets whose lease is free; expired leases are found the same way.
  await knex.raw('create index targets_lease_expiry on targets (lease_expires_at) where lease_owner is not null');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists targets_lease_expiry');
  await knex.schema.dropTableIfExists('target_status');
}
