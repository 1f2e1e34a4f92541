import type { Knex } from 'knex';

/**
 * The claim walks targets_due in slot order and skips leased rows as it goes;
 * nothing searches by lease expiry. The index only cost every claim (a lease
 * set is a change of an indexed column, so the row's new version went into
 * every index of targets) an insert into it.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists targets_lease_expiry');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('create index targets_lease_expiry on targets (lease_expires_at) where lease_owner is not null');
}
