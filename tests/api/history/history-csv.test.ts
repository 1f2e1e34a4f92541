import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readCsv } from '../../../backend/src/services/csv/csv-read';
import { signInEveryone, type Callers } from '../auth/callers';
import { startSignInWorld, type SignInWorld } from '../auth/sign-in-harness';
import { addReadings, addSketch, MIN, T0 } from './history-fleet';

const iso = (minute: number) => new Date(T0 + minute * MIN).toISOString();
const period = `from=${encodeURIComponent(iso(0))}&to=${encodeURIComponent(iso(60))}`;

describe('GET /api/v1/history.csv: the history as a file', () => {
  let world: SignInWorld;
  let callers: Callers;
  let sketchId: number;
  beforeAll(async () => {
    world = await startSignInWorld();
    callers = await signInEveryone(world);
    const db = world.tdb.db;
    const limiter = await addSketch(db, 'payments', 'checkout', 'per-card-limiter', ['checkout-1']);
    sketchId = limiter.sketchId;
    await addReadings(db, sketchId, limiter.targetIds[0], 0, 29, 'clear');
    await addReadings(db, sketchId, limiter.targetIds[0], 30, 59, 'brimmed');
    const [alert] = await db('alerts').insert({ sketch_id: sketchId, level: 'brimmed', opened_at: new Date(T0 + 30 * MIN) }, ['id']);
    await db('alert_events').insert({ alert_id: alert.id, sketch_id: sketchId, at: new Date(T0 + 31 * MIN), kind: 'acknowledged', level: 'brimmed', actor: 'responder', note: '=SUM(A1), a "planned" load test' });
    await addSketch(db, 'discovery', 'search', 'heavy-queries', ['search-1']);
  });
  afterAll(async () => {
    await world.close();
  });

  it('when a viewer exports, then a CSV attachment comes back with the header row, one row per level span, per alert event and per level total', async () => {
    const res = await fetch(`${world.appUrl}/api/v1/history.csv?${period}&team=payments`, { headers: callers.headers('viewer') });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/csv; charset=utf-8/);
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="?brimwatch-history-20261130-0000-to-20261130-0100\.csv"?$/);
    const records = readCsv(await res.text(), 1000).map((r) => r.cells);
    expect(records[0]).toEqual(['sketch_id', 'service', 'sketch', 'team', 'record', 'level', 'start', 'end', 'seconds', 'alert_event', 'actor', 'note']);
    const who = [String(sketchId), 'checkout', 'per-card-limiter', 'payments'];
    expect(records.slice(1)).toEqual([
      [...who, 'level', 'clear', iso(0), iso(30), '1800', '', '', ''],
      [...who, 'level', 'brimmed', iso(30), iso(60), '1800', '', '', ''],
      // A note that a spreadsheet would run as a formula is written as text.
      [...who, 'alert', 'brimmed', iso(31), '', '', 'acknowledged', 'responder', `'=SUM(A1), a "planned" load test`],
      [...who, 'total', 'clear', '', '', '1800', '', '', ''],
      [...who, 'total', 'brimmed', '', '', '1800', '', '', ''],
    ]);
  });

  it('when the filter matches nothing, then the file still has its header row', async () => {
    const res = await fetch(`${world.appUrl}/api/v1/history.csv?${period}&team=nobody`, { headers: callers.headers('viewer') });
    expect(res.status).toBe(200);
    expect(await res.text()).toBe('sketch_id,service,sketch,team,record,level,start,end,seconds,alert_event,actor,note\r\n');
  });

  it('when the query is wrong, then the answer is a JSON 400, not a file', async () => {
    const res = await fetch(`${world.appUrl}/api/v1/history.csv?from=yesterday`, { headers: callers.headers('viewer') });
    expect(res.status).toBe(400);
    expect(res.headers.get('content-disposition')).toBeNull();
  });
});
