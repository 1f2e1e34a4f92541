import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runSeeds } from '../../ops/run/database';
import { DEMO_SKETCHES } from '../../ops/demo-fleet/scenario';
import { createTestDatabase, type TestDatabase } from '../setup/database';

const DAY = 86_400_000;

describe('the demo seed', () => {
  let tdb: TestDatabase;
  const previousPort = process.env.DEMO_FLEET_PORT;
  beforeAll(async () => {
    process.env.DEMO_FLEET_PORT = '9650';
    tdb = await createTestDatabase();
    await runSeeds(tdb.db, path.resolve('seeds'));
  }, 300_000);
  afterAll(async () => {
    if (previousPort === undefined) delete process.env.DEMO_FLEET_PORT;
    else process.env.DEMO_FLEET_PORT = previousPort;
    await tdb.drop();
  });

  it("when seeded, then every demo sketch is registered with one target per instance at DEMO_FLEET_PORT's ports", async () => {
    const targets = await tdb.db('targets as t').join('sketches as s', 's.id', 't.sketch_id').select('s.name', 't.instance', 't.url').orderBy('t.id');
    const expected = DEMO_SKETCHES.flatMap((s) => s.instances.map((i) => ({ name: s.sketch, instance: i.name, url: `http://127.0.0.1:${9650 + i.port}/metrics` })));
    expect(targets).toEqual(expected);
    const audited = await tdb.db('audit_log').where({ action: 'sketch.registered', actor: 'system' }).count({ n: '*' });
    expect(Number(audited[0].n)).toBe(DEMO_SKETCHES.length);
  });

  it('when seeded, then each target has a week of readings, every good one judged, and a status row', async () => {
    const perTarget = await tdb.db('readings').groupBy('target_id').select('target_id').min({ first: 'taken_at' }).max({ last: 'taken_at' }).count({ n: '*' });
    expect(perTarget).toHaveLength(8);
    for (const row of perTarget) {
      expect(Date.now() - new Date(row.first).getTime()).toBeGreaterThan(6.9 * DAY);
      expect(Number(row.n)).toBeGreaterThan(600);
    }
    const unjudged = await tdb.db('readings').where({ ok: true }).whereNull('judgement').count({ n: '*' });
    expect(Number(unjudged[0].n)).toBe(0);
    const statuses = await tdb.db('target_status').count({ n: '*' });
    expect(Number(statuses[0].n)).toBe(8);
  });

  it('when seeded, then the fleet already shows every level, and resets mark the restarts and windows', async () => {
    const levels = await tdb.db('target_status').distinct('level').pluck('level');
    expect(levels.sort()).toEqual(['brimmed', 'clear', 'stale', 'unreachable', 'watch']);
    const resets: { name: string; n: string }[] = await tdb.db('readings as r').join('sketches as s', 's.id', 'r.sketch_id').where('r.is_reset', true).groupBy('s.name').select('s.name').count({ n: '*' });
    const byName = Object.fromEntries(resets.map((r) => [r.name, Number(r.n)]));
    expect(byName['frequency-cap']).toBeGreaterThan(160); // hourly windows over a week
    expect(byName['per-key-quota']).toBe(14); // a daily restart of each of two replicas
  });
});
