import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { as, startSketchWorld, validRegistration, type SketchWorld } from './world';

describe('changing and deleting a sketch', () => {
  let w: SketchWorld;
  let owner: string;
  let stranger: string;
  beforeAll(async () => {
    w = await startSketchWorld();
    owner = await w.tokenFor('owner', ['payments']);
    stranger = await w.tokenFor('owner', ['discovery']);
  });
  afterAll(() => w.close());

  let sequence = 0;
  const register = async (extra: Record<string, unknown> = {}) => {
    const res = await as(w.app, owner).post('/api/v1/sketches').send({ ...validRegistration(), sketch: `limiter-${++sequence}`, ...extra });
    expect(res.status).toBe(201);
    return res.body.id as number;
  };
  const auditOf = (id: number, action: string) => w.db('audit_log').where({ subject_type: 'sketch', subject_id: String(id), action }).orderBy('id');

  it('when the owner changes the budget and watch line, then the sketch shows them and the audit log keeps before and after', async () => {
    const id = await register();
    const res = await as(w.app, owner).patch(`/api/v1/sketches/${id}`).send({ errorBudget: 80, watchLine: 0.7 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id, errorBudget: 80, watchLine: 0.7, confidence: 0.99 });
    const [entry] = await auditOf(id, 'sketch.updated');
    expect(entry.before).toMatchObject({ errorBudget: 50, watchLine: 0.8 });
    expect(entry.after).toMatchObject({ errorBudget: 80, watchLine: 0.7 });
    expect(entry.actor).toMatch(/^owner-/);
  });

  it('when the address of a one-instance sketch changes, then the same target is re-addressed so its history stays', async () => {
    const id = await register();
    const before = await w.db('targets').where({ sketch_id: id }).first();
    const res = await as(w.app, owner).patch(`/api/v1/sketches/${id}`).send({ targetUrl: 'http://127.0.0.1:9555/metrics' });
    expect(res.status).toBe(200);
    const after = await w.db('targets').where({ sketch_id: id }).first();
    expect(after).toMatchObject({ id: before.id, url: 'http://127.0.0.1:9555/metrics' });
    const [entry] = await auditOf(id, 'sketch.updated');
    expect(entry.before.instances[0].targetUrl).toBe('http://127.0.0.1:9500/metrics');
    expect(entry.after.instances[0].targetUrl).toBe('http://127.0.0.1:9555/metrics');
  });

  it('when the replicas are listed anew, then kept names keep their target, new ones are added and missing ones removed', async () => {
    const id = await register({ targetUrl: undefined, instances: [{ instance: 'c-1', targetUrl: 'http://127.0.0.1:9601/m' }, { instance: 'c-2', targetUrl: 'http://127.0.0.1:9602/m' }] });
    const c1 = await w.db('targets').where({ sketch_id: id, instance: 'c-1' }).first();
    const res = await as(w.app, owner)
      .patch(`/api/v1/sketches/${id}`)
      .send({ instances: [{ instance: 'c-1', targetUrl: 'http://127.0.0.1:9601/m' }, { instance: 'c-3', targetUrl: 'http://127.0.0.1:9603/m' }] });
    expect(res.status).toBe(200);
    expect(res.body.instances.map((i: { instance: string }) => i.instance)).toEqual(['c-1', 'c-3']);
    expect((await w.db('targets').where({ sketch_id: id, instance: 'c-1' }).first()).id).toBe(c1.id);
  });

  it('when an owner of another team changes or deletes the sketch, then 403 and nothing changes', async () => {
    const id = await register();
    expect((await as(w.app, stranger).patch(`/api/v1/sketches/${id}`).send({ errorBudget: 1 })).status).toBe(403);
    expect((await as(w.app, stranger).delete(`/api/v1/sketches/${id}`)).status).toBe(403);
    expect(await w.db('sketches').where({ id }).first('error_budget')).toEqual({ error_budget: 50 });
    expect(await auditOf(id, 'sketch.updated')).toEqual([]);
  });

  it('when a change is invalid or clashes, then 400 or 409 names the field and nothing changes', async () => {
    const id = await register();
    for (const [body, field, status] of [
      [{ confidence: 1.5 }, 'confidence', 400],
      [{ targetUrl: 'http://10.9.9.9/m' }, 'targetUrl', 400],
      [{ service: 'search' }, 'service', 400],
      [{ team: 'ads' }, 'team', 400],
      [{ sketch: 'limiter-1' }, 'sketch', 409],
    ] as const) {
      const res = await as(w.app, owner).patch(`/api/v1/sketches/${id}`).send(body);
      expect(res.status, JSON.stringify(body)).toBe(status);
      expect(res.body.error.field, JSON.stringify(body)).toBe(field);
    }
    expect(await auditOf(id, 'sketch.updated')).toEqual([]);
  });

  it('when an sre deletes a sketch, then it, its targets and its readings are gone, and the audit log keeps what it was', async () => {
    const id = await register();
    const target = await w.db('targets').where({ sketch_id: id }).first('id');
    await w.db('readings').insert({ target_id: target.id, sketch_id: id, taken_at: new Date(), ok: false, failure_reason: 'connection refused' });
    const sre = await w.tokenFor('sre');
    expect((await as(w.app, sre).delete(`/api/v1/sketches/${id}`)).status).toBe(204);
    expect(await w.db('sketches').where({ id }).first()).toBeUndefined();
    expect(await w.db('targets').where({ sketch_id: id }).first()).toBeUndefined();
    expect(await w.db('readings').where({ sketch_id: id }).first()).toBeUndefined();
    const [entry] = await auditOf(id, 'sketch.deleted');
    expect(entry.before).toMatchObject({ id, sketch: `limiter-${sequence}`, instances: [{ instance: '127.0.0.1:9500' }] });
    expect(entry.actor).toMatch(/^sre-/);
    expect((await as(w.app, sre).get(`/api/v1/sketches/${id}`)).status).toBe(404);
  });

  it('when a viewer reads one sketch, then it answers with its settings and instances; a viewer may not change it', async () => {
    const id = await register();
    const viewer = await w.tokenFor('viewer');
    const res = await as(w.app, viewer).get(`/api/v1/sketches/${id}`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id, service: 'checkout', team: 'payments', targetUrl: 'http://127.0.0.1:9500/metrics', instances: [{ instance: '127.0.0.1:9500' }] });
    expect((await as(w.app, viewer).patch(`/api/v1/sketches/${id}`).send({ errorBudget: 2 })).status).toBe(403);
    expect((await as(w.app, viewer).get('/api/v1/sketches/abc')).status).toBe(400);
  });
});
