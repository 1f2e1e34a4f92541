import type { Knex } from 'knex';

/**
 * What the fleet API reads often: sketches by team (filters, owners' views),
 * services by team, and the few readings that mark a reset or a resize (the
 * chart markers), which a partial index finds without scanning a sketch's
 * whole history.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('create index sketches_team on sketches (team_id)');
  await knex.raw('create index services_team on services (team_id)');
  await knex.raw('create index readings_markers on readings (sketch_id, taken_at) where is_reset or is_resize');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists readings_markers');
  await knex.raw('drop index if exists services_team');
  await knex.raw('drop index if exists sketches_team');
}
