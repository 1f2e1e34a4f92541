import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { as, startSketchWorld, validRegistration, type SketchWorld } from './world';

describe("a sketch's own audit entries", () => {
  let w: SketchWorld;
  let owner: string;
  let viewer: string;
  beforeAll(async () => {
    w = await startSketchWorld();
    owner = await w.tokenFor('owner', ['payments']);
    viewer = await w.tokenFor('viewer');
  });
  afterAll(() => w.close());

  it('when a viewer reads them, then they see who registered and changed that sketch, newest first, and nothing about other subjects', async () => {
    const first = await as(w.app, owner).post('/api/v1/sketches').send({ ...validRegistration(), sketch: 'audited-limiter' });
    const other = await as(w.app, owner).post('/api/v1/sketches').send({ ...validRegistration(), sketch: 'other-limiter' });
    expect([first.status, other.status]).toEqual([201, 201]);
    await as(w.app, owner).patch(`/api/v1/sketches/${first.body.id}`).send({ errorBudget: 80 });

    const res = await as(w.app, viewer).get(`/api/v1/sketches/${first.body.id}/audit`);
    expect(res.status).toBe(200);
    expect(res.body.entries.map((e: { action: string }) => e.action)).toEqual(['sketch.updated', 'sketch.registered']);
    expect(res.body.entries.every((e: { subjectId: string }) => e.subjectId === String(first.body.id))).toBe(true);
    expect(res.body.entries[0].after).toMatchObject({ errorBudget: 80 });
  });

  it('when the sketch does not exist or the id is not a number, then the answer says so', async () => {
    expect((await as(w.app, viewer).get('/api/v1/sketches/424242/audit')).status).toBe(404);
    const bad = await as(w.app, viewer).get('/api/v1/sketches/abc/audit');
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/positive whole number/);
  });
});
