import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { drainOutbox } from '../../../backend/src/alerts/outbox-sender';
import { smtpTransport, type MailTransport } from '../../../backend/src/alerts/mail-transport';
import { assess } from '../../../backend/src/maths/assess';
import { resizePlan } from '../../../backend/src/maths/resize';
import { seed as seedTeams } from '../../../seeds/01_teams_and_services';
import { createTestDatabase, type TestDatabase } from '../../setup/database';
import { addGrowingSketch, alertTestSettings, handClock, observe, type GrowingSketch } from './growing-sketch';
import { startMailFake, type MailFake, type ReceivedMail } from './maildev';

const T0 = new Date('2026-12-01T06:00:00Z');
const at = (minutes: number) => new Date(T0.getTime() + minutes * 60_000);
// Sized by Cormode & Muthukrishnan's rule for 100,000 with a budget of 100 at 99 %:
// m = ⌈e / 0.001⌉ = 2719, k = ⌈ln 100⌉ = 5 (hand computation).
const SKETCH = { team: 'payments', service: 'checkout', sketch: 'per-card-limiter', width: 2719, depth: 5, errorBudget: 100, confidence: 0.99 };
// Capacity m·E·δ^(1/k) = 271,900 × 10^(−0.4) = 108,245.34 (hand computation, DESIGN.md's formula).
const HAND_CAPACITY = 108_245.34;

describe('alert e-mail, end to end through a real maildev', () => {
  let tdb: TestDatabase;
  let fake: MailFake;
  let transport: MailTransport;
  let s: GrowingSketch;
  let inbox: ReceivedMail[];
  const clock = handClock(T0);

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await seedTeams(tdb.db);
    fake = await startMailFake();
    transport = smtpTransport({ SMTP_HOST: '127.0.0.1', SMTP_PORT: fake.smtpPort, SMTP_SECURE: false, SMTP_USER: undefined, SMTP_PASS: undefined });
    s = await addGrowingSketch(tdb.db, SKETCH);
    const [kai, noa] = await tdb.db('users')
      .insert([
        { login: 'kai', name: 'Kai Marsh', email: 'kai@larkfield.test', role: 'responder' },
        { login: 'noa', name: 'Noa Pell', email: 'noa@larkfield.test', role: 'viewer' },
      ])
      .returning('id');
    await tdb.db('team_members').insert([
      { team_id: s.teamId, user_id: kai.id, wants_alert_mail: true },
      { team_id: s.teamId, user_id: noa.id, wants_alert_mail: false },
    ]);

    const settings = alertTestSettings(tdb.url); // shipped defaults: escalation 30 min, settling 15 min, band 0.05
    const send = () => drainOutbox(tdb.db, transport, clock, { from: settings.from, retryBaseMs: settings.retryBaseMs, retryMaxMs: settings.retryMaxMs });
    // 50,000 + 2,000 every 10 minutes: watch at 88,000 (09:10), brimmed at 110,000 (11:00).
    for (let i = 0; i <= 33; i++) {
      clock.set(at(10 * i));
      await observe(tdb.db, s, at(10 * i), 50_000 + 2_000 * i, clock, settings);
      await send();
    }
    // 11:40 the service is redeployed with the width the plan proposed: the load falls far below the line.
    s = { ...s, width: 884_461 };
    for (const minutes of [340, 350, 355, 365]) {
      clock.set(at(minutes));
      await observe(tdb.db, s, at(minutes), 118_000, clock, settings);
      await send();
    }
    inbox = await fake.inbox();
  });
  afterAll(async () => {
    transport?.close();
    await fake?.discard();
    await tdb?.drop();
  });

  it('when the load grows past the watch line and the capacity, is left unacknowledged, and resolves, then exactly one e-mail per transition arrives', () => {
    expect(inbox.map((m) => m.subject)).toEqual([
      '[Brimwatch] watch · checkout / per-card-limiter · 81 %',
      '[Brimwatch] brimmed · checkout / per-card-limiter · 101 %',
      '[Brimwatch] brimmed, unacknowledged · checkout / per-card-limiter · 107 %',
      '[Brimwatch] resolved · checkout / per-card-limiter · < 1 %',
    ]);
    expect(new Set(inbox.map((m) => m.headers['message-id'])).size).toBe(4);
  });

  it("when mail goes out, then the team's alert address and the members who asked get it, and the escalation address only once escalated", () => {
    const to = inbox.map((m) => m.to.map((r) => r.address).sort());
    expect(to[0]).toEqual(['kai@larkfield.test', 'payments-alerts@larkfield.test']);
    expect(to[1]).toEqual(['kai@larkfield.test', 'payments-alerts@larkfield.test']);
    expect(to[2]).toEqual(['kai@larkfield.test', 'payments-alerts@larkfield.test', 'payments-oncall@larkfield.test']);
  });

  it('when the sketch brims, then the e-mail carries the figures of the maths module and of a hand computation', async () => {
    const mail = inbox[1].text;
    const a = assess({ width: 2719, depth: 5, errorBudget: 100, confidence: 0.99, streamTotal: 110_000 });
    expect(a.capacity).toBeCloseTo(HAND_CAPACITY, 1);
    // load 110,000 / 108,245.34 = 1.0162; bound 110,000 / (2719 · 10^(−0.4)) = 101.62; risk (110,000 / 271,900)^5 = 1.084 × 10⁻² (hand computation).
    expect(a.load).toBeCloseTo(1.0162, 4);
    expect(a.boundNow).toBeCloseTo(101.62, 2);
    expect(a.missRisk).toBeCloseTo(0.010837, 6);
    expect(mail).toContain('101 % of capacity (stream total 110,000, capacity 108,245)');
    expect(mail).toContain('102 vs error budget 100, at 99 % confidence');
    expect(mail).toContain('1.1 × 10⁻² per queried key');
    expect(mail).toMatch(/Brim date\s+reached 2026-12-01 1[01]:\d\d UTC/);

    // The trend is exactly 2,000 per 600 s; in 90 days: 110,000 + (2,000/600) · 7,776,000 = 26,030,000, with 25 % headroom
    // 32,537,500; m = ⌈e · 32,537,500 / 100⌉ = 884,461, k stays 5; memory 884,461 · 5 · 4 = 17,689,220 bytes (hand computation).
    const plan = resizePlan({ width: 2719, depth: 5, counterBytes: 4, errorBudget: 100, confidence: 0.99, forecastTotal: 26_030_000, headroom: 1.25, horizonDays: 90 });
    expect(plan).toMatchObject({ width: 884_461, depth: 5, memoryBytes: 17_689_220, memoryBytesBefore: 54_380 });
    expect(mail).toContain('width 884,461 × depth 5 (now 2,719 × 5)');
    expect(mail).toContain('53.1 KiB → 16.9 MiB (+16.8 MiB) per instance');
    expect(mail).toContain(plan.reason);
  });

  it('when the watch e-mail goes, then it gives the brim date the forecast projects', () => {
    // 88,000 at 09:10, 2,000 per 600 s: capacity is reached (108,245.34 − 88,000) / (2,000/600) = 6,073.6 s later, 10:51 (hand computation).
    expect(inbox[0].text).toContain('81 % of capacity (stream total 88,000, capacity 108,245)');
    // A steady trend gives Sen's interval no spread: earliest and latest are the brim date itself.
    expect(inbox[0].text).toMatch(/Brim date\s+2026-12-01 10:51 UTC \(the trend's range agrees to the minute\)/);
  });

  it('when an alert e-mail is read, then it links the sketch page, says how to acknowledge, and carries the caution line', async () => {
    const alert = await tdb.db('alerts').where({ sketch_id: s.sketchId }).first('id');
    for (const part of [inbox[1].text, inbox[1].html]) {
      expect(part).toContain(`http://brimwatch.larkfield.test/sketches/${s.sketchId}`);
      expect(part).toContain(`http://brimwatch.larkfield.test/api/v1/alerts/${alert.id}/acknowledge`);
    }
    expect(inbox[1].text).toContain("Brimwatch's figures guide sizing; the service's own tests and load tests decide.");
    expect(inbox[1].html).toContain('Brimwatch&#39;s figures guide sizing; the service&#39;s own tests and load tests decide.');
    expect(inbox[1].html).toContain('● brimmed');
    expect(inbox[1].html).not.toMatch(/<img|<link|@import|url\(|src=/i);
  });

  it('when the alert has run its course, then its timeline holds every transition and notice, each audited', async () => {
    const events = await tdb.db('alert_events').where({ sketch_id: s.sketchId }).orderBy('id').select('kind', 'level', 'mail_id');
    expect(events.map((e) => `${e.kind}:${e.level}`)).toEqual([
      'opened:watch', 'notified:watch', 'level_changed:brimmed', 'notified:brimmed', 'escalated:brimmed', 'notified:brimmed', 'resolved:brimmed', 'notified:brimmed',
    ]);
    expect(events.filter((e) => e.kind === 'notified').every((e) => e.mail_id !== null)).toBe(true);
    const audited = await tdb.db('audit_log').where({ subject_type: 'alert' }).orderBy('id').pluck('action');
    expect(audited).toEqual(events.map((e) => `alert.${e.kind}`));
    const rows = await tdb.db('mail_outbox').orderBy('id').select('attempts', 'sent_at', 'smtp_message_id');
    expect(rows).toHaveLength(4);
    expect(rows.every((r) => r.attempts === 1 && r.sent_at !== null && /^<outbox-\d+@brimwatch\.test>$/.test(r.smtp_message_id))).toBe(true);
  });
});
