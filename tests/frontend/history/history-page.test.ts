import { flushPromises } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { SessionUser } from '@/api/auth';
import { useSessionStore } from '@/stores/session';
import { mountPage } from '../mount';
import { person, standInServer } from '../uploads/stand-in-server';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const T = (minute: number) => new Date(Date.UTC(2026, 10, 30, 0, minute)).toISOString();

const HISTORY = {
  from: T(0),
  to: T(60),
  end: T(60),
  resolution: 'readings',
  page: 1,
  pageSize: 25,
  total: 1,
  sketches: [
    {
      id: 3,
      service: 'checkout',
      sketch: 'per-card-limiter',
      team: 'payments',
      teamName: 'Payments',
      spans: [
        { from: T(0), to: T(10), level: 'clear' },
        { from: T(10), to: T(30), level: 'watch' },
        { from: T(30), to: T(40), level: 'brimmed' },
        { from: T(40), to: T(60), level: 'clear' },
      ],
      alerts: [{ at: T(30), alertId: 1, kind: 'opened', level: 'brimmed', actor: 'system', note: null }],
      secondsAt: { clear: 1800, watch: 1200, brimmed: 600, stale: 0, unreachable: 0 },
    },
  ],
};

const SERVER = {
  'GET /api/v1/teams': { status: 200, body: { teams: [{ id: 1, slug: 'payments', name: 'Payments' }] } },
  'GET /api/v1/sketches': { status: 200, body: { items: [{ id: 3, service: 'checkout', sketch: 'per-card-limiter' }], total: 1 } },
};

async function open(path: string) {
  const mounted = await mountPage(path);
  useSessionStore().user = person('responder') as unknown as SessionUser;
  await flushPromises();
  await flushPromises();
  return mounted;
}

describe('the History page', { timeout: 20_000 }, () => {
  it('when it opens, then each sketch has a bar of its levels with alert marks, and its time in watch and brimmed', async () => {
    const { asked } = standInServer({ ...SERVER, 'GET /api/v1/history': { status: 200, body: HISTORY } });
    const { wrapper } = await open('/history?team=payments');
    expect(document.title).toBe('History · Brimwatch');
    expect(asked.find((a) => a.startsWith('GET /api/v1/history?'))).toMatch(/team=payments/);
    const bar = wrapper.find('.history-bar');
    expect(bar.findAll('.history-bar__piece').map((p) => p.classes().find((c) => c.startsWith('history-bar__piece--')))).toEqual([
      'history-bar__piece--clear',
      'history-bar__piece--watch',
      'history-bar__piece--brimmed',
      'history-bar__piece--clear',
    ]);
    expect(bar.attributes('aria-label')).toBe('checkout per-card-limiter: brimmed 10 min, watch 20 min, clear 30 min, 1 alert event');
    expect(bar.findAll('.history-bar__marker')).toHaveLength(1);
    expect(wrapper.find('[data-figure="watch"]').text()).toBe('20 min');
    expect(wrapper.find('[data-figure="brimmed"]').text()).toBe('10 min');
    wrapper.unmount();
  });

  it('when the export is offered, then it is a real download link to the CSV with the same filters', async () => {
    standInServer({ ...SERVER, 'GET /api/v1/history': { status: 200, body: HISTORY } });
    const { wrapper } = await open('/history?period=24h&service=checkout');
    const link = wrapper.findAll('a').find((a) => a.text() === 'Export CSV')!;
    expect(link.attributes('download')).toBeDefined();
    const href = new URL(link.attributes('href')!, 'http://brimwatch.test');
    expect(href.pathname).toBe('/api/v1/history.csv');
    expect(href.searchParams.get('service')).toBe('checkout');
    expect(Date.parse(href.searchParams.get('to')!) - Date.parse(href.searchParams.get('from')!)).toBe(24 * 3_600_000);
    wrapper.unmount();
  });

  it('when a filter matches nothing, then the empty state says how to widen it', async () => {
    standInServer({ ...SERVER, 'GET /api/v1/history': { status: 200, body: { ...HISTORY, total: 0, sketches: [] } } });
    const { wrapper } = await open('/history?service=nothing');
    expect(wrapper.text()).toContain('No sketch matches these filters');
    expect(wrapper.findAll('button').some((b) => b.text() === 'Clear the filters')).toBe(true);
    wrapper.unmount();
  });

  it('when the server fails, then the page says what happened and offers to try again', async () => {
    standInServer({ ...SERVER, 'GET /api/v1/history': { status: 400, body: { error: { code: 'invalid', message: 'from must be before to.' } } } });
    const { wrapper } = await open('/history');
    expect(wrapper.find('[role="alert"]').text()).toContain('The history could not be loaded: from must be before to.');
    wrapper.unmount();
  });
});
