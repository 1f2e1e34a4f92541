import type { Knex } from 'knex';

/** Every step of an alert's life, for its timeline: opened, level changes, acknowledgements, notices, escalation, resolution. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('alert_events', (t) => {
    t.bigIncrements('id');
    t.bigInteger('alert_id').notNullable().references('alerts.id').onDelete('CASCADE');
    t.bigInteger('sketch_id').notNullable().references('sketches.id').onDelete('CASCADE');
    t.timestamp('at', { useTz: true }).notNullable();
    t.text('kind').notNullable();
    t.text('level').notNullable();
    t.text('actor').notNullable(); // a login, "token:<label>" or "system"
    t.bigInteger('actor_user_id').references('users.id').onDelete('SET NULL');
    t.text('note');
    t.bigInteger('mail_id').references('mail_outbox.id').onDelete('SET NULL');
  });
  await knex.raw(`alter table alert_events add constraint alert_events_kind_known
    check (kind in ('opened','level_changed','acknowledged','resolved','notified','escalated'))`);
  await knex.raw('create index alert_events_alert on alert_events (alert_id, at, id)');
  await knex.raw('create index alert_events_sketch on alert_events (sketch_id, at desc)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('alert_events');
}
