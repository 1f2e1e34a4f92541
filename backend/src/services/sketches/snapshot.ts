import type { Knex } from 'knex';
import type { SketchSettingsView } from '../../api-types';
import { findSketch } from '../../queries/sketches';
import { settingsView } from './fleet';

export type SketchSnapshot = SketchSettingsView & { instances: { instance: string; targetUrl: string }[] };

/** What the audit log keeps of a sketch before and after a change: its settings and its targets. */
export async function sketchSnapshot(trx: Knex | Knex.Transaction, id: number): Promise<SketchSnapshot | undefined> {
  const row = await findSketch(trx, id);
  if (!row) return undefined;
  const targets = await trx('targets').where({ sketch_id: id }).orderBy('instance').select('instance', 'url');
  return { ...settingsView(row), instances: targets.map((t: { instance: string; url: string }) => ({ instance: t.instance, targetUrl: t.url })) };
}

/** The instance name a lone target gets: host and port of its address, the port spelled out. */
export function instanceNameOf(targetUrl: string): string {
  const url = new URL(targetUrl);
  const port = url.port || (url.protocol === 'https:' ? '443' : '80');
  return `${url.hostname}:${port}`;
}

/** PostgreSQL's unique_violation: a concurrent request registered the same name first; `constraint` narrows which. */
export function isUniqueViolation(err: unknown, constraint?: string): boolean {
  const e = err as { code?: string; constraint?: string } | null;
  return typeof e === 'object' && e !== null && e.code === '23505' && (constraint === undefined || e.constraint === constraint);
}
