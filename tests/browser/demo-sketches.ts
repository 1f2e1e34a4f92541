import type { Knex } from 'knex';

/** A demo sketch's id by its service and name (seeds/02_demo_sketches.ts registers them). */
export async function demoSketchId(db: Knex, service: string, sketch: string): Promise<number> {
  const row = await db('sketches as s').join('services as sv', 'sv.id', 's.service_id').where({ 'sv.name': service, 's.name': sketch }).first('s.id');
  if (!row) throw new Error(`the demo seed has no sketch ${service}/${sketch}; see ops/demo-fleet/scenario.ts`);
  return Number(row.id);
}
