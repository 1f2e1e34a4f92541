import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/** Where the tests' private PostgreSQL cluster listens (not npm start's cluster). */
export const TEST_PG = {
  host: '127.0.0.1',
  port: Number(process.env.TEST_PGPORT ?? 54339),
  user: 'brimwatch',
};

/**
 * The migrated template's name carries a hash of the migrations, so a cluster
 * left running by an interrupted run never hands out a stale schema.
 */
function migrationsHash(): string {
  const dir = path.resolve('migrations');
  const hash = createHash('sha1');
  for (const f of fs.readdirSync(dir).sort()) hash.update(f).update(fs.readFileSync(path.join(dir, f)));
  return hash.digest('hex').slice(0, 10);
}

export const TEMPLATE_DB = `brimwatch_template_${migrationsHash()}`;

export const testDatabaseUrl = (name: string) => `postgres://${TEST_PG.user}@${TEST_PG.host}:${TEST_PG.port}/${name}`;
