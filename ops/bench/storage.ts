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
import { judgeBatch, storeBatch, writeJudged, type JudgedBatch } from '../../collectors/store';
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

/** Runs `task` over the batches, STORES_AT_ONCE at a time as the loop does; returns the milliseconds taken. */
async function overBatches<T>(batches: T[], task: (batch: T) => Promise<void>): Promise<number> {
  const queue = [...batches];
  const started = performance.now();
  const work = async () => {
    for (let batch = queue.shift(); batch; batch = queue.shift()) await task(batch);
  };
  await Promise.all(Array.from({ length: STORES_AT_ONCE }, work));
  return performance.now() - started;
}

/**
 * Readings stored per second by the collector's batch writer (writeJudged: one
 * transaction per batch of COLLECTOR_BATCH_SIZE for the leases, the readings,
 * the target status, the sketches' levels and the alerts hook; STORES_AT_ONCE
 * batches at a time), against PostgreSQL's COPY of the same reading rows into
 * the same table through psql. Beside it, untimed against the goal: the
 * judging stage before the writer (status and history reads, the judgement of
 * each reading), both stages as the loop runs them (storeBatch), and the
 * writer's INSERT of the readings alone. The loop's history cache is warmed
 * by one untimed round, as a running collector's is.
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
  const inBatches = <T>(items: T[]) => Array.from({ length: Math.ceil(items.length / batchSize) }, (_, b) => items.slice(b * batchSize, (b + 1) * batchSize));
  const readings: Record<string, unknown>[] = [];
  let judgeMs = 0;
  let writerMs = 0;
  let bothMs = 0;
  let stored = 0;
  let storedBoth = 0;
  // Round 0 warms up; then `rounds` rounds as the loop runs them, and `rounds` with the two stages timed apart.
  for (let round = 0; round <= 2 * rounds; round++) {
    const finished = await finishedRound(db, targetIds, round);
    if (round <= rounds) {
      const ms = await overBatches(inBatches(finished), async (batch) => {
        const { stored: n } = await storeBatch(db, batch, settings);
        if (round > 0) storedBoth += n;
      });
      if (round > 0) bothMs += ms;
      continue;
    }
    const judged: JudgedBatch[] = [];
    judgeMs += await overBatches(inBatches(finished), async (batch) => {
      judged.push(await judgeBatch(db, batch, settings));
    });
    writerMs += await overBatches(judged, async (batch) => {
      // Awaited first: `stored += await …` would read `stored` before the await and lose the other batches' counts.
      const { stored: n } = await writeJudged(db, batch, settings);
      stored += n;
    });
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
    row('storage, judging before the writer (reads, judgement)', stored / (judgeMs / 1000), '—', true),
    row('storage, judging and writer as the loop runs them', storedBoth / (bothMs / 1000), '—', true),
  ];
}
