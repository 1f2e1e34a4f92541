import type { Knex } from 'knex';

/**
 * Maintenance (stale marking, hourly rollups, retention) must run in one
 * collector only: the process that holds this row's unexpired lease is the
 * scheduler; when it dies the lease runs out and another takes over.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('collector_scheduler', (t) => {
    t.text('role').primary();
    t.text('owner').notNullable();
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('elected_at', { useTz: true }).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('collector_scheduler');
}
