import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount, type DOMWrapper } from '@vue/test-utils';
import { Quasar, QSelect } from 'quasar';
import FleetFilters from '@/components/fleet/FleetFilters.vue';
import { DEFAULT_FILTERS, filtersFromQuery, queryFromFilters } from '@/components/fleet/fleet-query';
import { answerWith, HEALTHY, SIGNED_OUT } from '../fake-server';
import { mountPage } from '../mount';
import { fleetItem, fleetPage } from './fleet-answers';

let fetchMock: ReturnType<typeof answerWith>;

beforeEach(() => {
  fetchMock = answerWith({
    '/api/health': HEALTHY,
    '/api/auth/me': SIGNED_OUT,
    '/api/v1/teams': { status: 200, body: { teams: [{ id: 1, slug: 'payments', name: 'Payments' }] } },
    '/api/v1/sketches': { status: 200, body: fleetPage([fleetItem()]) },
  });
});

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

/** The query of the latest fleet request that was not the service-name lookup. */
function lastFleetQuery(): URLSearchParams {
  const asked = fetchMock.mock.calls.map(([url]) => String(url)).filter((url) => url.startsWith('/api/v1/sketches?') && !url.includes('pageSize=500'));
  return new URLSearchParams(asked.at(-1)?.split('?')[1]);
}

// The first mount of a file loads Quasar and the page, which takes seconds on a busy machine.
describe('the fleet filters and the address bar', { timeout: 20_000 }, () => {
  it('when the fleet has no filters, then the address stays plain', () => {
    expect(queryFromFilters(DEFAULT_FILTERS)).toEqual({});
  });

  it('when filters are written to the address and read back, then they come back the same', () => {
    const filters = { ...DEFAULT_FILTERS, teams: ['payments', 'edge'], levels: ['brimmed' as const, 'watch' as const], q: 'card', sort: 'load' as const, descending: false, page: 3, pageSize: 100 };
    expect(filtersFromQuery(queryFromFilters(filters) as Record<string, string>)).toEqual({ ...filters, services: [] });
  });

  it('when the address carries an unknown level, sort or page size, then those fall back to the defaults', () => {
    const filters = filtersFromQuery({ level: 'brimmed,overflowing', sort: 'colour', pageSize: '7', page: '-2' });
    expect(filters.levels).toEqual(['brimmed']);
    expect(filters.sort).toBe('level');
    expect(filters.descending).toBe(true);
    expect(filters.pageSize).toBe(50);
    expect(filters.page).toBe(1);
  });

  it('when the page opens with filters in its address, then the server is asked for exactly those', async () => {
    const mounted = await mountPage('/fleet?level=watch,brimmed&team=payments&q=card&sort=load&order=asc&page=2');
    const query = lastFleetQuery();
    expect(query.get('level')).toBe('watch,brimmed');
    expect(query.get('team')).toBe('payments');
    expect(query.get('q')).toBe('card');
    expect(query.get('sort')).toBe('load');
    expect(query.get('order')).toBe('asc');
    expect(query.get('page')).toBe('2');
    expect((mounted.wrapper.find('#fleet-search').element as HTMLInputElement).value).toBe('card');
    mounted.wrapper.unmount();
  });

  it('when a level is chosen in the summary strip, then the address gains it, the first page shows and the server is asked again', async () => {
    const mounted = await mountPage('/fleet?page=3');
    const watch = mounted.wrapper.findAll('.fleet-summary__level').find((b) => b.text().includes('watch'));
    await watch!.trigger('click');
    await flushPromises();
    expect(mounted.router.currentRoute.value.query).toEqual({ level: 'watch' });
    expect(lastFleetQuery().get('level')).toBe('watch');
    expect(lastFleetQuery().get('page')).toBe('1');
    mounted.wrapper.unmount();
  });

  it('when a search is typed, then after a short pause the address and the request carry it', async () => {
    const mounted = await mountPage('/fleet?level=watch');
    await (mounted.wrapper.find('#fleet-search') as DOMWrapper<HTMLInputElement>).setValue('velocity');
    await new Promise((resolve) => setTimeout(resolve, 400));
    await flushPromises();
    expect(mounted.router.currentRoute.value.query).toEqual({ level: 'watch', q: 'velocity' });
    expect(lastFleetQuery().get('q')).toBe('velocity');
    mounted.wrapper.unmount();
  });

  it('when the fleet answers, then each row shows its level word, links to its sketch and prints figures in Brimwatch\'s way', async () => {
    const mounted = await mountPage('/fleet');
    const row = mounted.wrapper.find('.fleet-table tbody tr');
    expect(row.find('.level-badge').text()).toContain('watch');
    expect(row.find('a').attributes('href')).toBe('/sketches/7');
    // 0.865 floors to 86 % (format.ts); 0.0048 reads 4.8 × 10⁻³; 865 of a budget of 1 000, thin-space grouped.
    expect(row.text()).toContain('86\u202F%');
    expect(row.text()).toContain('4.8 × 10⁻³');
    expect(row.text()).toContain('865 / 1\u2009000');
    mounted.wrapper.unmount();
  });

  it('when 15 seconds pass, then the same filters are asked for again and the table stays on screen meanwhile', async () => {
    vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval'] });
    try {
      const mounted = await mountPage('/fleet?level=watch&q=card&sort=missRisk');
      const before = fetchMock.mock.calls.length;
      vi.advanceTimersByTime(15_000);
      expect(mounted.wrapper.find('.fleet-table tbody tr').exists()).toBe(true);
      await flushPromises();
      expect(fetchMock.mock.calls.length).toBe(before + 1);
      expect(Object.fromEntries(lastFleetQuery())).toMatchObject({ level: 'watch', q: 'card', sort: 'missRisk' });
      expect(mounted.router.currentRoute.value.query).toEqual({ level: 'watch', q: 'card', sort: 'missRisk' });
      mounted.wrapper.unmount();
    } finally {
      vi.useRealTimers();
    }
  });
});

describe('the fleet filter dropdowns', () => {
  it('when a team, a service or a level is chosen, then the change names that list alone, and only services take a typed name', () => {
    const teams = [{ id: 1, slug: 'payments', name: 'Payments' }];
    const wrapper = mount(FleetFilters, { props: { filters: DEFAULT_FILTERS, teams, services: ['checkout'] }, global: { plugins: [Quasar] } });
    const selects = wrapper.findAllComponents(QSelect);
    expect(selects.map((s) => [s.props('label'), s.props('for')])).toEqual([
      ['Team', 'fleet-team'],
      ['Service', 'fleet-service'],
      ['Level', 'fleet-level'],
    ]);
    expect(selects[0].props('options')).toEqual([{ label: 'Payments', value: 'payments' }]);
    expect(selects[1].props('options')).toEqual(['checkout']);
    expect((selects[2].props('options') as { value: string }[]).map((o) => o.value)).toEqual(['brimmed', 'unreachable', 'stale', 'watch', 'clear']);
    expect(selects.map((s) => [s.props('emitValue'), s.props('mapOptions'), s.props('useInput'), s.props('newValueMode') ?? null])).toEqual([
      [true, true, false, null],
      [false, false, true, 'add-unique'],
      [true, true, false, null],
    ]);
    selects[0].vm.$emit('update:modelValue', ['payments']);
    selects[1].vm.$emit('update:modelValue', null);
    selects[2].vm.$emit('update:modelValue', ['watch']);
    expect(wrapper.emitted('change')).toEqual([[{ teams: ['payments'] }], [{ services: [] }], [{ levels: ['watch'] }]]);
    wrapper.unmount();
  });
});
