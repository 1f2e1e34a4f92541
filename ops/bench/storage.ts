import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { loadConfig } from '../../backend/src/config';
import type { Db } from '../../backend/src/db';
import { claimDueTargets } from '../../collectors/claim';
import { readSketch } from '../../collectors/exposition/read-sketch';
import { readingRows, type FinishedScrape } from '../../collectors/reading-rows';
import { alertsHookWith } from '../../collectors/sketch-level';
import { HistoryCache } from '../../collectors/history-cache';
import { STORES_AT_ONCE } from '../../collectors/loop';
import { storeBatch } from '../../collectors/store';
import { BENCH_PG } from './bench-db';
import { makeDue } from './collection-fleet';
import { median, type BenchRow } from './report';
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
 * Readings stored per second by the collector's batch writer as the loop runs
 * it (storeBatch: its reads, the judgement, the reading, the target status, the
 * lease and the alerts hook, one transaction per batch of COLLECTOR_BATCH_SIZE,
 * STORES_AT_ONCE batches at a time, with the loop's history cache warmed by one
 * untimed round), against PostgreSQL's COPY of the same reading rows into the
 * same table through psql. A second row times the writer's INSERT of the
 * readings alone, to show where the rest of its time goes.
 */
export async function storageRows(db: Db, url: string, dataDir: string, targetIds: number[], rounds: number): Promise<BenchRow[]> {
  const config = loadConfig({ DATABASE_URL: url });
  const batchSize = config.COLLECTOR_BATCH_SIZE;
  const settings = {
    owner: 'bench-storage',
    historyReadings: config.COLLECTOR_HISTORY_READINGS,
    alertsHook: alertsHookWith(),
    log: (m: string) => console.log(`  [store] ${m}`),
    historyCache: new HistoryCache(config.COLLECTOR_HISTORY_READINGS),
  };
  const readings: Record<string, unknown>[] = [];
  let writerMs = 0;
  let stored = 0;
  for (let round = 0; round <= rounds; round++) {
    const finished = await finishedRound(db, targetIds, round);
    const batches = Array.from({ length: Math.ceil(finished.length / batchSize) }, (_, b) => finished.slice(b * batchSize, (b + 1) * batchSize));
    const started = performance.now();
    const work = async () => {
      for (let batch = batches.shift(); batch; batch = batches.shift()) {
        const { stored: n } = await storeBatch(db, batch, settings);
        if (round > 0) stored += n;
      }
    };
    await Promise.all(Array.from({ length: STORES_AT_ONCE }, work));
    if (round === 0) continue;
    writerMs += performance.now() - started;
    for (const done of finished) readings.push(readingRows(done, undefined, []).reading);
  }
  if (stored !== readings.length) throw new Error(`the batch writer stored ${stored} of ${readings.length} readings`);

  // The same rows again, three times each way; the median run counts, as one slow moment should not.
  const insertRuns: number[] = [];
  for (let run = 0; run < 3; run++) {
    const started = performance.now();
    for (let i = 0; i < readings.length; i += batchSize) await db.transaction((trx) => trx('readings').insert(readings.slice(i, i + batchSize)));
    insertRuns.push(performance.now() - started);
  }
  const insertMs = median(insertRuns);

  const file = path.join(dataDir, 'readings.csv');
  fs.writeFileSync(file, `${readings.map((r) => COLUMNS.map((c) => csvCell(r[c])).join(',')).join('\n')}\n`);
  const database = new URL(url).pathname.slice(1);
  const copyRuns: number[] = [];
  for (let run = 0; run < 3; run++) {
    const started = performance.now();
    const copy = spawnSync(psqlPath(), ['-X', '-q', '-v', 'ON_ERROR_STOP=1', '-h', BENCH_PG.host, '-p', String(BENCH_PG.port), '-U', BENCH_PG.user, '-d', database, '-c', `\\copy readings (${COLUMNS.join(', ')}) from '${file}' with (format csv)`], { encoding: 'utf8' });
    copyRuns.push(performance.now() - started);
    if (copy.status !== 0) throw new Error(`COPY through psql failed: ${copy.stderr}`);
  }
  const copyMs = median(copyRuns);

  const baseline = readings.length / (copyMs / 1000);
  const row = (figure: string, rate: number, goal: string, met: boolean): BenchRow => ({
    figure, measured: rate, baseline, baselineName: 'COPY FROM STDIN via psql', unit: 'readings/s', ratio: rate / baseline, goal, met,
  });
  const writer = stored / (writerMs / 1000);
  return [
    row(`storage, batch writer, ${stored.toLocaleString('en-GB')} readings`, writer, '≥ 0.5× COPY', writer / baseline >= 0.5),
    row('storage, its INSERT of the readings alone', readings.length / (insertMs / 1000), '—', true),
  ];
}
