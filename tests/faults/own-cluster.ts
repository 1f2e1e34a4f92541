import path from 'node:path';
import { createDb, type Db } from '../../backend/src/db';
import { openCluster, type Cluster } from '../../ops/postgres/cluster';

export interface OwnCluster {
  cluster: Cluster;
  url: string;
  db: Db;
  close(): Promise<void>;
}

/**
 * A PostgreSQL cluster of the test's own (own folder, own port), for tests
 * that stop and start the server: the shared test cluster is never touched.
 * The database is created and migrated from scratch on every run.
 */
export async function startOwnCluster(name: string, port: number): Promise<OwnCluster> {
  const user = 'brimwatch';
  const cluster = openCluster({ dataDir: path.resolve('.data'), name, host: '127.0.0.1', port, user, extraSettings: ['fsync=off', 'synchronous_commit=off', 'full_page_writes=off'] });
  cluster.start();
  cluster.createDatabase('faults_admin');
  const admin = createDb(`postgres://${user}@127.0.0.1:${port}/faults_admin`, { max: 1 });
  await admin.raw('drop database if exists faults with (force)');
  await admin.raw('create database faults');
  await admin.destroy();
  const url = `postgres://${user}@127.0.0.1:${port}/faults`;
  const db = createDb(url, { max: 4 });
  await db.migrate.latest();
  return {
    cluster,
    url,
    db,
    async close() {
      await db.destroy();
      cluster.stop();
    },
  };
}
