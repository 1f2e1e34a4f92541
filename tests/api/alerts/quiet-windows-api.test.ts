import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { as, startSketchWorld, type SketchWorld } from '../sketches/world';

const inHours = (h: number) => new Date(Date.now() + h * 3_600_000).toISOString();

describe('the quiet windows API', () => {
  let w: SketchWorld;
  let viewer: string;
  let responder: string;
  beforeAll(async () => {
    w = await startSketchWorld();
    viewer = await w.tokenFor('viewer');
    responder = await w.tokenFor('responder');
  });
  afterAll(() => w.close());

  it('when a responder quiets a team for a load test, then 201 returns who set it and until when, and the list shows it', async () => {
    const endsAt = inHours(2);
    const res = await as(w.app, responder).post('/api/v1/quiet-windows').send({ scope: 'team', team: 'payments', endsAt, reason: 'checkout load test' });
    expect(res.status).toBe(201);
    expect(res.body.quietWindow).toMatchObject({ scope: 'team', team: 'payments', teamName: 'Payments', endsAt, reason: 'checkout load test', status: 'in force' });
    expect(res.body.quietWindow.createdBy).toMatch(/^responder-/);
    const list = await as(w.app, viewer).get('/api/v1/quiet-windows');
    expect(list.body.quietWindows.map((q: { id: number }) => q.id)).toEqual([res.body.quietWindow.id]);
    expect(await w.db('audit_log').where({ action: 'quiet_window.created' }).count({ n: '*' }).first()).toEqual({ n: 1 });
  });

  it('when a service is quieted from later on, then it is upcoming and names the service and its team', async () => {
    const res = await as(w.app, responder).post('/api/v1/quiet-windows').send({ scope: 'service', service: 'search', startsAt: inHours(1), endsAt: inHours(3), reason: 'index rebuild' });
    expect(res.status).toBe(201);
    expect(res.body.quietWindow).toMatchObject({ service: 'search', team: 'discovery', status: 'upcoming' });
  });

  it('when a viewer tries to set one, then 403', async () => {
    const res = await as(w.app, viewer).post('/api/v1/quiet-windows').send({ scope: 'team', team: 'payments', endsAt: inHours(1), reason: 'x' });
    expect(res.status).toBe(403);
  });

  it('when a window ends before it starts, then 400 on endsAt, and nothing is stored', async () => {
    const before = await w.db('quiet_windows').count({ n: '*' }).first();
    const res = await as(w.app, responder).post('/api/v1/quiet-windows').send({ scope: 'team', team: 'payments', startsAt: inHours(3), endsAt: inHours(2), reason: 'load test' });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('endsAt');
    expect(res.body.error.message).toMatch(/must be after startsAt/);
    expect(await w.db('quiet_windows').count({ n: '*' }).first()).toEqual(before);
  });

  it('when the team is unknown, then 400 on team lists the teams there are', async () => {
    const res = await as(w.app, responder).post('/api/v1/quiet-windows').send({ scope: 'team', team: 'billing', endsAt: inHours(1), reason: 'load test' });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'unknown_team', field: 'team' });
    expect(res.body.error.message).toMatch(/no team 'billing'; use the slug of one of ads, discovery, edge, payments, trust/);
  });

  it('when the target does not match the scope, or the reason or the end is missing, then 400 names the field', async () => {
    const cases: [Record<string, unknown>, string][] = [
      [{ scope: 'sketch', endsAt: inHours(1), reason: 'x' }, 'sketchId'],
      [{ scope: 'team', team: 'payments', service: 'search', endsAt: inHours(1), reason: 'x' }, 'service'],
      [{ scope: 'team', team: 'payments', endsAt: inHours(1), reason: '  ' }, 'reason'],
      [{ scope: 'team', team: 'payments', reason: 'x' }, 'endsAt'],
      [{ scope: 'team', team: 'payments', endsAt: 'tomorrow', reason: 'x' }, 'endsAt'],
      [{ scope: 'team', team: 'payments', endsAt: inHours(-1), startsAt: inHours(-2), reason: 'x' }, 'endsAt'],
      [{ scope: 'team', team: 'payments', endsAt: inHours(24 * 40), reason: 'x' }, 'endsAt'],
      [{ scope: 'sketch', sketchId: 987654, endsAt: inHours(1), reason: 'x' }, 'sketchId'],
    ];
    for (const [body, field] of cases) {
      const res = await as(w.app, responder).post('/api/v1/quiet-windows').send(body);
      expect([res.status, res.body.error?.field], JSON.stringify(body)).toEqual([400, field]);
    }
  });

  it('when a responder ends a window early, then it stays on record as ended early; ending it again is a 409; an unknown id a 404', async () => {
    const made = await as(w.app, responder).post('/api/v1/quiet-windows').send({ scope: 'team', team: 'edge', endsAt: inHours(1), reason: 'gateway failover drill' });
    const id = made.body.quietWindow.id;
    const res = await as(w.app, responder).delete(`/api/v1/quiet-windows/${id}`);
    expect(res.status).toBe(200);
    expect(res.body.quietWindow).toMatchObject({ status: 'ended early', cancelledBy: expect.stringMatching(/^responder-/) });
    expect((await as(w.app, viewer).get('/api/v1/quiet-windows?when=past')).body.quietWindows.map((q: { id: number }) => q.id)).toContain(id);
    const again = await as(w.app, responder).delete(`/api/v1/quiet-windows/${id}`);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already over/);
    expect((await as(w.app, responder).delete('/api/v1/quiet-windows/987654')).status).toBe(404);
  });
});
