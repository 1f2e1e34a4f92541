import { randomBytes } from 'node:crypto';
import { createDb, type Db } from '../../backend/src/db';
import { loadConfig, type Config } from '../../backend/src/config';
import { TEMPLATE_DB, testDatabaseUrl } from './test-pg';

export interface TestDatabase {
  name: string;
  url: string;
  db: Db;
  drop(): Promise<void>;
}

/** A fresh, migrated database for one test file, copied from the template the global setup built. */
export async function createTestDatabase(): Promise<TestDatabase> {
  const name = `bw_test_${randomBytes(5).toString('hex')}`;
  const admin = createDb(testDatabaseUrl('postgres_admin'), { max: 1 });
  try {
    await admin.raw(`create database ${name} template ${TEMPLATE_DB}`);
  } finally {
    await admin.destroy();
  }
  const url = testDatabaseUrl(name);
  const db = createDb(url);
  return {
    name,
    url,
    db,
    async drop() {
      await db.destroy();
      const again = createDb(testDatabaseUrl('postgres_admin'), { max: 1 });
      await again.raw(`drop database if exists ${name} with (force)`);
      await again.destroy();
    },
  };
}

/** The configuration a test server runs with: loopback, a free port, the test database. */
export function testConfig(url: string, overrides: Record<string, string> = {}): Config {
  return loadConfig({ NODE_ENV: 'test', PORT: '0', DATABASE_URL: url, DATA_DIR: '.data/test-run', DEMO: 'false', ...overrides });
}
