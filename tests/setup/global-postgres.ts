import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { openCluster } from '../../ops/postgres/cluster';
import { createDb } from '../../backend/src/db';
import { TEST_CLUSTER_NAME, TEST_PG, TEMPLATE_DB } from './test-pg';

/**
 * Starts the tests' own PostgreSQL cluster (own folder, own port, separate from
 * `npm start`'s), and migrates a template database from scratch. Each test file
 * then copies the template into a database of its own (see database.ts), so
 * files run in parallel without seeing each other's rows.
 */
export default async function setup(project: TestProject) {
  const cluster = openCluster({
    dataDir: path.resolve('.data'),
    name: TEST_CLUSTER_NAME,
    host: TEST_PG.host,
    port: TEST_PG.port,
    user: TEST_PG.user,
    extraSettings: ['fsync=off', 'synchronous_commit=off', 'full_page_writes=off', 'max_connections=300'],
  });
  const startedHere = !cluster.isRunning();
  cluster.start();
  cluster.createDatabase('postgres_admin');

  const admin = createDb(`postgres://${TEST_PG.user}@${TEST_PG.host}:${TEST_PG.port}/postgres_admin`, { max: 1 });
  const exists = await admin.raw('select 1 from pg_database where datname = ?', [TEMPLATE_DB]);
  if (exists.rows.length === 0) {
    await admin.raw(`create database ${TEMPLATE_DB}`);
    const template = createDb(`postgres://${TEST_PG.user}@${TEST_PG.host}:${TEST_PG.port}/${TEMPLATE_DB}`, { max: 1 });
    await template.migrate.latest();
    await template.destroy();
  }
  await admin.destroy();
  project.provide('pgReady', true);

  return async () => {
    if (startedHere) cluster.stop();
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    pgReady: boolean;
  }
}
