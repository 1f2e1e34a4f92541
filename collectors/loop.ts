import type { Knex } from 'knex';
import { claimDueTargets, releaseLeases, type ClaimedTarget } from './claim';
import type { CollectorMetrics } from './metrics';
import type { FinishedScrape } from './reading-rows';
import { scrapeTarget, scrapeTimeoutMs, type ScrapeSettings } from './scrape';
import { HistoryCache } from './history-cache';
import { storeBatch, type StoreSettings } from './store';

export interface LoopSettings {
  /** Scrapes running at once in this process. */
  concurrency: number;
  /** Finished scrapes stored per transaction, at most. */
  batchSize: number;
  /** How long a finished scrape may wait for its batch to fill before it is stored anyway. */
  flushAfterMs: number;
  leaseMarginSeconds: number;
  /** How often to look for due targets; a scrape starts at most about this late. */
  pollMs: number;
  scrape: ScrapeSettings;
  store: StoreSettings;
  metrics: CollectorMetrics;
}

/** Batches stored at once by one process; each holds one database connection while it runs. */
export const STORES_AT_ONCE = 3;

/**
 * The collector's work loop: poll for due targets and claim them while there is room, scrape
 * each as soon as it is claimed, and store finished scrapes in batches. A
 * slow target holds one slot, not a whole round. A failing claim or store
 * (database restarting) is logged and tried again on the next poll; leases
 * of anything lost that way expire and the targets come due again.
 */
export function createCollectorLoop(db: Knex, settings: LoopSettings) {
  const { metrics } = settings;
  // One history cache per process: a target stored here last time needs no history read next time.
  const store: StoreSettings = { ...settings.store, historyCache: settings.store.historyCache ?? new HistoryCache(settings.store.historyReadings) };
  const inFlight = new Map<number, Promise<void>>();
  let finished: FinishedScrape[] = [];
  let claiming = false;
  let claimDone: Promise<void> = Promise.resolve();
  const storing = new Set<Promise<void>>();
  let flushTimer: NodeJS.Timeout | undefined;
  let pollTimer: NodeJS.Timeout | undefined;
  let stopping = false;
  // Set once stop() has given leases back: a scrape that ends later is no longer ours to store.
  let closed = false;

  async function scrapeOne(target: ClaimedTarget): Promise<void> {
    const takenAt = new Date();
    metrics.lagSeconds.observe(Math.max(0, (takenAt.getTime() - target.dueAt.getTime()) / 1000));
    const outcome = await scrapeTarget(target.url, target.sketchLabel, scrapeTimeoutMs(target.intervalSeconds), settings.scrape);
    metrics.scrapes.inc({ result: outcome.ok ? 'ok' : 'failed' });
    metrics.scrapeSeconds.observe(outcome.scrapeMs / 1000);
    if (!outcome.ok) metrics.failures.inc({ kind: outcome.kind });
    if (closed) return;
    finished.push({ target, outcome, takenAt });
    if (finished.length >= settings.batchSize) flush();
    else if (!flushTimer) flushTimer = setTimeout(flush, settings.flushAfterMs);
  }

  function start(target: ClaimedTarget): void {
    const task = scrapeOne(target).finally(() => {
      inFlight.delete(target.targetId);
      metrics.inFlight.set(inFlight.size);
      if (!stopping && inFlight.size < settings.concurrency) void claim();
    });
    inFlight.set(target.targetId, task);
    metrics.inFlight.set(inFlight.size);
  }

  function claim(): Promise<void> {
    if (claiming || stopping) return claimDone;
    claiming = true;
    claimDone = claimWhileRoom().finally(() => {
      claiming = false;
    });
    return claimDone;
  }

  async function claimWhileRoom(): Promise<void> {
    try {
      for (;;) {
        const room = settings.concurrency - inFlight.size;
        if (room <= 0 || stopping) break;
        const claimed = await claimDueTargets(db, store.owner, room, settings.leaseMarginSeconds);
        if (stopping) {
          // stop() began while this claim was on its way: hand the targets straight back instead of starting them.
          await releaseLeases(db, store.owner, claimed.map((c) => c.targetId));
          break;
        }
        claimed.forEach(start);
        if (claimed.length < room) break;
      }
    } catch (err) {
      metrics.roundErrors.inc({ stage: 'claim' });
      store.log(`claim failed, retrying on the next poll: ${err instanceof Error ? err.message : String(err)}`);
    }
  }

  async function storeOne(batch: FinishedScrape[]): Promise<void> {
    const stopTimer = metrics.cycleSeconds.startTimer();
    try {
      const result = await storeBatch(db, batch, store);
      metrics.leaseConflicts.inc(result.leaseConflicts);
    } catch (err) {
      metrics.roundErrors.inc({ stage: 'store' });
      store.log(`storing ${batch.length} readings failed; their targets come due again when the leases expire: ${err instanceof Error ? err.message : String(err)}`);
    } finally {
      stopTimer();
    }
  }

  /**
   * Starts storing what has finished, a batch per transaction, up to
   * STORES_AT_ONCE transactions at a time: a store spends most of its time
   * waiting on database round trips, so one at a time would cap the whole
   * loop at one batch per chain of round trips.
   */
  function flush(): void {
    clearTimeout(flushTimer);
    flushTimer = undefined;
    while (finished.length > 0 && storing.size < STORES_AT_ONCE) {
      const batch = finished.slice(0, settings.batchSize);
      finished = finished.slice(batch.length);
      const task: Promise<void> = storeOne(batch).finally(() => {
        storing.delete(task);
        if (closed) return;
        // A full batch goes at once; a partial one waits out the flush delay to fill, so under load the
        // stores stay few and large rather than many small ones paying the same round trips.
        if (finished.length >= settings.batchSize) flush();
        else if (finished.length > 0 && !flushTimer) flushTimer = setTimeout(flush, settings.flushAfterMs);
      });
      storing.add(task);
    }
  }

  /** Stores everything finished so far and waits until it is stored. */
  async function drain(): Promise<void> {
    flush();
    while (storing.size > 0) {
      await Promise.race(storing);
      flush();
    }
  }

  return {
    /**
     * Starts polling for due targets every `pollMs`. A timer of its own rather
     * than a cron tick: a busy process gets a late poll instead of a skipped one.
     */
    start(): void {
      const poll = async () => {
        if (finished.length > 0) flush();
        await claim();
        if (!stopping) pollTimer = setTimeout(() => void poll(), settings.pollMs);
      };
      void poll();
    },
    inFlight: () => inFlight.size,
    /**
     * Stops claiming, lets running scrapes finish for up to `graceMs`, stores
     * them, and gives back the leases of any still running so that another
     * collector takes them at once.
     */
    async stop(graceMs: number): Promise<{ released: number }> {
      stopping = true;
      clearTimeout(pollTimer);
      await claimDone;
      const unfinished = [...inFlight.keys()];
      let timer: NodeJS.Timeout | undefined;
      await Promise.race([Promise.allSettled([...inFlight.values()]), new Promise((resolve) => (timer = setTimeout(resolve, graceMs)))]);
      clearTimeout(timer);
      const stillRunning = unfinished.filter((id) => inFlight.has(id));
      await drain();
      closed = true;
      const released = await releaseLeases(db, store.owner, stillRunning).catch(() => 0);
      return { released };
    },
  };
}

export type CollectorLoop = ReturnType<typeof createCollectorLoop>;
