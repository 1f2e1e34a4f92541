import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { claimDueTargets } from '../../collectors/claim';
import { HistoryCache } from '../../collectors/history-cache';
import { loadHistory } from '../../collectors/reading-history';
import type { FinishedScrape } from '../../collectors/reading-rows';
import { scrapeTarget } from '../../collectors/scrape';
import { storeBatch } from '../../collectors/store';
import { createTestDatabase, type TestDatabase } from '../setup/database';
import { addSketch, makeAllDue, noAlerts } from './fleet-fixture';
import { startLoopbackTargets, type LoopbackTargets } from './loopback-targets';

describe('the history cache', () => {
  it('when a reading is remembered, then it is recalled only while the target last read well at that reading, trimmed to the limit, and a resize starts it over', () => {
    const cache = new HistoryCache(3, 2);
    const at = (s: number) => new Date(Date.UTC(2026, 11, 1, 9, 0, s));
    cache.remember(1, [{ t: at(0).getTime(), total: 10 }, { t: at(10).getTime(), total: 20 }, { t: at(20).getTime(), total: 30 }], { t: at(30).getTime(), total: 40 }, false);
    expect(cache.recall(1, at(30))).toEqual([20, 30, 40].map((total, i) => ({ t: at(10 * (i + 1)).getTime(), total })));
    // Another collector stored a later reading, or none was stored: the entry no longer speaks for the target.
    expect(cache.recall(1, at(40))).toBeUndefined();
    expect(cache.recall(1, null)).toBeUndefined();
    cache.remember(1, cache.recall(1, at(30))!, { t: at(40).getTime(), total: 5 }, true);
    expect(cache.recall(1, at(40))).toEqual([{ t: at(40).getTime(), total: 5 }]);
    // At most two targets: the least recently stored goes first.
    cache.remember(2, [], { t: at(1).getTime(), total: 1 }, false);
    cache.remember(3, [], { t: at(2).getTime(), total: 2 }, false);
    expect(cache.size).toBe(2);
    expect(cache.recall(1, at(40))).toBeUndefined();
    expect(cache.recall(3, at(2))).toEqual([{ t: at(2).getTime(), total: 2 }]);
  });
});

describe('the history cache against the database', () => {
  let t: TestDatabase;
  let targets: LoopbackTargets;
  beforeAll(async () => {
    t = await createTestDatabase();
    targets = await startLoopbackTargets();
  });
  afterAll(async () => {
    await targets.close();
    await t.drop();
  });

  it('when rounds are stored through the cache, with a resize and a failure among them, then what it recalls equals what the database gives', async () => {
    const paths = ['/cached/0', '/cached/1', '/cached/2'];
    const serve = (round: number) =>
      paths.forEach((p, i) => {
        const resized = i === 1 && round >= 3;
        if (i === 2 && round === 2) targets.behaviours.set(p, { kind: 'status', status: 503 });
        else targets.behaviours.set(p, { kind: 'sketch', label: 'limiter', figures: { width: resized ? 5437 : 2719, depth: 4, streamTotal: 1000 * (round + 1) + i, nonzeroCells: [10, 11, 12, 13] } });
      });
    const { targetIds } = await addSketch(t.db, paths.map(targets.url), { intervalSeconds: 30 });
    const cache = new HistoryCache(4);
    const settings = { owner: 'cache-test', historyReadings: 4, alertsHook: noAlerts, log: () => undefined, historyCache: cache };
    for (let round = 0; round < 6; round++) {
      serve(round);
      await makeAllDue(t.db);
      const claimed = await claimDueTargets(t.db, 'cache-test', 10, 20);
      const finished: FinishedScrape[] = await Promise.all(
        claimed.map(async (target) => ({ target, takenAt: new Date(), outcome: await scrapeTarget(target.url, target.sketchLabel, 5000, { allowlist: '127.0.0.0/8', maxBytes: 65536, userAgent: 'brimwatch-test' }) })),
      );
      await storeBatch(t.db, finished, settings);
    }
    const fromDb = await loadHistory(t.db, targetIds.map((targetId) => ({ targetId, windowed: false })), 4);
    for (const id of targetIds) {
      const status = await t.db('target_status').where({ target_id: id }).first('last_ok_at');
      expect(cache.recall(id, status.last_ok_at), `target ${id}`).toEqual(fromDb.get(id));
    }
    expect(fromDb.get(targetIds[1])).toHaveLength(3);
  });
});
