import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { loadConfig } from '../../backend/src/config';
import type { Db } from '../../backend/src/db';
import { claimDueTargets } from '../../collectors/claim';
import { readSketch } from '../../collectors/exposition/read-sketch';
import { readingRows, type FinishedScrape } from '../../collectors/reading-rows';
import { alertsHookWith } from '../../collectors/sketch-level';
import { storeBatch } from '../../collectors/store';
import { BENCH_PG } from './bench-db';
import { makeDue } from './collection-fleet';
import type { BenchRow } from './report';
import { targetPage } from './sim-fleet';

const COLUMNS = ['target_id', 'sketch_id', 'taken_at', 'ok', 'failure_reason', 'stream_total', 'width', 'depth', 'counter_bytes', 'window_seconds', 'conservative', 'nonzero_cells', 'scrape_ms', 'is_reset', 'is_resize', 'judgement'];

function csvCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (value instanceof Date) return value.toISOString();
  if (Array.isArray(value)) return `"{${value.join(',')}}"`;
  const text = String(value);
  return /[",\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** psql from Debian's server packages, which sends `\copy … from` as COPY … FROM STDIN. */
function psqlPath(): string {
  const found = ['/usr/lib/postgresql/15/bin/psql', '/usr/bin/psql'].find((p) => fs.existsSync(p));
  if (!found) throw new Error("psql is not installed; install Debian's postgresql-client");
  return found;
}

/** Scrapes already read, one per target, as the loop hands them to the batch writer (the fetch is not part of this figure). */
async function finishedRound(db: Db, targetIds: number[], round: number): Promise<FinishedScrape[]> {
  await makeDue(db, targetIds, targetIds.length);
  const claimed = await claimDueTargets(db, 'bench-storage', targetIds.length, 3600);
  const indexOf = new Map(targetIds.map((id, i) => [id, i]));
  return claimed.map((target) => {
    const page = targetPage(indexOf.get(target.targetId)!, 1000 + round);
    const read = readSketch(page.body, page.contentType, target.sketchLabel);
    if (!read.ok) throw new Error(`the simulated page of target ${target.targetId} does not read: ${read.reason}`);
    return { target, takenAt: new Date(), outcome: { ok: true, sample: read.value, scrapeMs: 2.5 } };
  });
}

/**
 * Readings stored per second by the collector's batch writer (storeBatch: its
 * reads, the judgement, the readings, the target status, the leases and the
 * alerts hook, one transaction per batch of COLLECTOR_BATCH_SIZE), against
 * PostgreSQL's COPY of the same reading rows into the same table through psql.
 */
export async function storageRow(db: Db, url: string, dataDir: string, targetIds: number[], rounds: number): Promise<BenchRow> {
  const config = loadConfig({ DATABASE_URL: url });
  const settings = { owner: 'bench-storage', historyReadings: config.COLLECTOR_HISTORY_READINGS, alertsHook: alertsHookWith(), log: (m: string) => console.log(`  [store] ${m}`) };
  const copied: string[] = [];
  let writerMs = 0;
  let stored = 0;
  for (let round = 0; round < rounds; round++) {
    const finished = await finishedRound(db, targetIds, round);
    for (const done of finished) {
      const reading = readingRows(done, undefined, []).reading;
      copied.push(COLUMNS.map((c) => csvCell(reading[c])).join(','));
    }
    const started = performance.now();
    for (let i = 0; i < finished.length; i += config.COLLECTOR_BATCH_SIZE) {
      stored += (await storeBatch(db, finished.slice(i, i + config.COLLECTOR_BATCH_SIZE), settings)).stored;
    }
    writerMs += performance.now() - started;
  }
  if (stored !== copied.length) throw new Error(`the batch writer stored ${stored} of ${copied.length} readings`);

  const file = path.join(dataDir, 'readings.csv');
  fs.writeFileSync(file, `${copied.join('\n')}\n`);
  const database = new URL(url).pathname.slice(1);
  const started = performance.now();
  const copy = spawnSync(psqlPath(), ['-X', '-q', '-v', 'ON_ERROR_STOP=1', '-h', BENCH_PG.host, '-p', String(BENCH_PG.port), '-U', BENCH_PG.user, '-d', database, '-c', `\\copy readings (${COLUMNS.join(', ')}) from '${file}' with (format csv)`], { encoding: 'utf8' });
  const copyMs = performance.now() - started;
  if (copy.status !== 0) throw new Error(`COPY through psql failed: ${copy.stderr}`);

  const writer = stored / (writerMs / 1000);
  const baseline = copied.length / (copyMs / 1000);
  return {
    figure: `storage, ${stored.toLocaleString('en-GB')} readings`,
    measured: writer,
    baseline,
    baselineName: 'COPY FROM STDIN via psql',
    unit: 'readings/s',
    ratio: writer / baseline,
    goal: '≥ 0.5× COPY',
    met: writer / baseline >= 0.5,
  };
}
