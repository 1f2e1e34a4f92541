import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../backend/src/db';
import { evaluateSketchAlerts, type SketchJudged } from '../../backend/src/alerts/evaluate';
import { drainOutbox } from '../../backend/src/alerts/outbox-sender';
import { smtpTransport, type MailTransport } from '../../backend/src/alerts/mail-transport';
import { seed as seedTeams } from '../../seeds/01_teams_and_services';
import { createTestDatabase, type TestDatabase } from '../setup/database';
import { judgementOf } from '../api/sketches/fixtures';
import { alertTestSettings, handClock } from '../api/alerts/growing-sketch';
import { freePort, startMailFake, type MailFake } from '../api/alerts/maildev';
import { eventually } from './deadline';

const ALERTS = 500;
/** Senders at once, as one per collector process. */
const SENDERS = 3;
const T0 = new Date('2026-12-03T09:00:00Z');
const at = (seconds: number) => new Date(T0.getTime() + seconds * 1000);

/** 500 sketches over the demo teams, each with one instance just judged brimmed (load 1.2, by the maths module). */
async function brimmedFleet(db: Db): Promise<SketchJudged[]> {
  await seedTeams(db);
  const services: { id: number; team_id: number }[] = await db('services').orderBy('id').select('id', 'team_id');
  const judged: SketchJudged[] = [];
  for (let i = 0; i < ALERTS; i += 100) {
    const rows = Array.from({ length: Math.min(100, ALERTS - i) }, (_, k) => {
      const service = services[(i + k) % services.length];
      return { service_id: service.id, team_id: service.team_id, name: `per-key-limiter-${i + k}`, error_budget: 100, confidence: 0.99 };
    });
    const sketches: { id: number }[] = await db('sketches').insert(rows).returning('id');
    const targets: { id: number; sketch_id: number }[] = await db('targets')
      .insert(sketches.map((s) => ({ sketch_id: s.id, instance: 'replica-0', url: `http://127.0.0.1:9/${s.id}` })))
      .returning(['id', 'sketch_id']);
    // 2719 × 5 with a budget of 100 at 99 % holds 108,245; 130,000 is a load of 1.2.
    const judgement = judgementOf({ width: 2719, depth: 5, streamTotal: 130_000, errorBudget: 100, confidence: 0.99 });
    await db('target_status').insert(
      targets.map((t) => ({
        target_id: t.id, sketch_id: t.sketch_id, level: 'brimmed', taken_at: T0, last_ok_at: T0, stream_total: 130_000, width: 2719, depth: 5,
        counter_bytes: 4, window_seconds: 0, conservative: false, nonzero_cells: [1500, 1500, 1500, 1500, 1500], judgement: JSON.stringify(judgement), level_since: T0,
      })),
    );
    judged.push(...targets.map((t) => ({ sketchId: Number(t.sketch_id), level: 'brimmed' as const, judgement, at: T0 })));
  }
  return judged;
}

describe('SMTP down while 500 alerts are in flight', () => {
  let t: TestDatabase;
  let senders: Db[] = [];
  let transport: MailTransport;
  let fake: MailFake | undefined;
  const clock = handClock(T0);
  let ports: { smtpPort: number; webPort: number };
  beforeAll(async () => {
    t = await createTestDatabase();
    senders = Array.from({ length: SENDERS }, () => createDb(t.url, { max: 2 }));
    ports = { smtpPort: await freePort(), webPort: await freePort() };
    transport = smtpTransport({ SMTP_HOST: '127.0.0.1', SMTP_PORT: ports.smtpPort, SMTP_SECURE: false, SMTP_USER: undefined, SMTP_PASS: undefined });
  });
  afterAll(async () => {
    transport?.close();
    await fake?.discard();
    for (const db of senders) await db.destroy();
    await t?.drop();
  });

  const settings = () => alertTestSettings(t.url);
  /** Every sender drains at once, as several collector processes would, until a pass sends and fails nothing. */
  const drainAll = async () => {
    const total = { sent: 0, failed: 0 };
    for (;;) {
      const results = await Promise.all(senders.map((db) => drainOutbox(db, transport, clock, { from: settings().from, retryBaseMs: settings().retryBaseMs, retryMaxMs: settings().retryMaxMs, batch: 50 })));
      const pass = results.reduce((a, r) => ({ sent: a.sent + r.sent, failed: a.failed + r.failed }), { sent: 0, failed: 0 });
      total.sent += pass.sent;
      total.failed += pass.failed;
      if (pass.sent + pass.failed === 0) return total;
    }
  };

  it('when the mail server is away through several retries and comes back, then each of the 500 alert e-mails is delivered exactly once', async () => {
    const judged = await brimmedFleet(t.db);
    // Five collectors' worth of rounds at once, 100 sketches each, as the real hook is called.
    await Promise.all(Array.from({ length: 5 }, (_, i) => t.db.transaction((trx) => evaluateSketchAlerts(trx, judged.slice(i * 100, (i + 1) * 100), clock, settings()))));
    expect(Number((await t.db('alerts').where({ state: 'open', level: 'brimmed' }).count('* as n').first())?.n)).toBe(ALERTS);
    const outbox = () => t.db('mail_outbox').orderBy('id').select('id', 'attempts', 'sent_at', 'last_error', 'smtp_message_id', 'subject');
    expect(await outbox()).toHaveLength(ALERTS);

    // Down: three passes of retries (at 0 s, then after the 30 s and 60 s backoffs), every attempt counted, nothing dropped.
    for (const [second, attempts] of [[0, 1], [31, 2], [92, 3]] as const) {
      clock.set(at(second));
      expect(await drainAll()).toEqual({ sent: 0, failed: ALERTS });
      const rows = await outbox();
      expect(rows.every((r) => r.attempts === attempts && r.sent_at === null && /ECONNREFUSED/.test(r.last_error ?? ''))).toBe(true);
    }

    // Back on the same port, after the next backoff (120 s): every message goes out once.
    fake = await startMailFake({ ...ports, mailDir: fs.mkdtempSync(path.resolve('.data/maildev-faults-')) });
    clock.set(at(92 + 121));
    expect(await drainAll()).toEqual({ sent: ALERTS, failed: 0 });
    clock.set(at(86_400));
    expect(await drainAll()).toEqual({ sent: 0, failed: 0 });

    const rows = await outbox();
    expect(rows.every((r) => r.sent_at !== null && r.attempts === 4 && r.last_error === null)).toBe(true);
    const inbox = await eventually('maildev holds every message', 30_000, async () => {
      const mails = await fake!.inbox();
      return mails.length >= ALERTS ? mails : false;
    });
    expect(inbox).toHaveLength(ALERTS);
    const ids = inbox.map((m) => m.headers['message-id']);
    expect(new Set(ids).size).toBe(ALERTS);
    expect([...ids].sort()).toEqual(rows.map((r) => r.smtp_message_id).sort());
    expect(inbox.map((m) => m.subject).sort()).toEqual(rows.map((r) => r.subject).sort());
  }, 170_000);
});
