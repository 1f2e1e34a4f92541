import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeBatch } from '../../collectors/batch-write';
import { claimDueTargets, releaseLeases } from '../../collectors/claim';
import { readingRows } from '../../collectors/reading-rows';
import { nextScrapeAt, scrapeOffsetMs } from '../../collectors/schedule';
import { createTestDatabase, type TestDatabase } from '../setup/database';
import { addSketch, makeAllDue } from './fleet-fixture';

describe('the scrape schedule', () => {
  it('when ids follow each other, then their offsets are stable, inside the interval and spread across it', () => {
    const offsets = Array.from({ length: 1000 }, (_, i) => scrapeOffsetMs(i + 1, 30));
    expect(offsets.every((o) => o >= 0 && o < 30_000)).toBe(true);
    expect(scrapeOffsetMs(17, 30)).toBe(offsets[16]);
    // Ten equal slices of the interval: a uniform spread puts 100 in each; no slice is empty or holds a third.
    const slices = Array.from({ length: 10 }, (_, s) => offsets.filter((o) => Math.floor(o / 3000) === s).length);
    expect(Math.min(...slices)).toBeGreaterThan(50);
    expect(Math.max(...slices)).toBeLessThan(150);
  });

  it('when the next slot is asked for, then it is the first one strictly later, one interval apart and on the offset', () => {
    const after = Date.parse('2026-12-01T10:00:00Z');
    const first = nextScrapeAt(42, 30, after);
    expect(first).toBeGreaterThan(after);
    expect(first - after).toBeLessThanOrEqual(30_000);
    expect((first - scrapeOffsetMs(42, 30)) % 30_000).toBe(0);
    expect(nextScrapeAt(42, 30, first)).toBe(first + 30_000);
    expect(nextScrapeAt(42, 30, first - 1)).toBe(first);
  });
});

describe('target leases', () => {
  let t: TestDatabase;
  let ids: number[];
  beforeAll(async () => {
    t = await createTestDatabase();
    ({ targetIds: ids } = await addSketch(t.db, Array.from({ length: 100 }, (_, i) => `http://127.0.0.1:9/t${i}`)));
  });
  afterAll(() => t.drop());

  it('when three collectors claim at the same moment, then they get disjoint targets and together all that are due', async () => {
    await makeAllDue(t.db);
    const [a, b, c] = await Promise.all([claimDueTargets(t.db, 'a', 40, 20), claimDueTargets(t.db, 'b', 40, 20), claimDueTargets(t.db, 'c', 40, 20)]);
    const all = [...a, ...b, ...c].map((x) => x.targetId);
    expect(new Set(all).size).toBe(all.length);
    expect(all.sort((x, y) => x - y)).toEqual(ids);
    expect(await claimDueTargets(t.db, 'd', 40, 20)).toEqual([]);
    await releaseLeases(t.db, 'a', a.map((x) => x.targetId));
    await releaseLeases(t.db, 'b', b.map((x) => x.targetId));
    await releaseLeases(t.db, 'c', c.map((x) => x.targetId));
  });

  it('when a lease has expired, then another collector takes the target and the first can no longer store it', async () => {
    await makeAllDue(t.db);
    const [mine] = await claimDueTargets(t.db, 'dead', 1, 20);
    await t.db('targets').where({ id: mine.targetId }).update({ lease_expires_at: t.db.raw("now() - interval '1 second'") });
    const taken = await claimDueTargets(t.db, 'alive', 200, 20);
    expect(taken.map((x) => x.targetId)).toContain(mine.targetId);
    const outcome = { ok: false as const, kind: 'refused' as const, reason: 'connection refused', scrapeMs: 1 };
    const next = [{ targetId: mine.targetId, nextScrapeAt: new Date(Date.now() + 30_000), rows: readingRows({ target: mine, outcome, takenAt: new Date() }, undefined, []) }];
    expect(await writeBatch(t.db, 'dead', next)).toEqual(new Set());
    expect(await t.db('readings').where({ target_id: mine.targetId }).count('* as n').first()).toEqual({ n: 0 });
    expect(await writeBatch(t.db, 'alive', next)).toEqual(new Set([mine.targetId]));
    expect(await t.db('readings').where({ target_id: mine.targetId }).count('* as n').first()).toEqual({ n: 1 });
    expect(await t.db('target_status').where({ target_id: mine.targetId }).first()).toMatchObject({ last_error: 'connection refused', failures_in_row: 1 });
    const row = await t.db('targets').where({ id: mine.targetId }).first();
    expect(row).toMatchObject({ lease_owner: null, lease_expires_at: null });
  });

  it('when a target is not yet due or its lease is live, then it is not claimed', async () => {
    await t.db('targets').update({ lease_owner: null, lease_expires_at: null, next_scrape_at: t.db.raw("now() + interval '1 minute'") });
    expect(await claimDueTargets(t.db, 'x', 10, 20)).toEqual([]);
    await makeAllDue(t.db);
    await t.db('targets').update({ lease_owner: 'other', lease_expires_at: t.db.raw("now() + interval '1 minute'") });
    expect(await claimDueTargets(t.db, 'x', 10, 20)).toEqual([]);
  });
});
