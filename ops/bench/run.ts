import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { openBenchCluster } from './bench-db';
import { loadCollectionFleet } from './collection-fleet';
import { collectionRows } from './collection';
import { storageRows } from './storage';
import { loadFleetForApi } from './fleet-api-data';
import { fleetApiRows } from './fleet-api';
import { dumpAnalysisRows } from './dump-analysis';
import { memoryRow } from './memory';
import { startSimulatedFleet } from './fleet-process';
import { machineLine, textTable, writeReport, type BenchRow } from './report';

/**
 * `npm run bench`: every figure beside a baseline measured in the same run on
 * this machine, printed as a table and written to ops/bench/last-run.md.
 */
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const startedAt = performance.now();
const step = (text: string) => console.log(`[bench] ${text} (${((performance.now() - startedAt) / 1000).toFixed(0)} s)`);
const rows: BenchRow[] = [];
const notes: string[] = [];

console.log(`[bench] ${machineLine()}`);
const dataDir = path.join(root, '.data', 'bench');
fs.mkdirSync(dataDir, { recursive: true });
const pg = await openBenchCluster(root);
const fleet = await startSimulatedFleet(root);
try {
  step('loading 5,000 targets with an hour of history each');
  const collect = await pg.freshDatabase('bench_collect');
  const { targetIds } = await loadCollectionFleet(collect.db, fleet.port, 5000);
  step('collection');
  rows.push(...(await collectionRows(collect.url, fleet.url, targetIds, [1000, 5000])));
  step('storage');
  rows.push(...(await storageRows(collect.db, collect.url, dataDir, targetIds, 2)));
  step('memory');
  rows.push(await memoryRow(root, collect.url, targetIds, 5000));
  await collect.db.destroy();

  step('loading 10,000 sketches and 90 days of readings');
  const api = await pg.freshDatabase('bench_api');
  const { chartedSketchId, ...stored } = await loadFleetForApi(api.db);
  step('fleet API');
  rows.push(...(await fleetApiRows(api.db, api.url, chartedSketchId, stored)));
  await api.db.destroy();

  step('dump analysis');
  rows.push(...(await dumpAnalysisRows(dataDir)));
} finally {
  await fleet.stop();
  await pg.close();
}

const seconds = (performance.now() - startedAt) / 1000;
console.log(`\n${textTable(rows)}\n`);
for (const row of rows) if (row.note) notes.push(`${row.figure}: ${row.note}`);
notes.push(
  'The simulated fleet (ops/bench/target-server.ts) runs as a process of its own; the bare loop and the pipeline share this process and its concurrency (COLLECTOR_CONCURRENCY).',
  "COPY is psql's \\copy … from a CSV file, which psql sends as COPY … FROM STDIN; PostgreSQL 15 (Debian) with its default settings, fsync on, in .data/bench-pg.",
  'Figures move with whatever else runs on the machine; the load average above says how busy it was.',
);
writeReport(path.join(root, 'ops/bench/last-run.md'), rows, notes, seconds);
console.log(`[bench] written to ops/bench/last-run.md; whole run ${seconds.toFixed(0)} s`);
process.exit(rows.every((r) => r.met) ? 0 : 1);
