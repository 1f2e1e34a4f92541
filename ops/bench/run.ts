import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { BENCH_DIRS, openBenchCluster } from './bench-db';
import { loadCollectionFleet } from './collection-fleet';
import { collectionRows } from './collection';
import { cpuMeter, postmasterPid } from './cpu-time';
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
 * `npm run bench -- collection storage` runs only the figures named (any of
 * FIGURES); such a partial run is written to .data/bench…/last-partial-run.md
 * instead, so the run of record always holds every figure.
 */
const FIGURES = ['collection', 'storage', 'memory', 'fleet-api', 'dump'] as const;
type Figure = (typeof FIGURES)[number];
const asked = process.argv.slice(2);
const unknown = asked.filter((a) => !(FIGURES as readonly string[]).includes(a));
if (unknown.length > 0) {
  console.error(`[bench] unknown figure ${unknown.join(', ')}; choose from ${FIGURES.join(', ')} (none: all of them)`);
  process.exit(2);
}
const partial = asked.length > 0;
const wants = (figure: Figure) => !partial || asked.includes(figure);

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const startedAt = performance.now();
const step = (text: string) => console.log(`[bench] ${text} (${((performance.now() - startedAt) / 1000).toFixed(0)} s)`);
const rows: BenchRow[] = [];
const notes: string[] = [];

console.log(`[bench] ${machineLine()}`);
const dataDir = path.join(root, '.data', BENCH_DIRS.files);
fs.mkdirSync(dataDir, { recursive: true });
const pg = await openBenchCluster(root);
const fleet = await startSimulatedFleet(root);
try {
  if (wants('collection') || wants('storage') || wants('memory')) {
    step('loading 5,000 targets with an hour of history each');
    const collect = await pg.freshDatabase('bench_collect');
    const { targetIds } = await loadCollectionFleet(collect.db, fleet.port, 5000);
    if (wants('collection')) {
      step('collection');
      const meter = cpuMeter({ fleet: fleet.pid, postmaster: postmasterPid(pg.cluster.dir) });
      rows.push(...(await collectionRows(collect.url, fleet.url, targetIds, [1000, 5000], meter)));
    }
    if (wants('storage')) {
      step('storage');
      rows.push(...(await storageRows(collect.db, collect.url, dataDir, targetIds, 2)));
    }
    if (wants('memory')) {
      step('memory');
      rows.push(await memoryRow(root, collect.url, targetIds, 5000));
    }
    await collect.db.destroy();
  }

  if (wants('fleet-api')) {
    step('loading 10,000 sketches and 90 days of readings');
    const api = await pg.freshDatabase('bench_api');
    const { chartedSketchId, ...stored } = await loadFleetForApi(api.db);
    step('fleet API');
    rows.push(...(await fleetApiRows(api.db, api.url, chartedSketchId, stored)));
    await api.db.destroy();
  }

  if (wants('dump')) {
    step('dump analysis');
    rows.push(...(await dumpAnalysisRows(dataDir)));
  }
} finally {
  await fleet.stop();
  await pg.close();
}

const seconds = (performance.now() - startedAt) / 1000;
console.log(`\n${textTable(rows)}\n`);
for (const row of rows) if (row.note) notes.push(`${row.figure}: ${row.note}`);
notes.push(
  'The simulated fleet (ops/bench/target-server.ts) runs as a process of its own; the bare loop and the pipeline share this process and its concurrency (COLLECTOR_CONCURRENCY).',
  `COPY is psql's \\copy … from a CSV file, which psql sends as COPY … FROM STDIN; PostgreSQL 15 (Debian) with its default settings, fsync on, in .data/${BENCH_DIRS.cluster}.`,
  'Figures move with whatever else runs on the machine; the load average above says how busy it was.',
);
if (partial) notes.unshift(`A partial run: only ${asked.join(', ')}.`);
const report = partial ? path.join(dataDir, 'last-partial-run.md') : path.join(root, 'ops/bench/last-run.md');
writeReport(report, rows, notes, seconds);
console.log(`[bench] written to ${path.relative(root, report)}; whole run ${seconds.toFixed(0)} s`);
process.exit(rows.every((r) => r.met) ? 0 : 1);
