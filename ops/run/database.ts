import fs from 'node:fs';
import path from 'node:path';
import { tsImport } from 'tsx/esm/api';
import type { Db } from '../../backend/src/db';

type SeedFile = { seed(knex: Db): Promise<void> };

/** Migrations to latest, then the demo scenario — only into an empty database, so nothing stored is ever overwritten. */
export async function prepareDatabase(db: Db, seedsDir: string, log: (line: string) => void, demo: boolean): Promise<void> {
  const [, applied] = (await db.migrate.latest()) as [number, string[]];
  log(applied.length ? `Applied ${applied.length} migration(s): ${applied.join(', ')}` : 'The database schema is up to date.');
  if (!demo) return;
  const { count } = (await db('teams').count<{ count: number }[]>({ count: '*' }))[0];
  if (Number(count) > 0) {
    log('The database already holds data: the demo scenario is not loaded again.');
    return;
  }
  await runSeeds(db, seedsDir);
  log('Loaded the demo scenario (an invented online marketplace).');
}

/** Runs every seed file in name order inside one transaction: a half-loaded demo never stays behind. */
export async function runSeeds(db: Db, seedsDir: string): Promise<void> {
  const files = fs.readdirSync(seedsDir).filter((f) => f.endsWith('.ts')).sort();
  await db.transaction(async (trx) => {
    for (const file of files) {
      const mod = (await tsImport(path.join(seedsDir, file), import.meta.url)) as SeedFile;
      await mod.seed(trx);
    }
  });
}
