import type { Knex } from 'knex';

/**
 * Sign-in state: the session store's table (created here rather than by the
 * store itself, so the schema is versioned with the rest), API tokens kept as
 * hashes only, and indexes for the audit log's filters.
 */
export async function up(knex: Knex): Promise<void> {
  // The layout connect-pg-simple expects (its table.sql), under a name of our own.
  await knex.raw(`create table web_sessions (
    sid varchar not null primary key,
    sess json not null,
    expire timestamp(6) not null
  )`);
  await knex.raw('create index web_sessions_expire on web_sessions (expire)');

  await knex.schema.createTable('api_tokens', (t) => {
    t.bigIncrements('id');
    t.bigInteger('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('label').notNullable();
    t.text('token_hash').notNullable().unique();
    t.text('prefix').notNullable(); // the first characters, so a person can tell tokens apart without the secret
    t.text('role').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('last_used_at', { useTz: true });
    t.timestamp('revoked_at', { useTz: true });
    t.bigInteger('revoked_by').references('users.id').onDelete('SET NULL');
  });
  await knex.raw(`alter table api_tokens add constraint api_tokens_role_known check (role in ('viewer','responder','owner','sre','admin'))`);
  await knex.raw(`alter table api_tokens add constraint api_tokens_label_present check (length(trim(label)) > 0)`);
  await knex.raw('create index api_tokens_user on api_tokens (user_id)');

  await knex.raw('create index audit_log_actor on audit_log (actor, at desc)');
  await knex.raw('create index audit_log_action on audit_log (action, at desc)');
  await knex.raw('create index audit_log_subject on audit_log (subject_type, subject_id, at desc)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists audit_log_subject');
  await knex.raw('drop index if exists audit_log_action');
  await knex.raw('drop index if exists audit_log_actor');
  await knex.schema.dropTableIfExists('api_tokens');
  await knex.schema.dropTableIfExists('web_sessions');
}
