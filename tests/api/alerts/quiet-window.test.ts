import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { drainOutbox } from '../../../backend/src/alerts/outbox-sender';
import { smtpTransport, type MailTransport } from '../../../backend/src/alerts/mail-transport';
import { reviewAlerts } from '../../../backend/src/alerts/review';
import type { AlertSettings } from '../../../backend/src/alerts/settings';
import { seed as seedTeams } from '../../../seeds/01_teams_and_services';
import { createTestDatabase, type TestDatabase } from '../../setup/database';
import { addGrowingSketch, alertTestSettings, handClock, observe, type GrowingSketch } from './growing-sketch';
import { startMailFake, type MailFake } from './maildev';

const T0 = new Date('2026-12-03T09:00:00Z');
const min = (n: number) => new Date(T0.getTime() + n * 60_000);
const sizes = { width: 2719, depth: 5, errorBudget: 100, confidence: 0.99 }; // capacity 108,245 (see alert-mail-flow.test.ts)

describe('quiet windows hold alert e-mail', () => {
  let tdb: TestDatabase;
  let fake: MailFake;
  let transport: MailTransport;
  let settings: AlertSettings;
  let held: GrowingSketch;
  let brief: GrowingSketch;
  const clock = handClock(T0);
  const tick = async (at: Date) => {
    clock.set(at);
    await reviewAlerts(tdb.db, clock, settings);
    await drainOutbox(tdb.db, transport, clock, { from: settings.from, retryBaseMs: 30_000, retryMaxMs: 1_800_000 });
    return fake.inbox();
  };

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await seedTeams(tdb.db);
    fake = await startMailFake();
    transport = smtpTransport({ SMTP_HOST: '127.0.0.1', SMTP_PORT: fake.smtpPort, SMTP_SECURE: false, SMTP_USER: undefined, SMTP_PASS: undefined });
    // Escalation far off, so the notices here are only those the windows hold.
    settings = alertTestSettings(tdb.url, { escalationDelayMs: 24 * 3_600_000 });
    held = await addGrowingSketch(tdb.db, { team: 'payments', service: 'checkout', sketch: 'per-card-limiter', ...sizes });
    brief = await addGrowingSketch(tdb.db, { team: 'ads', service: 'ads-ranking', sketch: 'ad-frequency-cap', ...sizes });
    const service = await tdb.db('sketches').where({ id: held.sketchId }).first('service_id');
    await tdb.db('quiet_windows').insert([
      { scope: 'service', service_id: service.service_id, starts_at: T0, ends_at: min(120), reason: 'checkout load test', created_by_login: 'kai' },
      { scope: 'team', team_id: brief.teamId, starts_at: T0, ends_at: min(120), reason: 'ads replay', created_by_login: 'kai' },
    ]);
  });
  afterAll(async () => {
    transport?.close();
    await fake?.discard();
    await tdb?.drop();
  });

  it('when alerts open and rise inside a window, then they are recorded but no e-mail goes out', async () => {
    clock.set(min(30));
    await observe(tdb.db, held, min(30), 90_000, clock, settings); // watch
    await observe(tdb.db, brief, min(30), 90_000, clock, settings); // watch
    clock.set(min(90));
    await observe(tdb.db, held, min(90), 112_000, clock, settings); // brimmed
    await observe(tdb.db, brief, min(90), 20_000, clock, settings); // calm: settling starts
    expect(await tick(min(110))).toEqual([]); // brief's settling period is over: it resolves, unannounced
    const alerts = await tdb.db('alerts').orderBy('sketch_id').select('sketch_id', 'state', 'level', 'last_notified_at');
    expect(alerts).toEqual([
      { sketch_id: held.sketchId, state: 'open', level: 'brimmed', last_notified_at: null },
      { sketch_id: brief.sketchId, state: 'resolved', level: 'watch', last_notified_at: null },
    ]);
    expect(await tdb.db('mail_outbox').count({ n: '*' }).first()).toEqual({ n: 0 });
  });

  it('when the window ends and the alert is still open, then one e-mail goes at its present level; the resolved one stays silent', async () => {
    expect(await tick(min(119))).toEqual([]);
    const inbox = await tick(min(120));
    expect(inbox.map((m) => m.subject)).toEqual(['[Brimwatch] brimmed · checkout / per-card-limiter · 103 %']);
    expect(await tick(min(150))).toHaveLength(1);
  });
});
