import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signInEveryone, type Callers } from '../auth/callers';
import { jsonOf, startSignInWorld, type SignInWorld } from '../auth/sign-in-harness';
import { addReadings, addSketch, MIN, T0 } from './history-fleet';

const iso = (minute: number) => new Date(T0 + minute * MIN).toISOString();
const period = `from=${encodeURIComponent(iso(0))}&to=${encodeURIComponent(iso(60))}`;

describe('GET /api/v1/history: level changes and alerts per sketch over a period', () => {
  let world: SignInWorld;
  let callers: Callers;
  const ids: Record<string, number> = {};
  const get = async (query: string, caller: 'viewer' | 'anonymous' = 'viewer') => fetch(`${world.appUrl}/api/v1/history?${query}`, { headers: callers.headers(caller) });

  beforeAll(async () => {
    world = await startSignInWorld();
    callers = await signInEveryone(world);
    const db = world.tdb.db;
    // Two replicas: the sketch is as bad as the worse one at every moment.
    const limiter = await addSketch(db, 'payments', 'checkout', 'per-card-limiter', ['checkout-1', 'checkout-2']);
    const [a1, a2] = limiter.targetIds;
    await addReadings(db, limiter.sketchId, a1, 0, 9, 'clear');
    await addReadings(db, limiter.sketchId, a1, 10, 29, 'watch');
    await addReadings(db, limiter.sketchId, a1, 30, 39, 'brimmed');
    await addReadings(db, limiter.sketchId, a1, 40, 59, 'clear');
    await addReadings(db, limiter.sketchId, a2, 0, 14, 'clear');
    await addReadings(db, limiter.sketchId, a2, 15, 17, null); // the second failure in a row makes it unreachable
    await addReadings(db, limiter.sketchId, a2, 18, 59, 'clear');
    ids.limiter = limiter.sketchId;
    // Readings stop for half an hour: stale three intervals after the last one.
    const search = await addSketch(db, 'discovery', 'search', 'heavy-queries', ['search-1']);
    await addReadings(db, search.sketchId, search.targetIds[0], 0, 9, 'watch');
    await addReadings(db, search.sketchId, search.targetIds[0], 40, 59, 'clear');
    ids.search = search.sketchId;
    // Last read ten minutes before the period: stale all through it.
    const gateway = await addSketch(db, 'edge', 'api-gateway', 'per-key-quota', ['gw-1']);
    await addReadings(db, gateway.sketchId, gateway.targetIds[0], -10, -10, 'watch');
    ids.gateway = gateway.sketchId;

    const [alert] = await db('alerts').insert({ sketch_id: limiter.sketchId, state: 'acknowledged', level: 'brimmed', opened_at: new Date(T0 + 30 * MIN) }, ['id']);
    await db('alert_events').insert([
      { alert_id: alert.id, sketch_id: limiter.sketchId, at: new Date(T0 + 30 * MIN), kind: 'opened', level: 'brimmed', actor: 'system' },
      { alert_id: alert.id, sketch_id: limiter.sketchId, at: new Date(T0 + 35 * MIN), kind: 'acknowledged', level: 'brimmed', actor: 'responder', note: "=HYPERLINK(\"x\"), load test, \"planned\"" },
      { alert_id: alert.id, sketch_id: limiter.sketchId, at: new Date(T0 + 90 * MIN), kind: 'resolved', level: 'brimmed', actor: 'system' },
    ]);
  });
  afterAll(async () => {
    await world.close();
  });

  it('when two replicas differ, then the sketch timeline follows the worse one, and the seconds per level add up by hand', async () => {
    const res = await get(`${period}&sketch=${ids.limiter}`);
    expect(res.status).toBe(200);
    const body = await jsonOf(res);
    expect(body).toMatchObject({ from: iso(0), to: iso(60), end: iso(60), resolution: 'readings', total: 1 });
    const [limiter] = body.sketches;
    expect(limiter).toMatchObject({ id: ids.limiter, service: 'checkout', sketch: 'per-card-limiter', team: 'payments' });
    // checkout-1: clear 0–10, watch 10–30, brimmed 30–40, clear 40–60; checkout-2: unreachable 16–18 (failures at 15, 16, 17; the second makes it unreachable).
    expect(limiter.spans).toEqual([
      { from: iso(0), to: iso(10), level: 'clear' },
      { from: iso(10), to: iso(16), level: 'watch' },
      { from: iso(16), to: iso(18), level: 'unreachable' },
      { from: iso(18), to: iso(30), level: 'watch' },
      { from: iso(30), to: iso(40), level: 'brimmed' },
      { from: iso(40), to: iso(60), level: 'clear' },
    ]);
    // By hand: clear 10 + 20 min, watch 6 + 12 min, unreachable 2 min, brimmed 10 min.
    expect(limiter.secondsAt).toEqual({ clear: 1800, watch: 1080, unreachable: 120, brimmed: 600, stale: 0 });
    // The resolution at minute 90 lies outside the period.
    expect(limiter.alerts.map((a: { kind: string; at: string }) => [a.kind, a.at])).toEqual([
      ['opened', iso(30)],
      ['acknowledged', iso(35)],
    ]);
  });

  it('when readings stop, then the sketch turns stale three intervals after the last one, and clear again when they resume', async () => {
    const body = await jsonOf(await get(`${period}&service=search`));
    expect(body.sketches.map((s: { sketch: string }) => s.sketch)).toEqual(['heavy-queries']);
    expect(body.sketches[0].spans).toEqual([
      { from: iso(0), to: iso(12), level: 'watch' },
      { from: iso(12), to: iso(40), level: 'stale' },
      { from: iso(40), to: iso(60), level: 'clear' },
    ]);
    expect(body.sketches[0].secondsAt).toMatchObject({ watch: 720, stale: 1680, clear: 1200 });
  });

  it('when the last reading came before the period, then it sets the start and stale follows once the limit has passed', async () => {
    const body = await jsonOf(await get(`${period}&team=edge`));
    expect(body.sketches[0].spans).toEqual([{ from: iso(0), to: iso(60), level: 'stale' }]);
  });

  it('when no filter is given, then every sketch is listed by service and sketch name, with paging', async () => {
    const all = await jsonOf(await get(period));
    expect(all.sketches.map((s: { service: string }) => s.service)).toEqual(['api-gateway', 'checkout', 'search']);
    const second = await jsonOf(await get(`${period}&pageSize=1&page=2`));
    expect(second).toMatchObject({ total: 3, page: 2, pageSize: 1 });
    expect(second.sketches.map((s: { service: string }) => s.service)).toEqual(['checkout']);
  });

  it('when the period ends in the future, then the timeline stops at now', async () => {
    const to = new Date(Date.now() + 3_600_000).toISOString();
    const body = await jsonOf(await get(`from=${encodeURIComponent(iso(0))}&to=${encodeURIComponent(to)}&sketch=${ids.limiter}`));
    expect(Date.parse(body.end)).toBeLessThanOrEqual(Date.now());
    const spans = body.sketches[0].spans;
    expect(spans[spans.length - 1].to).toBe(body.end);
  });

  it('when the period is longer than two days, then hourly rollups give the levels, each vouching for its hour, and only hour-long gaps are stale', async () => {
    const db = world.tdb.db;
    const ads = await addSketch(db, 'ads', 'ads-ranking', 'impressions-per-shopper', ['ads-1']);
    const hours = Array.from({ length: 48 }, (_, i) => i - 48);
    await db('reading_rollups_hourly').insert(
      hours.map((h) => ({ target_id: ads.targetIds[0], sketch_id: ads.sketchId, hour: new Date(T0 + h * 60 * MIN), readings: 60, failures: 0, last_level: h < -24 ? 'clear' : 'watch' })),
    );
    // After the rolled-up hours, raw readings ten minutes apart: sparse for a one-minute interval, but within the hour.
    for (let m = 0; m <= 60; m += 10) await addReadings(db, ads.sketchId, ads.targetIds[0], m, m, 'brimmed');
    const body = await jsonOf(await get(`from=${encodeURIComponent(iso(-72 * 60))}&to=${encodeURIComponent(iso(180))}&sketch=${ads.sketchId}`));
    expect(body.resolution).toBe('hourly');
    // The last reading is at minute 60; read hour by hour, the target turns stale an hour later.
    expect(body.sketches[0].spans).toEqual([
      { from: iso(-72 * 60), to: iso(-48 * 60), level: null },
      { from: iso(-48 * 60), to: iso(-24 * 60), level: 'clear' },
      { from: iso(-24 * 60), to: iso(0), level: 'watch' },
      { from: iso(0), to: iso(120), level: 'brimmed' },
      { from: iso(120), to: iso(180), level: 'stale' },
    ]);
  });

  it('when the period is backwards or the sketch id is not a number, then 400 names the parameter', async () => {
    const backwards = await get(`from=${encodeURIComponent(iso(60))}&to=${encodeURIComponent(iso(0))}`);
    expect(backwards.status).toBe(400);
    expect((await jsonOf(backwards)).error).toMatchObject({ field: 'from', message: expect.stringMatching(/from must be before to/) });
    const bad = await get('sketch=checkout');
    expect(bad.status).toBe(400);
    expect((await jsonOf(bad)).error.message).toMatch(/sketch must be one or more sketch ids/);
  });

  it('when nobody is signed in, then it answers 401', async () => {
    expect((await get(period, 'anonymous')).status).toBe(401);
  });
});
