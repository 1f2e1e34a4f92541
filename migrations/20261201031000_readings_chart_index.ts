import type { Knex } from 'knex';

/**
 * A sketch's chart reads up to 90 days of its readings bucketed by time. This
 * index holds every figure the buckets need, so PostgreSQL answers from the
 * index alone (an index-only scan) instead of visiting one table page per
 * reading, which for 30-second readings is some 260,000 pages per chart.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('create index readings_chart on readings (sketch_id, taken_at) include (stream_total, ok, width, depth)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists readings_chart');
}
