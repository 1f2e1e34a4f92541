import type { Knex } from 'knex';

/**
 * The mail outbox: every e-mail Brimwatch decides to send is first a row here,
 * written in the same transaction as the alert change that called for it. A
 * sender drains the rows with retries; the row keeps the attempts, the next
 * try, the last error and, once sent, the SMTP message id.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mail_outbox', (t) => {
    t.bigIncrements('id');
    t.text('kind').notNullable(); // alert | digest
    t.bigInteger('alert_id').references('alerts.id').onDelete('SET NULL');
    t.bigInteger('team_id').references('teams.id').onDelete('SET NULL');
    // Set where two processes could decide the same message (the daily digest): the second insert is a no-op.
    t.text('dedupe_key').unique();
    t.specificType('recipients', 'text[]').notNullable();
    t.text('subject').notNullable();
    t.text('text_body').notNullable();
    t.text('html_body').notNullable();
    t.integer('attempts').notNullable().defaultTo(0);
    t.timestamp('next_attempt_at', { useTz: true }).notNullable();
    t.text('last_error');
    t.timestamp('sent_at', { useTz: true });
    t.text('smtp_message_id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`alter table mail_outbox add constraint mail_outbox_kind_known check (kind in ('alert','digest'))`);
  await knex.raw(`alter table mail_outbox add constraint mail_outbox_has_recipients check (cardinality(recipients) > 0)`);
  await knex.raw('create index mail_outbox_due on mail_outbox (next_attempt_at) where sent_at is null');
  await knex.raw('create index mail_outbox_alert on mail_outbox (alert_id)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('mail_outbox');
}
