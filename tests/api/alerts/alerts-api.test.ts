import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { evaluateSketchAlerts } from '../../../backend/src/alerts/evaluate';
import { reviewAlerts } from '../../../backend/src/alerts/review';
import type { AlertSettings } from '../../../backend/src/alerts/settings';
import { as, startSketchWorld, type SketchWorld } from '../sketches/world';
import { addGrowingSketch, alertTestSettings, handClock, observe, type GrowingSketch } from './growing-sketch';

const sizes = { width: 2719, depth: 5, errorBudget: 100, confidence: 0.99 }; // capacity 108,245 (see alert-mail-flow.test.ts)
const hour = 3_600_000;

describe('the alerts API', () => {
  let w: SketchWorld;
  let settings: AlertSettings;
  let viewer: string;
  let responder: string;
  let limiter: GrowingSketch;
  let quota: GrowingSketch;
  let ranking: GrowingSketch;
  const now = new Date();
  const clock = handClock(now);
  const alertOf = async (s: GrowingSketch) => (await w.db('alerts').where({ sketch_id: s.sketchId }).orderBy('id', 'desc').first('id')).id as number;

  beforeAll(async () => {
    w = await startSketchWorld();
    settings = alertTestSettings(w.tdb.url);
    viewer = await w.tokenFor('viewer');
    responder = await w.tokenFor('responder');
    limiter = await addGrowingSketch(w.db, { team: 'payments', service: 'checkout', sketch: 'per-card-limiter', ...sizes });
    quota = await addGrowingSketch(w.db, { team: 'edge', service: 'api-gateway', sketch: 'per-key-quota', ...sizes });
    ranking = await addGrowingSketch(w.db, { team: 'ads', service: 'ads-ranking', sketch: 'ad-frequency-cap', ...sizes });
    await observe(w.db, limiter, now, 90_000, clock, settings); // watch
    await observe(w.db, quota, now, 112_000, clock, settings); // brimmed
    await w.db.transaction((trx) => evaluateSketchAlerts(trx, [{ sketchId: ranking.sketchId, level: 'unreachable', judgement: null, at: now }], clock, settings));
  });
  afterAll(() => w.close());

  it('when a viewer lists alerts, then the open ones come worst first: brimmed, unreachable, watch', async () => {
    const res = await as(w.app, viewer).get('/api/v1/alerts');
    expect(res.status).toBe(200);
    expect(res.body.alerts.map((a: { sketch: string; level: string; state: string }) => `${a.level} ${a.sketch} ${a.state}`)).toEqual([
      'brimmed per-key-quota open',
      'unreachable ad-frequency-cap open',
      'watch per-card-limiter open',
    ]);
    expect(res.body.alerts[0]).toMatchObject({ service: 'api-gateway', team: 'edge', teamName: 'Edge Platform', acknowledgedBy: null, quietUntil: null });
    expect(res.body.alerts[0].load).toBeCloseTo(112_000 / 108_245.34, 4);
  });

  it('when the list is filtered by team or level, then only those come back; an unknown team is a 400 that lists the teams', async () => {
    expect((await as(w.app, viewer).get('/api/v1/alerts?team=payments')).body.alerts.map((a: { sketch: string }) => a.sketch)).toEqual(['per-card-limiter']);
    expect((await as(w.app, viewer).get('/api/v1/alerts?level=brimmed,watch')).body.alerts).toHaveLength(2);
    const res = await as(w.app, viewer).get('/api/v1/alerts?team=billing');
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'unknown_team', field: 'team' });
    expect(res.body.error.message).toMatch(/no team 'billing'.*payments/);
    const bad = await as(w.app, viewer).get('/api/v1/alerts?state=closed');
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('state');
  });

  it('when a viewer tries to acknowledge, then 403 says a responder is needed', async () => {
    const res = await as(w.app, viewer).post(`/api/v1/alerts/${await alertOf(quota)}/acknowledge`).send({ note: 'mine' });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/responder role or higher/);
  });

  it('when a responder acknowledges with a note, then the alert says who, when and why, its timeline and the audit log too, and reminders stop', async () => {
    const id = await alertOf(quota);
    const res = await as(w.app, responder).post(`/api/v1/alerts/${id}/acknowledge`).send({ note: 'resizing in the 14:00 deploy' });
    expect(res.status).toBe(200);
    expect(res.body.alert).toMatchObject({ state: 'acknowledged', acknowledgeNote: 'resizing in the 14:00 deploy', acknowledgedBy: { login: expect.stringMatching(/^responder-/) } });
    expect(res.body.events.map((e: { kind: string }) => e.kind)).toEqual(['opened', 'notified', 'acknowledged']);
    expect(res.body.events[2].actor).toMatch(/^responder-/);
    const audit = await w.db('audit_log').where({ action: 'alert.acknowledged', subject_id: String(id) }).first();
    expect(audit.actor).toMatch(/^responder-\d+ \(token:/);

    const mailsBefore = Number((await w.db('mail_outbox').where({ alert_id: id }).count({ n: '*' }).first())?.n);
    clock.set(new Date(now.getTime() + 25 * hour)); // past the 4 h reminder and the escalation delay
    await reviewAlerts(w.db, clock, settings);
    expect(Number((await w.db('mail_outbox').where({ alert_id: id }).count({ n: '*' }).first())?.n)).toBe(mailsBefore);
  });

  it('when an acknowledged alert is acknowledged again, then 409 names who did it first', async () => {
    const res = await as(w.app, responder).post(`/api/v1/alerts/${await alertOf(quota)}/acknowledge`).send({});
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'already_acknowledged' });
    expect(res.body.error.message).toMatch(/already acknowledged by responder-/);
  });

  it('when a resolved alert is acknowledged, then 409 says it is over and nothing changes', async () => {
    const id = await alertOf(limiter);
    const calm = new Date(now.getTime() + 26 * hour); // after the review at 25 h above
    clock.set(calm);
    await observe(w.db, limiter, calm, 10_000, clock, settings);
    clock.set(new Date(calm.getTime() + 20 * 60_000));
    await reviewAlerts(w.db, clock, settings);
    const res = await as(w.app, responder).post(`/api/v1/alerts/${id}/acknowledge`).send({ note: 'late' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('alert_resolved');
    expect(res.body.error.message).toMatch(/was resolved at .*nothing to acknowledge/);
    expect(await w.db('alerts').where({ id }).first('state', 'acknowledge_note')).toEqual({ state: 'resolved', acknowledge_note: null });
  });

  it('when an alert id is unknown or malformed, then 404 or 400 says so', async () => {
    expect((await as(w.app, responder).post('/api/v1/alerts/987654/acknowledge').send({})).status).toBe(404);
    const res = await as(w.app, viewer).get('/api/v1/alerts/abc');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/alert id in the path must be a positive whole number/);
  });

  it("when the sketch page asks for its alerts, then it gets each alert's timeline; an unknown sketch is a 404", async () => {
    const res = await as(w.app, viewer).get(`/api/v1/sketches/${limiter.sketchId}/alerts`);
    expect(res.status).toBe(200);
    expect(res.body.alerts).toHaveLength(1);
    // Nobody acknowledged it, so the review at 25 h sent the 24-hour watch reminder.
    expect(res.body.alerts[0].events.map((e: { kind: string; note: string }) => `${e.kind} ${/^\w+/.exec(e.note)?.[0]}`)).toEqual([
      'opened opened', 'notified opened', 'notified repeat', 'resolved clear', 'notified resolved',
    ]);
    expect(res.body.alerts[0].events[1].mail).toMatchObject({ subject: '[Brimwatch] watch · checkout / per-card-limiter · 83 %', attempts: 0, sentAt: null });
    expect((await as(w.app, viewer).get('/api/v1/sketches/987654/alerts')).status).toBe(404);
  });
});
