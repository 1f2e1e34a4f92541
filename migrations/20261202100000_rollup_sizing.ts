import type { Knex } from 'knex';

/**
 * The sizing behind each hourly rollup, so a chart drawn from rollups can work
 * out load against the sketch's current budget (as charts drawn from raw
 * readings do) and label a resize with the width and depth it moved to:
 * the width and depth of the hour's highest good total, and of its last —
 * and that last reading's non-zero cells per row, for the occupancy chart.
 * Rows rolled up before this migration keep nulls and fall back to the load
 * judged at the time.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table reading_rollups_hourly
    add column peak_width integer, add column peak_depth integer,
    add column last_width integer, add column last_depth integer, add column last_nonzero_cells integer[]`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`alter table reading_rollups_hourly
    drop column peak_width, drop column peak_depth, drop column last_width, drop column last_depth, drop column last_nonzero_cells`);
}
