import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readCsv } from '../../../backend/src/services/csv/csv-read';
import { signInEveryone, type Callers } from '../auth/callers';
import { jsonOf, startSignInWorld, type SignInWorld } from '../auth/sign-in-harness';
import { uploadForm } from '../dumps/upload-form';

const HEADER = 'service,sketch,team,targetUrl,instances,errorBudget,confidence,watchLine';
const csv = (...rows: string[]) => [HEADER, ...rows].join('\r\n') + '\r\n';

describe('inventory import: POST /api/v1/imports/sketches(/preview)', () => {
  let world: SignInWorld;
  let callers: Callers;
  const post = (path: string, caller: Parameters<Callers['headers']>[0], text: string) =>
    uploadForm(`${world.appUrl}/api/v1/imports/sketches${path}`, callers.headers(caller), {}, { bytes: text, name: 'inventory.csv' });
  const count = async (table: string) => Number((await world.tdb.db(table).count('id as n').first())!.n);

  beforeAll(async () => {
    world = await startSignInWorld();
    callers = await signInEveryone(world);
    const [payments] = await world.tdb.db('teams').insert([{ slug: 'payments', name: 'Payments' }, { slug: 'discovery', name: 'Discovery' }], ['id']);
    await world.tdb.db('team_members').insert({ team_id: payments.id, user_id: callers.userId('owner') });
  });
  afterAll(async () => {
    await world.close();
  });

  it('when an owner previews a file, then every row gets its verdict with the server own messages, and nothing is written', async () => {
    const file = csv(
      'checkout,per-card-limiter,payments,http://127.0.0.1:9500/checkout/metrics,,500,0.99,',
      'checkout,per-card-limiter,payments,http://127.0.0.1:9500/checkout/metrics,,500,0.99,',
      'checkout,refund-counter,payments,ftp://127.0.0.1/x,,500,0.99,',
      'checkout,attempts,payments,http://127.0.0.1:9500/a,,-1,1.5,',
      'search,heavy-queries,discovery,http://127.0.0.1:9500/search/metrics,,200,0.995,',
      'checkout,bad-replicas,payments,,checkout-1=http://127.0.0.1:9501/metrics oops,100,0.99,',
      'checkout,two-replicas,payments,,checkout-1=http://127.0.0.1:9501/metrics checkout-2=http://127.0.0.1:9502/metrics,100,0.99,0.7',
    );
    const res = await post('/preview', 'owner', file);
    expect(res.status).toBe(200);
    const body = await jsonOf(res);
    expect(body).toMatchObject({ ready: 2, withProblems: 5 });
    const byLine = Object.fromEntries(body.rows.map((r: { line: number }) => [r.line, r]));
    expect(byLine[2]).toMatchObject({ ok: true, service: 'checkout', sketch: 'per-card-limiter', team: 'payments', newService: true, problems: [] });
    expect(byLine[3].problems).toEqual([expect.objectContaining({ field: 'sketch', code: 'duplicate_row', message: expect.stringMatching(/also on line 2/) })]);
    expect(byLine[4].problems).toEqual([expect.objectContaining({ field: 'targetUrl', status: 400, message: expect.stringMatching(/targetUrl must be the http:\/\/ or https:\/\//) })]);
    expect(byLine[5].problems.map((p: { field: string }) => p.field)).toEqual(['errorBudget', 'confidence']);
    expect(byLine[6].problems).toEqual([expect.objectContaining({ field: 'team', status: 403, code: 'not_your_team' })]);
    expect(byLine[7].problems).toEqual([expect.objectContaining({ field: 'instances', message: expect.stringMatching(/name=address pairs/) })]);
    expect(byLine[8]).toMatchObject({ ok: true, targets: 'checkout-1 checkout-2' });
    expect(await count('sketches')).toBe(0);
    expect(await count('services')).toBe(0);
  });

  it('when any row has a problem, then the import writes nothing and answers with the rows (403 when a team is not the owner own)', async () => {
    const foreign = await post('', 'owner', csv('checkout,per-card-limiter,payments,http://127.0.0.1:9500/c,,500,0.99,', 'search,heavy-queries,discovery,http://127.0.0.1:9500/s,,200,0.995,'));
    expect(foreign.status).toBe(403);
    const body = await jsonOf(foreign);
    expect(body.error).toMatchObject({ code: 'not_your_team', message: expect.stringMatching(/Nothing was imported: line 3/) });
    expect(body.rows[1].problems[0].status).toBe(403);
    const invalid = await post('', 'sre', csv('checkout,per-card-limiter,payments,http://127.0.0.1:9500/c,,500,0.99,', 'search,heavy-queries,discovery,http://127.0.0.1:9500/s,,zero,0.995,'));
    expect(invalid.status).toBe(400);
    expect((await jsonOf(invalid)).error.code).toBe('import_invalid');
    expect(await count('sketches')).toBe(0);
  });

  it('when every row is good, then all sketches are registered in one go, audited, and the summary lists them', async () => {
    const res = await post('', 'sre', csv(
      'checkout,per-card-limiter,payments,http://127.0.0.1:9500/checkout/metrics,,500,0.99,',
      'search,heavy-queries,discovery,,search-1=http://127.0.0.1:9511/metrics search-2=http://127.0.0.1:9512/metrics,200,0.995,0.75',
    ));
    expect(res.status).toBe(201);
    const summary = await jsonOf(res);
    expect(summary).toMatchObject({ imported: 2, servicesCreated: ['checkout', 'search'] });
    expect(summary.sketches.map((s: { line: number; service: string; sketch: string }) => [s.line, s.service, s.sketch])).toEqual([
      [2, 'checkout', 'per-card-limiter'],
      [3, 'search', 'heavy-queries'],
    ]);
    const search = await world.tdb.db('sketches').where({ id: summary.sketches[1].id }).first();
    expect(search).toMatchObject({ error_budget: 200, confidence: 0.995, watch_line: 0.75 });
    expect(await world.tdb.db('targets').where({ sketch_id: search.id }).orderBy('instance').pluck('instance')).toEqual(['search-1', 'search-2']);
    expect(await world.tdb.db('audit_log').where({ action: 'sketches.imported' }).count('id as n').first()).toEqual({ n: 1 });
    expect(await world.tdb.db('audit_log').where({ action: 'sketch.registered' }).count('id as n').first()).toEqual({ n: 2 });
  });

  it('when a row fails only inside the transaction, then the rows before it are undone too', async () => {
    const before = { sketches: await count('sketches'), services: await count('services') };
    // Neither row's service exists yet, so each passes the checks alone; inside the transaction the first row
    // has created ledger for payments by the time the second asks for ledger under discovery.
    const res = await post('', 'sre', csv('ledger,entries,payments,http://127.0.0.1:9500/l,,500,0.99,', 'ledger,lookups,discovery,http://127.0.0.1:9500/k,,500,0.99,'));
    expect(res.status).toBe(400);
    const body = await jsonOf(res);
    expect(body.rows[0].ok).toBe(true);
    expect(body.rows[1].problems[0]).toMatchObject({ field: 'service', code: 'service_of_another_team', status: 409 });
    expect({ sketches: await count('sketches'), services: await count('services') }).toEqual(before);
  });

  it('when a viewer or responder previews or imports, then 403; when nobody is signed in, then 401', async () => {
    for (const caller of ['viewer', 'responder'] as const) {
      expect((await post('/preview', caller, csv())).status).toBe(403);
      expect((await post('', caller, csv())).status).toBe(403);
    }
    expect((await post('', 'anonymous', csv())).status).toBe(401);
  });

  it.each([
    ['an unknown column', 'service,sketch,colour\nx,y,z\n', /Line 1: 'colour' is not a column of an inventory; the columns are service, sketch, team/],
    ['a header without rows', `${HEADER}\n`, /a header row but no sketches/],
    ['an unclosed quote', `${HEADER}\n"checkout,per-card-limiter\n`, /Line 2: a quoted cell is never closed/],
    ['a binary file', '\u0000\u0001\u0002', /binary data/],
    ['an empty file', '', /The file is empty/],
  ])('when the file has %s, then the preview answers 400 saying what to fix', async (_name, text, message) => {
    const res = await post('/preview', 'owner', text);
    expect(res.status).toBe(400);
    expect((await jsonOf(res)).error.message).toMatch(message);
  });

  it('when the template is downloaded, then it is a CSV attachment whose header is the documented columns and whose examples preview cleanly', async () => {
    const res = await fetch(`${world.appUrl}/api/v1/imports/sketches/template`, { headers: callers.headers('viewer') });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="?brimwatch-inventory-template\.csv"?$/);
    const text = await res.text();
    const { columns } = await jsonOf(await fetch(`${world.appUrl}/api/v1/imports/sketches/columns`, { headers: callers.headers('viewer') }));
    expect(readCsv(text, 10)[0].cells).toEqual(columns.map((c: { name: string }) => c.name));
    await world.tdb.db('sketches').delete();
    await world.tdb.db('services').delete();
    const preview = await jsonOf(await post('/preview', 'sre', text));
    expect(preview).toMatchObject({ ready: 2, withProblems: 0 });
  });
});
