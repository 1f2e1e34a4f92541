import type { Knex } from 'knex';

/**
 * target_status is rewritten on every scrape (one row per target) and none of
 * its indexed columns change, so with room left on each page PostgreSQL can
 * update a row in place (a heap-only tuple) instead of adding an entry to
 * each index per reading. Half-full pages leave that room; the table stays
 * small (one row per target). New pages follow the setting at once, existing
 * ones as they are rewritten.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('alter table target_status set (fillfactor = 50)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('alter table target_status reset (fillfactor)');
}
