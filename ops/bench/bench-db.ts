import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { openCluster, type Cluster } from '../postgres/cluster';
import { createDb, type Db } from '../../backend/src/db';

const DEFAULT_BENCH_PORT = 54369;
export const BENCH_PG = { host: '127.0.0.1', port: Number(process.env.BENCH_PGPORT ?? DEFAULT_BENCH_PORT), user: 'brimwatch' };
/**
 * Folders of this port's run under .data: a cluster on another BENCH_PGPORT gets a folder of its own,
 * so two runs on one checkout neither share a data directory nor stop each other's server.
 */
export const BENCH_DIRS = BENCH_PG.port === DEFAULT_BENCH_PORT ? { cluster: 'bench-pg', files: 'bench' } : { cluster: `bench-pg-${BENCH_PG.port}`, files: `bench-${BENCH_PG.port}` };
export const benchUrl = (name: string) => `postgres://${BENCH_PG.user}@${BENCH_PG.host}:${BENCH_PG.port}/${name}`;

/** A template migrated from scratch, named by the migrations' hash so a changed schema is never reused. */
function templateName(root: string): string {
  const dir = path.join(root, 'migrations');
  const hash = createHash('sha1');
  for (const f of fs.readdirSync(dir).sort()) hash.update(f).update(fs.readFileSync(path.join(dir, f)));
  return `bench_template_${hash.digest('hex').slice(0, 10)}`;
}

export interface BenchCluster {
  cluster: Cluster;
  /** A fresh, migrated database of this name (dropped first if a previous run left it). */
  freshDatabase(name: string): Promise<{ url: string; db: Db }>;
  /** Stops the cluster if this run started it. */
  close(): Promise<void>;
}

/**
 * The benchmark's own PostgreSQL cluster (own folder and port, Debian's server
 * with its default settings: fsync and synchronous commit on, as in production).
 */
export async function openBenchCluster(root: string): Promise<BenchCluster> {
  const cluster = openCluster({ dataDir: path.join(root, '.data'), name: BENCH_DIRS.cluster, ...BENCH_PG, extraSettings: ['max_connections=200'] });
  const startedHere = !cluster.isRunning();
  cluster.start();
  cluster.createDatabase('bench_admin');
  const template = templateName(root);
  const admin = createDb(benchUrl('bench_admin'), { max: 1 });
  const exists = await admin.raw('select 1 from pg_database where datname = ?', [template]);
  if (exists.rows.length === 0) {
    await admin.raw(`create database ${template}`);
    const db = createDb(benchUrl(template), { max: 1 });
    await db.migrate.latest();
    await db.destroy();
  }
  return {
    cluster,
    async freshDatabase(name) {
      await admin.raw(`drop database if exists ${name} with (force)`);
      await admin.raw(`create database ${name} template ${template}`);
      return { url: benchUrl(name), db: createDb(benchUrl(name), { max: 10 }) };
    },
    async close() {
      await admin.destroy();
      if (startedHere) cluster.stop();
    },
  };
}
