import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyseDump } from '../../../backend/src/maths/dump';
import { signInEveryone, type Callers } from '../auth/callers';
import { jsonOf, startSignInWorld, type SignInWorld } from '../auth/sign-in-harness';
import { asCsv, asJson, asRaw, SMALL } from './dump-matrices';
import { uploadForm } from './upload-form';

describe('POST /api/v1/dumps: the counter dump check', () => {
  let world: SignInWorld;
  let callers: Callers;
  let sketchId: number;
  const url = () => `${world.appUrl}/api/v1/dumps`;
  const budget = { errorBudget: 3, confidence: 0.9 };

  beforeAll(async () => {
    world = await startSignInWorld();
    callers = await signInEveryone(world);
    const [team] = await world.tdb.db('teams').insert({ slug: 'payments', name: 'Payments' }, ['id']);
    const [service] = await world.tdb.db('services').insert({ team_id: team.id, name: 'checkout' }, ['id']);
    const [sketch] = await world.tdb.db('sketches').insert({ service_id: service.id, team_id: team.id, name: 'per-card-limiter', error_budget: 3, confidence: 0.9 }, ['id']);
    sketchId = Number(sketch.id);
  });
  afterAll(async () => {
    await world.close();
  });

  it('when a responder uploads a small CSV dump, then the report carries the figures worked out by hand', async () => {
    const res = await uploadForm(url(), callers.headers('responder'), { format: 'csv', ...budget }, { bytes: asCsv(SMALL), name: 'limiter.csv' });
    expect(res.status).toBe(201);
    const report = await jsonOf(res);
    // Hand computation on SMALL (rows [0,3,1,4] and [2,0,5,1]), from DESIGN.md's definitions:
    expect(report).toMatchObject({ width: 4, depth: 2, streamTotal: 8, streamTotalSource: 'largest row sum', rowSumsAgree: true, fileName: 'limiter.csv', format: 'csv', uploadedBy: 'responder' });
    // row sums 0+3+1+4 = 8 and 2+0+5+1 = 8; one zero in four cells each; medians (1+3)/2 = 2 and (1+2)/2 = 1.5.
    expect(report.rows.map((r: { sum: number; zeroFraction: number; median: number }) => [r.sum, r.zeroFraction, r.median])).toEqual([
      [8, 0.25, 2],
      [8, 0.25, 1.5],
    ]);
    // Empirical miss risk: share of cells ≥ E = 3 per row, multiplied: (2/4)·(1/4) = 0.125.
    expect(report.empiricalMissRisk).toBeCloseTo(0.125, 12);
    // Markov: (n/(m·E))^k = (8/12)^2 = 4/9 (Cormode & Muthukrishnan 2005, per-row Markov bound over k rows).
    expect(report.markovMissRisk).toBeCloseTo(4 / 9, 12);
    // Linear counting (Whang et al. 1990): pooled zero fraction V = 2/8, D = −m·ln V = −4·ln 0.25 = 5.545177…
    expect(report.distinctEstimate).toBeCloseTo(-4 * Math.log(0.25), 9);
    expect(report.distinctSaturated).toBe(false);
    // Histogram of the 8 cells in doubling bins: 0 → 2 cells; 1 → 2; 2–3 → 2; 4–7 → 2.
    expect(report.histogram).toEqual([
      { from: 0, to: 0, cells: 2 },
      { from: 1, to: 1, cells: 2 },
      { from: 2, to: 3, cells: 2 },
      { from: 4, to: 7, cells: 2 },
    ]);
    expect(typeof report.verdict).toBe('string');
    expect(report.verdict.length).toBeGreaterThan(20);
  });

  it('when the same matrix comes as TSV, JSON (nested and flat) and raw u32le/u64le, then every report matches the maths module', async () => {
    const expected = analyseDump({ width: 4, depth: 2, ...budget, counters: SMALL.flat() });
    const uploads: [Record<string, string | number>, Uint8Array | string][] = [
      [{ format: 'csv' }, asCsv(SMALL, '\t')],
      [{ format: 'json' }, asJson(SMALL)],
      [{ format: 'json' }, asJson(SMALL, true)],
      [{ format: 'u32le', width: 4, depth: 2 }, asRaw(SMALL, 4)],
      [{ format: 'u64le', width: 4, depth: 2 }, asRaw(SMALL, 8)],
    ];
    for (const [fields, bytes] of uploads) {
      const res = await uploadForm(url(), callers.headers('sre'), { ...fields, ...budget }, { bytes, name: 'dump.dat' });
      expect(res.status, JSON.stringify(fields)).toBe(201);
      const report = await jsonOf(res);
      expect(report.rows.map((r: { median: number }) => r.median)).toEqual(expected.rows.map((r) => r.median));
      expect(report.empiricalMissRisk).toBe(expected.empiricalMissRisk);
      expect(report.markovMissRisk).toBe(expected.markovMissRisk);
      expect(report.load).toBe(expected.assessment.load);
      expect(report.verdict).toBe(expected.verdict);
    }
  });

  it('when a sketch is named and the budget left empty, then the sketch budget and confidence are used and the report lists it', async () => {
    const res = await uploadForm(url(), callers.headers('responder'), { format: 'csv', sketchId }, { bytes: asCsv(SMALL) });
    expect(res.status).toBe(201);
    const report = await jsonOf(res);
    expect(report).toMatchObject({ errorBudget: 3, confidence: 0.9, sketch: { id: sketchId, service: 'checkout', sketch: 'per-card-limiter', team: 'payments' } });
  });

  it('when reports exist, then the list shows who, when and which sketch, newest first, and one reopens unchanged', async () => {
    const made = await jsonOf(await uploadForm(url(), callers.headers('responder'), { format: 'csv', sketchId, streamTotal: 10 }, { bytes: asCsv(SMALL), name: 'again.csv' }));
    const list = await jsonOf(await fetch(url(), { headers: callers.headers('viewer') }));
    expect(list.items[0]).toMatchObject({ id: made.id, uploadedBy: 'responder', fileName: 'again.csv', sketch: { id: sketchId, sketch: 'per-card-limiter' }, width: 4, depth: 2 });
    expect(Date.parse(list.items[0].createdAt)).not.toBeNaN();
    expect(list.items.map((i: { id: number }) => i.id)).toEqual([...list.items.map((i: { id: number }) => i.id)].sort((a, b) => b - a));
    const reopened = await jsonOf(await fetch(`${url()}/${made.id}`, { headers: callers.headers('viewer') }));
    expect(reopened).toEqual(made);
    expect(reopened.streamTotalSource).toBe('given');
    const audit = await world.tdb.db('audit_log').where({ action: 'dump.checked', subject_id: String(made.id) }).first();
    expect(audit.actor).toBe('responder');
  });

  it('when a viewer uploads or nobody is signed in, then it is refused and nothing is stored', async () => {
    const before = await world.tdb.db('dump_reports').count('id as n').first();
    expect((await uploadForm(url(), callers.headers('viewer'), { format: 'csv', ...budget }, { bytes: asCsv(SMALL) })).status).toBe(403);
    expect((await uploadForm(url(), callers.headers('anonymous'), { format: 'csv', ...budget }, { bytes: asCsv(SMALL) })).status).toBe(401);
    expect(await world.tdb.db('dump_reports').count('id as n').first()).toEqual(before);
  });

  it('when a report id does not exist, then 404 says how to find the reports', async () => {
    const res = await fetch(`${url()}/999999`, { headers: callers.headers('viewer') });
    expect(res.status).toBe(404);
    expect((await jsonOf(res)).error.message).toMatch(/GET \/api\/v1\/dumps/);
  });
});
