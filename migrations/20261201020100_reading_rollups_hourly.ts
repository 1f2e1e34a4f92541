import type { Knex } from 'knex';

/**
 * One row per target and hour, kept long after the raw readings are dropped
 * (RAW_RETENTION_DAYS): enough to chart months of saturation and to find the
 * per-window peaks a windowed sketch's forecast needs. Also an index to find
 * a target's latest resize, where its current sizing epoch began.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`create table reading_rollups_hourly (
    target_id bigint not null,
    sketch_id bigint not null,
    hour timestamptz not null,
    readings integer not null,
    failures integer not null,
    min_stream_total double precision,
    max_stream_total double precision,
    max_at timestamptz,
    last_stream_total double precision,
    last_level text,
    max_load double precision,
    resets integer not null default 0,
    resizes integer not null default 0,
    primary key (target_id, hour)
  )`);
  await knex.raw('create index reading_rollups_hourly_sketch on reading_rollups_hourly (sketch_id, hour)');
  await knex.raw('create index readings_resizes on readings (target_id, taken_at desc) where is_resize');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists readings_resizes');
  await knex.schema.dropTableIfExists('reading_rollups_hourly');
}
