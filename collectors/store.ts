import type { Knex } from 'knex';
import type { HealthLevel, TotalReading } from '../backend/src/maths';
import { writeBatch } from './batch-write';
import type { HistoryCache } from './history-cache';
import { loadHistory } from './reading-history';
import { readingRows, type FinishedScrape, type PreviousStatus, type ReadingRows } from './reading-rows';
import { nextScrapeAt } from './schedule';
import { rejudgeSketches, type AlertsHook } from './sketch-level';

export interface StoreSettings {
  owner: string;
  /** Good readings per target the forecast is fitted to. */
  historyReadings: number;
  alertsHook: AlertsHook;
  log: (message: string) => void;
  /** This process's recent history per target; without it every batch reads its history from the database. */
  historyCache?: HistoryCache;
}

export interface StoredBatch {
  stored: number;
  /** Scrapes whose lease another collector had taken over by the time they finished; not stored. */
  leaseConflicts: number;
  levels: HealthLevel[];
}

async function previousStatuses(db: Knex, targetIds: number[]): Promise<Map<number, PreviousStatus>> {
  const rows = await db('target_status')
    .whereIn('target_id', targetIds)
    .select('target_id', 'level', 'level_since', 'failures_in_row', 'stream_total', 'width', 'depth', 'last_ok_at');
  return new Map(
    rows.map((r) => [
      Number(r.target_id),
      { level: r.level, levelSince: r.level_since, failuresInRow: r.failures_in_row, streamTotal: r.stream_total, width: r.width, depth: r.depth, lastOkAt: r.last_ok_at },
    ]),
  );
}

/** One scrape turned into rows; a judgement that throws is a fault of ours, stored as a failed reading rather than lost. */
function rowsFor(done: FinishedScrape, previous: PreviousStatus | undefined, history: Map<number, { t: number; total: number }[]>, log: StoreSettings['log']): ReadingRows {
  try {
    return readingRows(done, previous, history.get(done.target.targetId) ?? []);
  } catch (err) {
    const reason = `could not judge the reading: ${err instanceof Error ? err.message : String(err)}`;
    log(`target ${done.target.targetId}: ${reason}`);
    return readingRows({ ...done, outcome: { ok: false, kind: 'bad value', reason, scrapeMs: done.outcome.scrapeMs } }, previous, []);
  }
}

/** A batch of finished scrapes judged and turned into rows, waiting for the batch writer. */
export interface JudgedBatch {
  rows: { done: FinishedScrape; rows: ReadingRows }[];
  history: Map<number, TotalReading[]>;
}

/**
 * The first stage of storing: reads each target's latest word and forecast
 * history (from this process's cache where it holds), judges every scrape
 * (reset, resize, level, forecast) and builds its rows. Reads only.
 */
export async function judgeBatch(db: Knex, batch: FinishedScrape[], settings: StoreSettings): Promise<JudgedBatch> {
  const previous = await previousStatuses(db, batch.map((d) => d.target.targetId));
  const history = await historyOf(db, batch, previous, settings);
  return { history, rows: batch.map((done) => ({ done, rows: rowsFor(done, previous.get(done.target.targetId), history, settings.log) })) };
}

/**
 * The batch writer: stores a judged batch in one transaction. Each target
 * moves to its next slot and its lease is freed, its reading is inserted and
 * its target_status updated (one statement for the three), and every sketch
 * touched is re-judged (worst instance) and handed to the alerts. Either all
 * of it is written or none: a database that goes away mid-batch leaves no
 * half-written reading, and the leases simply expire.
 */
export async function writeJudged(db: Knex, judged: JudgedBatch, settings: StoreSettings): Promise<StoredBatch> {
  const { rows, history } = judged;
  if (rows.length === 0) return { stored: 0, leaseConflicts: 0, levels: [] };
  const stored = await db.transaction(async (trx) => {
    // The next slot is the first after the scrape began, so a late scrape still leaves the following
    // round its own scrape; and at least half an interval after the slot just served, so a new
    // target's first two scrapes are not back to back.
    const held = await writeBatch(
      trx,
      settings.owner,
      rows.map(({ done: { target, takenAt }, rows: r }) => ({
        targetId: target.targetId,
        nextScrapeAt: new Date(nextScrapeAt(target.targetId, target.intervalSeconds, Math.max(takenAt.getTime(), target.dueAt.getTime() + target.intervalSeconds * 500))),
        rows: r,
      })),
    );
    const kept = rows.filter(({ done }) => held.has(done.target.targetId));
    if (kept.length > 0) await rejudgeSketches(trx, [...new Set(kept.map((r) => r.done.target.sketchId))], settings.alertsHook, settings.log);
    return { stored: kept.length, leaseConflicts: rows.length - kept.length, levels: kept.map((r) => r.rows.level) };
  });
  if (settings.historyCache) {
    for (const { done, rows: r } of rows) {
      if (!r.good || !done.outcome.ok || done.outcome.sample.windowSeconds > 0) continue;
      const id = done.target.targetId;
      settings.historyCache.remember(id, history.get(id) ?? [], { t: done.takenAt.getTime(), total: done.outcome.sample.streamTotal }, r.reading.is_resize === true);
    }
  }
  return stored;
}

/** Judges a batch of finished scrapes and writes it: what the collector loop does with each batch. */
export async function storeBatch(db: Knex, batch: FinishedScrape[], settings: StoreSettings): Promise<StoredBatch> {
  if (batch.length === 0) return { stored: 0, leaseConflicts: 0, levels: [] };
  return writeJudged(db, await judgeBatch(db, batch, settings), settings);
}

/**
 * The forecast history of each good scrape: from this process's cache where it
 * still holds, else from the database. Windowed sketches always read theirs,
 * since their trend lies in the hourly rollups.
 */
async function historyOf(db: Knex, batch: FinishedScrape[], previous: Map<number, PreviousStatus>, settings: StoreSettings): Promise<Map<number, TotalReading[]>> {
  const recalled = new Map<number, TotalReading[]>();
  const wanted: { targetId: number; windowed: boolean }[] = [];
  for (const d of batch) {
    if (!d.outcome.ok) continue;
    const windowed = d.outcome.sample.windowSeconds > 0;
    const hit = windowed ? undefined : settings.historyCache?.recall(d.target.targetId, previous.get(d.target.targetId)?.lastOkAt);
    if (hit) recalled.set(d.target.targetId, hit);
    else wanted.push({ targetId: d.target.targetId, windowed });
  }
  const loaded = await loadHistory(db, wanted, settings.historyReadings);
  for (const [id, points] of recalled) loaded.set(id, points);
  return loaded;
}
