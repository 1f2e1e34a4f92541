import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { queueDigests } from '../../../backend/src/alerts/digest';
import { seed as seedTeams } from '../../../seeds/01_teams_and_services';
import { createTestDatabase, type TestDatabase } from '../../setup/database';
import { addSketch } from '../sketches/fixtures';
import { alertTestSettings, handClock } from './growing-sketch';

const NOW = new Date('2026-12-04T08:00:00Z');
const DAY = 86_400_000;

describe('the daily digest', () => {
  let tdb: TestDatabase;
  const clock = handClock(NOW);
  beforeAll(async () => {
    tdb = await createTestDatabase();
    await seedTeams(tdb.db);
    // Width 272, depth 5, budget 100 at 99 %: capacity 272 · 100 · 10^(−0.4) = 10,828.5 (hand computation, DESIGN.md's formula).
    await addSketch(tdb.db, { service: 'checkout', sketch: 'per-card-limiter', team: 'payments', instances: [{ instance: 'a', streamTotal: 11_500 }, { instance: 'b', streamTotal: 11_500 }] });
    await addSketch(tdb.db, { service: 'checkout', sketch: 'basket-dedupe', team: 'payments', instances: [{ instance: 'a', streamTotal: 5_000, brimAt: new Date(NOW.getTime() + 10 * DAY) }] });
    await addSketch(tdb.db, { service: 'ads-ranking', sketch: 'ad-frequency-cap', team: 'ads', instances: [{ instance: 'a', streamTotal: 9_000, width: 300 }] });
  });
  afterAll(() => tdb.drop());

  it('when the digest runs, then each team with sketches gets one, through the outbox, and a second run the same day adds none', async () => {
    expect(await queueDigests(tdb.db, clock, alertTestSettings(tdb.url))).toBe(2);
    expect(await queueDigests(tdb.db, clock, alertTestSettings(tdb.url))).toBe(0);
    const rows = await tdb.db('mail_outbox').orderBy('id').select('kind', 'recipients', 'subject', 'sent_at');
    expect(rows.map((r) => [r.kind, r.recipients, r.sent_at])).toEqual([
      ['digest', ['ads-alerts@larkfield.test'], null],
      ['digest', ['payments-alerts@larkfield.test'], null],
    ]);
    clock.set(new Date(NOW.getTime() + DAY));
    expect(await queueDigests(tdb.db, clock, alertTestSettings(tdb.url))).toBe(2);
  });

  it("when the team has sketches on watch or worse and a brim date within 30 days, then the digest lists them with their resize and the memory figures", async () => {
    const mail = await tdb.db('mail_outbox').where({ kind: 'digest' }).where('subject', 'like', '%Payments · 2026-12-04%').first('subject', 'text_body', 'html_body');
    expect(mail.subject).toBe('[Brimwatch] digest · Payments · 2026-12-04 · 1 on watch or worse, 1 brim within 30 days');
    const text: string = mail.text_body;
    // per-card-limiter at 11,500 has no trend, so its plan is sized for 11,500 · 1.25 = 14,375: m = ⌈e · 14,375 / 100⌉ = 391, k = 5;
    // 391 · 5 · 4 = 7,820 bytes against 5,440 now, +2,380 per instance, +4,760 over its 2 instances = 4.65 KiB (hand computation).
    expect(text).toMatch(/● brimmed\s+checkout \/ per-card-limiter\s+106 %\s+—\s+391 × 5 \(\+4\.65 KiB\)/);
    expect(text).toMatch(/checkout \/ basket-dedupe\s+2026-12-14 08:00 UTC/);
    // Memory: payments 3 instances · 5,440 bytes = 16,320 = 15.9 KiB; the fleet adds ads' 300 · 5 · 4 = 6,000: 22,320 = 21.8 KiB.
    expect(text).toMatch(/Payments now\s+15\.9 KiB across 2 sketches/);
    expect(text).toMatch(/Proposed resizes add\s+\+4\.65 KiB/);
    expect(text).toMatch(/Whole fleet now\s+21\.8 KiB across 3 sketches/);
    expect(text).toContain('http://brimwatch.larkfield.test/fleet?team=payments');
    expect(mail.html_body).toContain('391 × 5 (+4.65 KiB)');
  });

  it('when a team has only clear sketches with no brim date near, then its digest says so', async () => {
    const mail = await tdb.db('mail_outbox').where('subject', 'like', '%Ads Ranking · 2026-12-04%').first('subject', 'text_body');
    // 9,000 against 300 · 100 · 10^(−0.4) = 11,943: a load of 75 %, below the watch line (hand computation).
    expect(mail.subject).toBe('[Brimwatch] digest · Ads Ranking · 2026-12-04 · 0 on watch or worse, 0 brim within 30 days');
    expect(mail.text_body).toContain('None: every sketch of the team is clear.');
    expect(mail.text_body).toContain('None of the team’s sketches is forecast to brim within 30 days.');
  });
});
