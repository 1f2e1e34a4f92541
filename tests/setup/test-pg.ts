import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

const DEFAULT_TEST_PORT = 54339;

/** Where the tests' private PostgreSQL cluster listens (not npm start's cluster). */
export const TEST_PG = {
  host: '127.0.0.1',
  port: Number(process.env.TEST_PGPORT ?? DEFAULT_TEST_PORT),
  user: 'brimwatch',
};

/**
 * The cluster's folder under .data: another TEST_PGPORT gets a folder of its own, so two test runs
 * on one checkout neither share a data directory nor stop each other's server.
 */
export const TEST_CLUSTER_NAME = TEST_PG.port === DEFAULT_TEST_PORT ? 'test-pg' : `test-pg-${TEST_PG.port}`;

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
