import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { as, startSketchWorld, validRegistration, type SketchWorld } from './world';

const counts = async (w: SketchWorld) => ({
  sketches: Number((await w.db('sketches').count({ n: '*' }))[0].n),
  targets: Number((await w.db('targets').count({ n: '*' }))[0].n),
  services: Number((await w.db('services').count({ n: '*' }))[0].n),
  audit: Number((await w.db('audit_log').count({ n: '*' }))[0].n),
});

describe('registering a sketch', () => {
  let w: SketchWorld;
  let sre: string;
  beforeAll(async () => {
    w = await startSketchWorld();
    sre = await w.tokenFor('sre');
  });
  afterAll(() => w.close());

  it('when an owner registers a sketch of their team with a bearer token, then 201 returns it with its id, defaults and one instance named by host:port', async () => {
    const owner = await w.tokenFor('owner', ['payments']);
    const res = await as(w.app, owner).post('/api/v1/sketches').send({ ...validRegistration(), sizedTotal: 100_000 });
    expect(res.status).toBe(201);
    expect(res.headers.location).toBe(`/api/v1/sketches/${res.body.id}`);
    expect(res.body).toMatchObject({
      service: 'checkout',
      sketch: 'per-card-limiter',
      team: 'payments',
      errorBudget: 50,
      confidence: 0.99,
      watchLine: 0.8,
      leadTimeDays: 7,
      scrapeIntervalSeconds: 30,
      sizedTotal: 100_000,
      level: 'stale',
      lastReadingAt: null,
      instances: [{ instance: '127.0.0.1:9500', targetUrl: 'http://127.0.0.1:9500/metrics', level: 'stale' }],
      resizePlan: null,
    });
    expect(res.body.id).toEqual(expect.any(Number));
    const audit = await w.db('audit_log').where({ action: 'sketch.registered', subject_id: String(res.body.id) }).first();
    expect(audit.after).toMatchObject({ sketch: 'per-card-limiter', instances: [{ instance: '127.0.0.1:9500' }] });
    expect(audit.actor).toMatch(/^owner-\d+ \(token:/);
  });

  it('when the service is new, then it is created for the team; with replicas, one target per instance', async () => {
    const res = await as(w.app, sre)
      .post('/api/v1/sketches')
      .send({
        ...validRegistration(),
        service: 'wishlist',
        sketch: 'heavy-savers',
        team: 'discovery',
        targetUrl: undefined,
        instances: [
          { instance: 'wishlist-1', targetUrl: 'http://127.0.0.1:9601/metrics' },
          { instance: 'wishlist-2', targetUrl: 'http://127.0.0.1:9602/metrics' },
        ],
      });
    expect(res.status).toBe(201);
    expect(res.body.instances.map((i: { instance: string }) => i.instance)).toEqual(['wishlist-1', 'wishlist-2']);
    const service = await w.db('services').where({ name: 'wishlist' }).first();
    const team = await w.db('teams').where({ slug: 'discovery' }).first();
    expect(service.team_id).toBe(team.id);
  });

  it('when the service belongs to another team, then 409 names the owning team and nothing is written', async () => {
    const before = await counts(w);
    const res = await as(w.app, sre).post('/api/v1/sketches').send({ ...validRegistration(), team: 'ads', sketch: 'other' });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ field: 'service', message: expect.stringContaining('belongs to team payments') });
    expect(await counts(w)).toEqual(before);
  });

  it('when the same sketch is registered twice, then 409 on the sketch field', async () => {
    const res = await as(w.app, sre).post('/api/v1/sketches').send(validRegistration());
    expect(res.status).toBe(409);
    expect(res.body.error.field).toBe('sketch');
  });

  it('when an owner registers for a team they are not in, then 403 and nothing is written', async () => {
    const owner = await w.tokenFor('owner', ['ads']);
    const before = await counts(w);
    const res = await as(w.app, owner).post('/api/v1/sketches').send({ ...validRegistration(), sketch: 'not-mine' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('not_your_team');
    expect(await counts(w)).toEqual(before);
  });

  it('when a responder or an anonymous caller registers, then 403 or 401', async () => {
    const responder = await w.tokenFor('responder', ['payments']);
    expect((await as(w.app, responder).post('/api/v1/sketches').send(validRegistration())).status).toBe(403);
    const { default: request } = await import('supertest');
    expect((await request(w.app).post('/api/v1/sketches').send(validRegistration())).status).toBe(401);
  });

  const badValues: [string, unknown, RegExp][] = [
    ['service', '', /service must be a service name/],
    ['service', 'check out!', /service must be a service name/],
    ['service', 42, /service must be a service name/],
    ['sketch', 'a"b', /sketch must be the sketch's `sketch` label/],
    ['sketch', undefined, /sketch is required/],
    ['team', 'nowhere', /team must be the slug of an existing team \(ads, discovery, edge, payments, trust\)/],
    ['targetUrl', 'ftp://127.0.0.1/metrics', /targetUrl must be the http:\/\/ or https:\/\//],
    ['targetUrl', 'not a url', /targetUrl must be the http/],
    ['targetUrl', 'http://10.0.0.5:9100/metrics', /outside TARGET_ALLOWLIST/],
    ['targetUrl', 'http://169.254.169.254/latest/meta-data', /never scraped/],
    ['errorBudget', 0, /errorBudget must be a number greater than 0/],
    ['errorBudget', '50', /errorBudget must be a number greater than 0/],
    ['errorBudget', undefined, /errorBudget is required/],
    ['confidence', 1, /confidence must be a fraction strictly between 0 and 1/],
    ['confidence', 0, /confidence must be a fraction strictly between 0 and 1/],
    ['watchLine', 1.5, /watchLine must be a fraction above 0 and at most 1/],
    ['leadTimeDays', -1, /leadTimeDays must be a number of days from 0 to 365/],
    ['scrapeIntervalSeconds', 4, /scrapeIntervalSeconds must be a whole number of seconds from 5 to 86400/],
    ['scrapeIntervalSeconds', 30.5, /scrapeIntervalSeconds must be a whole number/],
    ['sizedTotal', -10, /sizedTotal must be a number greater than 0/],
    ['instances', [], /instances must list 1 to 64 replicas/],
    ['instances.1.targetUrl', [{ instance: 'a', targetUrl: 'http://127.0.0.1:1/m' }, { instance: 'b', targetUrl: 'http://10.1.1.1/m' }], /instances.1.targetUrl is not allowed/],
    ['instances', [{ instance: 'a', targetUrl: 'http://127.0.0.1:1/m' }, { instance: 'a', targetUrl: 'http://127.0.0.1:2/m' }], /an instance name appears twice/],
    ['colour', 'blue', /Unknown field colour/],
  ];

  for (const [field, value, message] of badValues) {
    it(`when ${field} is ${JSON.stringify(value)}, then 400 names ${field} with a message and nothing is written`, async () => {
      const before = await counts(w);
      const top = field.split('.')[0];
      const body: Record<string, unknown> = { ...validRegistration(), sketch: 'fresh-one', [top]: value };
      if (top === 'instances') delete body.targetUrl;
      const res = await as(w.app, sre).post('/api/v1/sketches').send(body);
      expect(res.status).toBe(400);
      expect(res.body.error.field).toBe(field);
      expect(res.body.error.message).toMatch(message);
      expect(await counts(w)).toEqual(before);
    });
  }

  it('when neither targetUrl nor instances is sent, then 400 asks for targetUrl', async () => {
    const { targetUrl: _omit, ...body } = validRegistration();
    const res = await as(w.app, sre).post('/api/v1/sketches').send({ ...body, sketch: 'no-address' });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ field: 'targetUrl', message: expect.stringMatching(/targetUrl is required/) });
  });

  it('when the body is not JSON, then 400 says so', async () => {
    const res = await as(w.app, sre).post('/api/v1/sketches').set('content-type', 'application/json').send('{"service":');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_json');
  });
});
