import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { drainOutbox } from '../../../backend/src/alerts/outbox-sender';
import { smtpTransport, type MailTransport } from '../../../backend/src/alerts/mail-transport';
import { seed as seedTeams } from '../../../seeds/01_teams_and_services';
import { createTestDatabase, type TestDatabase } from '../../setup/database';
import { addGrowingSketch, alertTestSettings, handClock, observe } from './growing-sketch';
import { startMailFake, type MailFake } from './maildev';

const T0 = new Date('2026-12-02T10:00:00Z');
const sec = (n: number) => new Date(T0.getTime() + n * 1000);

describe('mail outage: the outbox keeps every message until the server is back', () => {
  let tdb: TestDatabase;
  let fake: MailFake;
  let transport: MailTransport;
  const clock = handClock(T0);
  let drain: () => ReturnType<typeof drainOutbox>;
  const outbox = () => tdb.db('mail_outbox').orderBy('id').select('id', 'subject', 'attempts', 'next_attempt_at', 'last_error', 'sent_at', 'smtp_message_id');

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await seedTeams(tdb.db);
    fake = await startMailFake();
    transport = smtpTransport({ SMTP_HOST: '127.0.0.1', SMTP_PORT: fake.smtpPort, SMTP_SECURE: false, SMTP_USER: undefined, SMTP_PASS: undefined });
    const settings = alertTestSettings(tdb.url); // retries: 30 s, doubling, at most 30 min (the shipped defaults)
    drain = () => drainOutbox(tdb.db, transport, clock, { from: settings.from, retryBaseMs: settings.retryBaseMs, retryMaxMs: settings.retryMaxMs });

    await fake.stop(); // the mail server goes away
    const sizes = { width: 2719, depth: 5, errorBudget: 100, confidence: 0.99 }; // capacity 108,245 (see alert-mail-flow.test.ts)
    const a = await addGrowingSketch(tdb.db, { team: 'payments', service: 'checkout', sketch: 'per-card-limiter', ...sizes });
    const b = await addGrowingSketch(tdb.db, { team: 'edge', service: 'api-gateway', sketch: 'per-key-quota', ...sizes });
    await observe(tdb.db, a, T0, 90_000, clock, settings); // watch: opens
    await observe(tdb.db, b, T0, 95_000, clock, settings); // watch: opens
    clock.set(sec(5));
    await observe(tdb.db, a, sec(5), 112_000, clock, settings); // brimmed: a rise
  });
  afterAll(async () => {
    transport?.close();
    await fake?.discard();
    await tdb?.drop();
  });

  it('when SMTP is down, then every attempt fails, is counted, keeps its error and backs off 30 s, 60 s, 120 s, 240 s', async () => {
    expect(await outbox()).toHaveLength(3);
    const waits: number[][] = [];
    for (const at of [sec(5), sec(20), sec(35), sec(95), sec(215)]) {
      clock.set(at);
      const result = await drain();
      expect(result.sent).toBe(0);
      const rows = await outbox();
      waits.push(rows.map((r) => (new Date(r.next_attempt_at).getTime() - at.getTime()) / 1000));
    }
    const rows = await outbox();
    expect(rows.map((r) => r.attempts)).toEqual([4, 4, 4]); // at 5 s, 35 s, 95 s, 215 s; the tick at 20 s found nothing due
    // Seconds from each tick to the next try: 30 after the 1st failure, still 15 to wait at 20 s, then 60, 120, 240.
    expect(waits).toEqual([30, 15, 60, 120, 240].map((w) => [w, w, w]));
    expect(rows.every((r) => r.sent_at === null && /ECONNREFUSED/.test(r.last_error ?? ''))).toBe(true);
  });

  it('when SMTP is back, then every message is delivered once: none twice, none lost', async () => {
    fake = await startMailFake(fake);
    clock.set(sec(455)); // the next try, 240 s after the last
    expect(await drain()).toEqual({ sent: 3, failed: 0 });
    clock.set(sec(3600));
    expect(await drain()).toEqual({ sent: 0, failed: 0 });

    const rows = await outbox();
    const inbox = await fake.inbox();
    expect(inbox).toHaveLength(rows.length);
    expect(inbox.map((m) => m.subject).sort()).toEqual(rows.map((r) => r.subject).sort());
    expect(inbox.map((m) => m.headers['message-id']).sort()).toEqual(rows.map((r) => r.smtp_message_id).sort());
    expect(rows.every((r) => r.attempts === 5 && r.sent_at !== null && r.last_error === null)).toBe(true);
    expect(inbox.map((m) => m.subject).sort()).toEqual([
      '[Brimwatch] brimmed · checkout / per-card-limiter · 103 %',
      '[Brimwatch] watch · api-gateway / per-key-quota · 87 %',
      '[Brimwatch] watch · checkout / per-card-limiter · 83 %',
    ]);
  }, 60_000); // restarting maildev can take a while on a busy machine
});
