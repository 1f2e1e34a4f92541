import { describe, expect, it } from 'vitest';
import { alertSubject, composeAlertMail, type AlertMailInput } from '../../../backend/src/alerts/email/alert-email';
import type { AlertFacts } from '../../../backend/src/alerts/email/alert-facts';
import { formatLoad, formatRisk } from '../../../backend/src/alerts/email/figures';
import { messageIdOf, retryDelayMs } from '../../../backend/src/alerts/outbox-sender';

const T = new Date('2026-12-01T12:00:00Z');
const facts = (over: Partial<AlertFacts> = {}): AlertFacts => ({
  id: 7, service: 'checkout', sketch: 'per-card-limiter', teamName: 'Payments', errorBudget: 100, confidence: 0.99, watchLine: 0.8, level: 'watch',
  load: 0.86, capacity: 108_245.34, boundNow: 86, missRisk: 0.0047, streamTotal: 93_000, brimDate: '2026-12-09T06:00:00Z',
  brimEarliest: '2026-12-07T06:00:00Z', brimLatest: '2026-12-12T06:00:00Z', trend: 'rising', trendReason: null, width: 2719, depth: 5,
  counterBytes: 4, memoryBytes: 54_380, lastError: null, lastOkAt: '2026-12-01T11:59:30Z', resizePlan: null, instanceCount: 2, ...over,
});
const input = (over: Partial<AlertMailInput> = {}): AlertMailInput => ({
  alert: { id: 3, level: 'watch', state: 'open', openedAt: T, levelSince: T, clearSince: null, resolvedAt: null },
  kind: 'opened', escalate: false, facts: facts(), publicUrl: 'http://brimwatch.larkfield.test', now: T, ...over,
});

describe('the alert e-mail', () => {
  it('when the forecast has a spread, then the brim date shows its range', () => {
    expect(composeAlertMail(input()).text).toMatch(/Brim date\s+2026-12-09 06:00 UTC \(between 2026-12-07 06:00 UTC and 2026-12-12 06:00 UTC\)/);
  });

  it('when the trend is flat, then the brim date says there is no trend and why', () => {
    const text = composeAlertMail(input({ facts: facts({ brimDate: null, brimEarliest: null, brimLatest: null, trend: 'none', trendReason: 'only 3 readings since the last reset' }) })).text;
    expect(text).toMatch(/Brim date\s+no trend: only 3 readings since the last reset/);
  });

  it('when the level is unreachable, then the subject says scrapes fail and the body gives the last error', () => {
    const mail = composeAlertMail(input({ alert: { ...input().alert, level: 'unreachable' }, facts: facts({ level: 'unreachable', lastError: 'timed out after 5 s' }) }));
    expect(mail.subject).toBe('[Brimwatch] unreachable · checkout / per-card-limiter · scrapes failing');
    expect(mail.text).toMatch(/Last error\s+timed out after 5 s/);
  });

  it('when subjects are made for each kind of notice, then the level leads and reminders, escalations and resolutions say so', () => {
    const brimmed = { ...input().alert, level: 'brimmed' as const };
    expect(alertSubject(input({ kind: 'repeat' }))).toBe('[Brimwatch] watch · checkout / per-card-limiter · 86 % · reminder');
    expect(alertSubject(input({ kind: 'escalated', escalate: true, alert: brimmed, facts: facts({ load: 1.04 }) }))).toBe('[Brimwatch] brimmed, unacknowledged · checkout / per-card-limiter · 104 %');
    expect(alertSubject(input({ kind: 'resolved', alert: { ...input().alert, state: 'resolved' }, facts: facts({ load: 0.42 }) }))).toBe('[Brimwatch] resolved · checkout / per-card-limiter · 42 %');
  });

  it('when a name carries markup, then the HTML part escapes it', () => {
    const html = composeAlertMail(input({ facts: facts({ sketch: '<b>limiter</b>' }) })).html;
    expect(html).toContain('&lt;b&gt;limiter&lt;/b&gt;');
    expect(html).not.toContain('<b>limiter</b>');
  });

  it('when the alert resolved, then there is no resize plan and no acknowledge instruction', () => {
    const text = composeAlertMail(input({ kind: 'resolved', alert: { ...input().alert, state: 'resolved', clearSince: T, resolvedAt: T } })).text;
    expect(text).not.toContain('RESIZE PLAN');
    expect(text).not.toContain('acknowledge');
    expect(text).toContain('Resolved at 2026-12-01 12:00 UTC');
  });
});

describe('mail figures', () => {
  it('when a risk is small, then it reads as mantissa × power of ten (LOOK.md)', () => {
    // 2.9e-4 written out by hand: 2.9 × 10⁻⁴.
    expect(formatRisk(0.00029)).toBe('2.9 × 10⁻⁴');
    expect(formatRisk(0.0108)).toBe('1.1 × 10⁻²');
    expect(formatRisk(0.35)).toBe('0.35');
    expect(formatRisk(null)).toMatch(/^no guarantee/);
  });

  it('when a load is just under a whole percent, then it rounds down, so 100 % appears only once brimmed', () => {
    expect(formatLoad(0.99999)).toBe('99 %');
    expect(formatLoad(1)).toBe('100 %');
    expect(formatLoad(0.004)).toBe('< 1 %');
  });
});

describe('the outbox sender', () => {
  it('when attempts fail in a row, then the wait doubles from the base up to the cap', () => {
    expect([1, 2, 3, 4, 5, 6, 7].map((n) => retryDelayMs(n, 30_000, 1_800_000) / 1000)).toEqual([30, 60, 120, 240, 480, 960, 1800]);
  });

  it('when a row is sent again, then it carries the same Message-ID, on the sender\'s domain', () => {
    expect(messageIdOf(42, 'Brimwatch <brimwatch@larkfield.test>')).toBe('<outbox-42@larkfield.test>');
    expect(messageIdOf(42, 'Brimwatch <brimwatch@larkfield.test>')).toBe(messageIdOf(42, 'Brimwatch <brimwatch@larkfield.test>'));
  });
});
