import path from 'node:path';
import { fileURLToPath } from 'node:url';
import fs from 'node:fs';
import knex, { type Knex } from 'knex';
import pg from 'pg';
import { tsImport } from 'tsx/esm/api';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

// bigint columns (counts, ids) come back as JS numbers: our ids and totals stay well below 2^53.
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number(v));

export type Db = Knex;

/** One Knex instance per process; migrations and seeds are TypeScript files run under tsx. */
export function createDb(connectionString: string, pool: { min?: number; max?: number } = {}): Db {
  return knex({
    client: 'pg',
    connection: { connectionString, application_name: `brimwatch-${path.basename(process.argv[1] ?? 'node')}` },
    pool: { min: pool.min ?? 0, max: pool.max ?? 10 },
    migrations: { migrationSource: typeScriptFolder(path.join(root, 'migrations')), tableName: 'knex_migrations' },
  });
}

/** True when the database answers a trivial query within the timeout. */
export async function databaseAnswers(db: Db, timeoutMs = 2000): Promise<{ up: true } | { up: false; reason: string }> {
  let timer: NodeJS.Timeout | undefined;
  try {
    await Promise.race([
      db.raw('select 1'),
      new Promise((_, reject) => {
        timer = setTimeout(() => reject(new Error(`no answer within ${timeoutMs} ms`)), timeoutMs);
      }),
    ]);
    return { up: true };
  } catch (err) {
    return { up: false, reason: err instanceof Error ? err.message : String(err) };
  } finally {
    clearTimeout(timer);
  }
}

type Migration = { up(knex: Knex): Promise<void>; down(knex: Knex): Promise<void> };

/**
 * Migrations are TypeScript; loading them through tsx's API works the same
 * under `npm start`, the CLI and vitest, whatever loader the process has.
 */
function typeScriptFolder(dir: string): Knex.MigrationSource<string> {
  return {
    getMigrations: async () => fs.readdirSync(dir).filter((f) => /^\d{14}_.+\.ts$/.test(f)).sort(),
    getMigrationName: (file) => file,
    getMigration: async (file) => (await tsImport(path.join(dir, file), import.meta.url)) as Migration,
  };
}
