import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, type DOMWrapper } from '@vue/test-utils';
import { answerWith, HEALTHY, type Answer } from '../fake-server';
import { useSessionStore } from '@/stores/session';
import { mountPage, type Mounted } from '../mount';

const SRE: Answer = {
  status: 200,
  body: { user: { id: 2, login: 'sre', name: 'Test SRE', email: 'sre@larkfield.test', role: 'sre', teams: [] } },
};
const TEAMS: Answer = { status: 200, body: { teams: [{ id: 1, slug: 'payments', name: 'Payments' }] } };

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

/** The page without the shell: the session is asked for here, as App.vue does on start. */
async function openForm(): Promise<Mounted> {
  const mounted = await mountPage('/sketches/new');
  await useSessionStore().refresh();
  await flushPromises();
  return mounted;
}

async function type(mounted: Mounted, id: string, text: string): Promise<void> {
  await (mounted.wrapper.find(`#${id}`) as DOMWrapper<HTMLInputElement>).setValue(text);
}

function messageBeside(mounted: Mounted, id: string): string {
  return mounted.wrapper.find(`#${id}`).element.closest('.q-field')?.querySelector('.q-field__messages')?.textContent?.trim() ?? '';
}

async function fillAndSubmit(mounted: Mounted, targetUrl: string): Promise<void> {
  await type(mounted, 'sketch-service', 'checkout');
  await type(mounted, 'sketch-label', 'card-velocity');
  await type(mounted, 'sketch-target-url', targetUrl);
  await type(mounted, 'sketch-errorBudget', '500');
  await mounted.wrapper.find('form').trigger('submit');
  await flushPromises();
  await new Promise((resolve) => setTimeout(resolve, 50));
  await flushPromises();
}

/** The POSTs made, as (url, init): the fake's own signature names only the url. */
const posts = (fetchMock: ReturnType<typeof answerWith>) =>
  (fetchMock.mock.calls as unknown as [string, RequestInit | undefined][]).filter(([, init]) => init?.method === 'POST');

// The first mount of a file loads Quasar and the page, which takes seconds on a busy machine.
describe('the register form', { timeout: 20_000 }, () => {
  it('when the address is not an http address, then the form says why beside it and sends nothing', async () => {
    const fetchMock = answerWith({ '/api/health': HEALTHY, '/api/auth/me': SRE, '/api/v1/teams': TEAMS });
    const mounted = await openForm();
    await fillAndSubmit(mounted, 'ftp://10.0.4.7/metrics');
    expect(messageBeside(mounted, 'sketch-target-url')).toMatch(/^targetUrl must be the http:\/\/ or https:\/\/ address/);
    expect(posts(fetchMock)).toEqual([]);
    mounted.wrapper.unmount();
  });

  it('when the server refuses the address, then its message shows beside the address field', async () => {
    const refusal = 'targetUrl is not allowed: address 10.0.4.7 is outside TARGET_ALLOWLIST (127.0.0.0/8); ask an admin to add its network or host name.';
    const fetchMock = answerWith({
      '/api/health': HEALTHY,
      '/api/auth/me': SRE,
      '/api/v1/teams': TEAMS,
      '/api/v1/sketches': { status: 400, body: { error: { code: 'target_not_allowed', message: refusal, field: 'targetUrl' } } },
    });
    const mounted = await openForm();
    await mounted.wrapper.findComponent({ name: 'QSelect' }).vm.$emit('update:modelValue', 'payments');
    await fillAndSubmit(mounted, 'http://10.0.4.7:9100/metrics');
    expect(posts(fetchMock)).toHaveLength(1);
    expect(JSON.parse(String(posts(fetchMock)[0][1]?.body))).toMatchObject({ team: 'payments', targetUrl: 'http://10.0.4.7:9100/metrics', errorBudget: 500 });
    expect(messageBeside(mounted, 'sketch-target-url')).toBe(refusal);
    mounted.wrapper.unmount();
  });

  it('when the server names a field the form does not show, then the message still shows above the buttons', async () => {
    answerWith({
      '/api/health': HEALTHY,
      '/api/auth/me': SRE,
      '/api/v1/teams': TEAMS,
      '/api/v1/sketches': { status: 409, body: { error: { code: 'conflict', message: 'Something about instances.', field: 'instances' } } },
    });
    const mounted = await openForm();
    await mounted.wrapper.findComponent({ name: 'QSelect' }).vm.$emit('update:modelValue', 'payments');
    await fillAndSubmit(mounted, 'http://127.0.0.1:9100/metrics');
    expect(mounted.wrapper.find('.sketch-form__error').text()).toBe('Something about instances.');
    mounted.wrapper.unmount();
  });
});
