import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { answerWith, HEALTHY, SIGNED_OUT } from './fake-server';
import { mountApp } from './mount';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

// Mounting the whole app compiles Quasar on first use; a busy machine needs more than the default 5 s.
describe('the app shell', { timeout: 20_000 }, () => {
  it('when it opens, then the rail lists the pages in the order of a working day', async () => {
    answerWith({ '/api/health': HEALTHY, '/api/auth/me': SIGNED_OUT });
    const { wrapper } = await mountApp('/fleet');
    const entries = wrapper.findAll('nav[aria-label="Pages"] a').map((a) => a.text());
    expect(entries).toEqual(['Fleet', 'Alerts', 'History', 'Planner', 'Uploads', 'Admin']);
    wrapper.unmount();
  });

  it('when nobody is signed in, then the top bar offers "Sign in" and shows the server as ok', async () => {
    const fetchMock = answerWith({ '/api/health': HEALTHY, '/api/auth/me': SIGNED_OUT });
    const { wrapper, router } = await mountApp('/fleet');
    expect(wrapper.find('.session__sign-in').text()).toBe('Sign in');
    expect(wrapper.find('[role="status"].health').text()).toContain('server ok');
    expect(wrapper.find('.health__shape').text()).toBe('◆');
    // Signing out is an answer for /api/auth/me: no detour to the sign-in page.
    expect(router.currentRoute.value.name).toBe('fleet');
    expect(fetchMock.mock.calls.map(([url]) => String(url))).toEqual(
      expect.arrayContaining(['/api/health', '/api/auth/me']),
    );
    wrapper.unmount();
  });

  it('when a user is signed in, then the top bar shows their name and role', async () => {
    const user = { id: 7, login: 'mira', name: 'Mira Okafor', email: 'mira@marketplace.test', role: 'sre', teams: [{ id: 1, slug: 'checkout', name: 'Checkout' }] };
    answerWith({ '/api/health': HEALTHY, '/api/auth/me': { status: 200, body: { user } } });
    const { wrapper } = await mountApp('/fleet');
    expect(wrapper.find('.session__name').text()).toBe('Mira Okafor');
    expect(wrapper.find('.session__role').text()).toBe('sre');
    expect(wrapper.find('.session__sign-in').exists()).toBe(false);
    wrapper.unmount();
  });

  it('when a signed-in user signs out, then the server is told and the top bar offers "Sign in" again', async () => {
    const user = { id: 7, login: 'mira', name: 'Mira Okafor', email: 'mira@marketplace.test', role: 'sre', teams: [] };
    const fetchMock = answerWith({
      '/api/health': HEALTHY,
      '/api/auth/me': { status: 200, body: { user } },
      '/api/auth/logout': { status: 204 },
    });
    const { wrapper, router } = await mountApp('/fleet');
    await wrapper.find('.session__sign-out').trigger('click');
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('sign-in'));
    expect(fetchMock).toHaveBeenCalledWith('/api/auth/logout', expect.objectContaining({ method: 'POST' }));
    expect(wrapper.find('.session__sign-in').exists()).toBe(true);
    wrapper.unmount();
  });

  it('when the database is down, then the health indicator says so with its reason and a shape', async () => {
    answerWith({
      '/api/health': { status: 503, body: { status: 'down', reason: 'database did not answer within 2 s' } },
      '/api/auth/me': SIGNED_OUT,
    });
    const { wrapper } = await mountApp('/fleet');
    const health = wrapper.find('.health');
    expect(health.text()).toContain('server down');
    expect(health.text()).toContain('database did not answer within 2 s');
    expect(wrapper.find('.health__shape').text()).toBe('▲');
    wrapper.unmount();
  });

  it('when the server has no sign-in route yet (404), then the user is treated as signed out', async () => {
    answerWith({ '/api/health': HEALTHY });
    const { wrapper } = await mountApp('/alerts');
    expect(wrapper.find('.session__sign-in').exists()).toBe(true);
    await flushPromises();
    wrapper.unmount();
  });

  it('when / is opened, then it lands on the Fleet page and the tab says so', async () => {
    const emptyFleet = {
      items: [],
      total: 0,
      page: 1,
      pageSize: 50,
      summary: { perLevel: {}, brimmingWithin7Days: 0, brimmingWithin30Days: 0, totalMemoryBytes: 0 },
    };
    answerWith({ '/api/health': HEALTHY, '/api/auth/me': SIGNED_OUT, '/api/v1/sketches': { status: 200, body: emptyFleet } });
    const { wrapper, router } = await mountApp('/');
    expect(router.currentRoute.value.name).toBe('fleet');
    expect(document.title).toBe('Fleet · Brimwatch');
    expect(wrapper.text()).toContain('No sketches registered yet — register one or start the demo fleet');
    wrapper.unmount();
  });
});
