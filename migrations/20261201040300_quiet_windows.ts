import type { Knex } from 'knex';

/**
 * Quiet windows hold alert e-mail for a sketch, a service or a team during
 * planned work (a load test). Ending one early keeps the row (cancelled_at):
 * who quieted what, and when, stays on record.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('quiet_windows', (t) => {
    t.bigIncrements('id');
    t.text('scope').notNullable();
    t.bigInteger('sketch_id').references('sketches.id').onDelete('CASCADE');
    t.bigInteger('service_id').references('services.id').onDelete('CASCADE');
    t.bigInteger('team_id').references('teams.id').onDelete('CASCADE');
    t.timestamp('starts_at', { useTz: true }).notNullable();
    t.timestamp('ends_at', { useTz: true }).notNullable();
    t.text('reason').notNullable();
    t.bigInteger('created_by').references('users.id').onDelete('SET NULL');
    t.text('created_by_login').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('cancelled_at', { useTz: true });
    t.text('cancelled_by_login');
  });
  await knex.raw(`alter table quiet_windows add constraint quiet_windows_scope_target check (
    (scope = 'sketch' and sketch_id is not null and service_id is null and team_id is null) or
    (scope = 'service' and service_id is not null and sketch_id is null and team_id is null) or
    (scope = 'team' and team_id is not null and sketch_id is null and service_id is null))`);
  await knex.raw('alter table quiet_windows add constraint quiet_windows_ends_after_start check (ends_at > starts_at)');
  await knex.raw('alter table quiet_windows add constraint quiet_windows_reason_present check (length(trim(reason)) > 0)');
  await knex.raw('create index quiet_windows_ends on quiet_windows (ends_at) where cancelled_at is null');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('quiet_windows');
}
