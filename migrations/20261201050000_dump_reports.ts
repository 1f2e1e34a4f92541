import type { Knex } from 'knex';

/**
 * Counter dump checks, kept so a report can be listed and reopened later:
 * who uploaded what, for which sketch (if any), and the report itself. The
 * uploader's login is copied so the list still says who after a user is gone;
 * a deleted sketch leaves its reports behind, unattached.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('dump_reports', (t) => {
    t.bigIncrements('id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.bigInteger('user_id').references('users.id').onDelete('SET NULL');
    t.text('user_login').notNullable();
    t.bigInteger('sketch_id').references('sketches.id').onDelete('SET NULL');
    t.text('file_name').notNullable();
    t.text('format').notNullable();
    t.bigInteger('byte_size').notNullable();
    t.integer('width').notNullable();
    t.integer('depth').notNullable();
    t.text('level').notNullable();
    t.jsonb('report').notNullable();
  });
  await knex.raw(`alter table dump_reports add constraint dump_reports_format_known check (format in ('csv','json','u32le','u64le'))`);
  await knex.raw(`alter table dump_reports add constraint dump_reports_level_known check (level in ('clear','watch','brimmed'))`);
  await knex.raw('create index dump_reports_created on dump_reports (created_at desc, id desc)');
  await knex.raw('create index dump_reports_sketch on dump_reports (sketch_id, created_at desc)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('dump_reports');
}
