import { describe, expect, it } from 'vitest';
import type { SketchTimeline } from '@brimwatch/api-types';
import { alertMarks, barPieces, formatDuration, timelineSummary } from '@/components/history/history-bars';
import { apiQuery, choiceFromQuery, queryFromChoice } from '@/components/history/history-query';

const T = (minute: number) => new Date(Date.UTC(2026, 10, 30, 0, minute)).toISOString();

describe('history bars', () => {
  it('when spans cover a period, then each becomes a piece in percent of it, and time without readings stays a gap', () => {
    const pieces = barPieces(
      [
        { from: T(0), to: T(15), level: 'clear' },
        { from: T(15), to: T(30), level: null },
        { from: T(30), to: T(60), level: 'brimmed' },
      ],
      T(0),
      T(60),
    );
    expect(pieces.map(({ left, width, level }) => ({ left, width, level }))).toEqual([
      { left: 0, width: 25, level: 'clear' },
      { left: 50, width: 50, level: 'brimmed' },
    ]);
    expect(pieces[1].title).toMatch(/^brimmed for 30 min, /);
  });

  it('when alerts fall in the period, then their marks sit at their time and say who did what', () => {
    const marks = alertMarks([{ at: T(45), alertId: 1, kind: 'acknowledged', level: 'brimmed', actor: 'responder', note: 'load test' }], T(0), T(60));
    expect(marks).toEqual([{ left: 75, kind: 'acknowledged', title: expect.stringMatching(/^Alert acknowledged \(brimmed\) by responder, .*: load test$/) }]);
  });

  it.each([
    [0, '0'],
    [42, '42 s'],
    [720, '12 min'],
    [3600, '1 h'],
    [12_000, '3 h 20 min'],
    [187_200, '2 d 4 h'],
  ])('when %i seconds are written, then they read %s', (seconds, text) => {
    expect(formatDuration(seconds)).toBe(text);
  });

  it('when a screen reader reads a bar, then it hears the time at each level, worst first, and the alert count', () => {
    const t = { service: 'checkout', sketch: 'per-card-limiter', alerts: [{}, {}], secondsAt: { clear: 1800, watch: 1080, brimmed: 600, stale: 0, unreachable: 120 } } as unknown as SketchTimeline;
    expect(timelineSummary(t)).toBe('checkout per-card-limiter: brimmed 10 min, unreachable 2 min, watch 18 min, clear 30 min, 2 alert events');
  });
});

describe('the History page address', () => {
  it('when filters are chosen, then they round-trip through the address bar, the default period left out', () => {
    const choice = { period: '30d' as const, from: '', to: '', teams: ['payments', 'edge'], services: [], page: 2 };
    expect(queryFromChoice(choice)).toEqual({ period: '30d', from: undefined, to: undefined, team: 'payments,edge', service: undefined, page: '2' });
    expect(choiceFromQuery({ period: '30d', team: 'payments,edge', page: '2' })).toEqual(choice);
    expect(choiceFromQuery({ period: 'forever', page: '-1' })).toMatchObject({ period: '7d', page: 1 });
  });

  it('when a preset is chosen, then the API is asked for that span ending now', () => {
    const now = new Date('2026-12-01T12:00:00Z');
    const asked = apiQuery(choiceFromQuery({ period: '24h', service: 'search' }), now, 25);
    expect(asked).toEqual({ query: { from: '2026-11-30T12:00:00.000Z', to: '2026-12-01T12:00:00.000Z', team: undefined, service: 'search', page: 1, pageSize: 25 } });
  });

  it('when a custom period is backwards or has no start, then the page says so instead of asking', () => {
    const now = new Date('2026-12-01T12:00:00Z');
    expect(apiQuery(choiceFromQuery({ period: 'custom' }), now, 25)).toEqual({ problem: 'Choose when the period starts.' });
    expect(apiQuery(choiceFromQuery({ period: 'custom', from: '2026-12-01T10:00', to: '2026-11-30T10:00' }), now, 25)).toEqual({ problem: 'The period must start before it ends.' });
  });
});
