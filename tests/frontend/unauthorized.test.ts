import { afterEach, describe, expect, it, vi } from 'vitest';
import { get, ApiError } from '@/api/client';
import { useSessionStore } from '@/stores/session';
import { answerWith, HEALTHY, SIGNED_OUT } from './fake-server';
import { mountPage } from './mount';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

// Mounting the whole app compiles Quasar on first use; a busy machine needs more than the default 5 s.
describe('a 401 from the server', { timeout: 20_000 }, () => {
  it('when a data request answers 401, then the router goes to sign-in, remembering the page', async () => {
    answerWith({ '/api/health': HEALTHY, '/api/fleet': SIGNED_OUT });
    const { wrapper, router } = await mountPage('/alerts');
    const failure = await get('/api/fleet').catch((error: unknown) => error);
    expect(failure).toBeInstanceOf(ApiError);
    expect(failure).toMatchObject({ status: 401, code: 'unauthenticated', message: 'Sign in first.' });
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('sign-in'));
    expect(router.currentRoute.value.query.next).toBe('/alerts');
    expect(useSessionStore().state).toBe('anonymous');
    wrapper.unmount();
  });

  it('when the sign-in page shows, then its button leads to the server\'s sign-in and back to the page wanted', async () => {
    answerWith({ '/api/health': HEALTHY, '/api/auth/me': SIGNED_OUT });
    const { wrapper } = await mountPage('/sign-in?next=/alerts');
    const button = wrapper.find('a.q-btn');
    expect(button.text()).toBe('Sign in');
    expect(button.attributes('href')).toBe('/api/auth/login?returnTo=%2Falerts');
    expect(document.title).toBe('Sign in · Brimwatch');
    wrapper.unmount();
  });

  it('when the server sends back a sign-in problem, then the page shows it', async () => {
    answerWith({ '/api/health': HEALTHY, '/api/auth/me': SIGNED_OUT });
    const { wrapper } = await mountPage('/sign-in?problem=This%20sign-in%20attempt%20has%20expired');
    expect(wrapper.find('[role="alert"]').text()).toBe('This sign-in attempt has expired');
    wrapper.unmount();
  });
});

describe('an error body from the server', () => {
  it('when the server names a field, then the ApiError carries code, message and field', async () => {
    answerWith({
      '/api/v1/sizing/plan': {
        status: 400,
        body: { error: { code: 'bad_input', message: 'confidence must be below 1', field: 'confidence' } },
      },
    });
    const failure = await get('/api/v1/sizing/plan').catch((error: unknown) => error);
    expect(failure).toMatchObject({ status: 400, code: 'bad_input', field: 'confidence', message: 'confidence must be below 1' });
  });

  it('when the body is not the usual shape, then the error still explains itself', async () => {
    answerWith({ '/api/odd': { status: 502, body: { nope: true } } });
    const failure = await get('/api/odd').catch((error: unknown) => error);
    expect(failure).toMatchObject({ status: 502, code: 'http_502' });
    expect((failure as ApiError).message).toMatch(/502/);
  });
});
