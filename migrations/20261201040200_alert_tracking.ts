import type { Knex } from 'knex';

/**
 * What the alert engine needs to remember between readings: since when the
 * alert holds its level (escalation counts from there), since when the sketch
 * has been calmly clear (the settling period before it resolves), what the
 * team was last told, and when the alert was escalated.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('alerts', (t) => {
    t.timestamp('level_since', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('clear_since', { useTz: true });
    t.text('last_notified_level');
    t.text('last_notified_kind');
    t.timestamp('escalated_at', { useTz: true });
  });
  await knex.raw(`alter table alerts add constraint alerts_level_known check (level in ('watch','brimmed','stale','unreachable'))`);
  await knex.raw('create index alerts_live on alerts (state) where state <> \'resolved\'');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists alerts_live');
  await knex.raw('alter table alerts drop constraint if exists alerts_level_known');
  await knex.schema.alterTable('alerts', (t) => {
    t.dropColumns('level_since', 'clear_since', 'last_notified_level', 'last_notified_kind', 'escalated_at');
  });
}
