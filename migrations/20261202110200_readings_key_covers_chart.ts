import type { Knex } from 'knex';

/**
 * The primary key (sketch_id, taken_at, id) and readings_chart (sketch_id,
 * taken_at) covered the same rows in the same order; the key now carries the
 * chart's figures itself, so charts still read from an index alone and every
 * reading stored costs one index entry fewer.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('alter table readings drop constraint readings_pkey');
  await knex.raw('alter table readings add primary key (sketch_id, taken_at, id) include (stream_total, ok, width, depth)');
  await knex.raw('drop index if exists readings_chart');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('create index readings_chart on readings (sketch_id, taken_at) include (stream_total, ok, width, depth)');
  await knex.raw('alter table readings drop constraint readings_pkey');
  await knex.raw('alter table readings add primary key (sketch_id, taken_at, id)');
}
