import { flushPromises } from '@vue/test-utils';
import { QSelect } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { SessionUser } from '@/api/auth';
import { useSessionStore } from '@/stores/session';
import { mountPage } from '../mount';
import { adminServer, DISCOVERY, PAYMENTS, person } from './admin-fake';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

async function openAdminAs(user: ReturnType<typeof person>) {
  const mounted = await mountPage('/admin');
  useSessionStore().user = user as SessionUser;
  await flushPromises();
  await flushPromises();
  return mounted;
}

const TOKEN = { id: 9, label: 'deploy pipeline', prefix: 'bwt_Ab12Cd', role: 'viewer', createdAt: '2026-12-01T00:00:00Z', expiresAt: '2099-01-01T00:00:00Z', lastUsedAt: null, revokedAt: null, userId: 1, userLogin: 'viewer' };

describe('the Admin page', { timeout: 20_000 }, () => {
  it('when a viewer opens it, then only their tokens and the teams show, and the addresses cannot be edited', async () => {
    adminServer({ 'GET /api/v1/teams': { status: 200, body: { teams: [PAYMENTS] } }, 'GET /api/v1/tokens': { status: 200, body: { tokens: [TOKEN] } } });
    const { wrapper } = await openAdminAs(person('viewer'));
    const headings = wrapper.findAll('h2').map((h) => h.text());
    expect(headings).toEqual(['Teams', 'API tokens']);
    expect(wrapper.find('input[name="alertEmail"]').attributes('readonly')).toBeDefined();
    expect(wrapper.text()).not.toContain('Save addresses');
    expect(wrapper.find('[data-token="9"]').text()).toContain('deploy pipeline');
    wrapper.unmount();
  });

  it('when an owner opens it, then the addresses of their own team are editable and another team\'s are not', async () => {
    const { sent } = adminServer({
      'GET /api/v1/teams': { status: 200, body: { teams: [PAYMENTS, DISCOVERY] } },
      'GET /api/v1/tokens': { status: 200, body: { tokens: [] } },
      'PATCH /api/v1/teams/1': { status: 200, body: { team: PAYMENTS } },
    });
    const { wrapper } = await openAdminAs(person('owner', [{ id: 1, slug: 'payments', name: 'Payments' }]));
    expect(wrapper.find('[data-team="discovery"] input[name="alertEmail"]').attributes('readonly')).toBeDefined();
    const own = wrapper.find('[data-team="payments"]');
    await own.find('input[name="escalationEmail"]').setValue('payments-oncall@larkfield.test');
    await own.find('form').trigger('submit');
    await flushPromises();
    expect(sent.find((s) => s.method === 'PATCH')).toMatchObject({ path: '/api/v1/teams/1', body: { alertEmail: 'payments-alerts@larkfield.test', escalationEmail: 'payments-oncall@larkfield.test' } });
    wrapper.unmount();
  });

  it('when a token is made, then its secret is shown once, and "Done" hides it for good', async () => {
    const secret = `bwt_${'x'.repeat(43)}`;
    const { sent } = adminServer({
      'GET /api/v1/teams': { status: 200, body: { teams: [] } },
      'GET /api/v1/tokens': { status: 200, body: { tokens: [] } },
      'POST /api/v1/tokens': { status: 201, body: { token: TOKEN, secret } },
    });
    const { wrapper } = await openAdminAs(person('viewer'));
    await wrapper.find('input[name="label"]').setValue('deploy pipeline');
    await wrapper.find('section[aria-labelledby="tokens-heading"] form').trigger('submit');
    await flushPromises();
    expect(sent.find((s) => s.method === 'POST')?.body).toEqual({ label: 'deploy pipeline', role: 'viewer', expiresInDays: 90 });
    expect(wrapper.find('.token-secret__value').text()).toBe(secret);
    const done = wrapper.findAll('.token-secret button').find((b) => b.text() === 'Done')!;
    await done.trigger('click');
    expect(wrapper.text()).not.toContain(secret);
    wrapper.unmount();
  });

  it('when the server refuses an empty label, then its message shows beside the field', async () => {
    adminServer({
      'GET /api/v1/teams': { status: 200, body: { teams: [] } },
      'GET /api/v1/tokens': { status: 200, body: { tokens: [] } },
      'POST /api/v1/tokens': { status: 400, body: { error: { code: 'invalid', field: 'label', message: 'label must not be empty: say what the token is for' } } },
    });
    const { wrapper } = await openAdminAs(person('viewer'));
    await wrapper.find('section[aria-labelledby="tokens-heading"] form').trigger('submit');
    await flushPromises();
    expect(wrapper.find('section[aria-labelledby="tokens-heading"]').text()).toContain('label must not be empty');
    wrapper.unmount();
  });

  it('when an admin changes a role, then the page asks the server and shows users, teams, tokens and the audit log', async () => {
    const users = [{ id: 3, login: 'responder', name: 'Kwame', email: null, role: 'responder', lastSignInAt: null, teams: [] }];
    const { sent } = adminServer({
      'GET /api/v1/users': { status: 200, body: { users } },
      'PATCH /api/v1/users/3': { status: 200, body: { user: { id: 3, login: 'responder', role: 'owner' } } },
      'GET /api/v1/teams': { status: 200, body: { teams: [] } },
      'GET /api/v1/tokens': { status: 200, body: { tokens: [] } },
      'GET /api/v1/audit': { status: 200, body: { entries: [{ id: 1, at: '2026-12-01T08:00:00Z', actor: 'admin', action: 'user.role_changed', subjectType: 'user', subjectId: '3', before: { role: 'viewer' }, after: { role: 'responder' } }], total: 1, page: 1, pageSize: 25 } },
    });
    const { wrapper } = await openAdminAs(person('admin'));
    expect(wrapper.findAll('h2').map((h) => h.text())).toEqual(['Users and roles', 'Teams', 'API tokens', 'Audit log']);
    expect(wrapper.find('section[aria-labelledby="audit-heading"]').text()).toContain('user.role_changed');
    wrapper.findComponent(QSelect).vm.$emit('update:model-value', 'owner');
    await flushPromises();
    expect(sent.find((s) => s.method === 'PATCH')).toMatchObject({ path: '/api/v1/users/3', body: { role: 'owner' } });
    wrapper.unmount();
  });

  it('when the audit filters are set, then the server is asked with them and a day range in the user\'s zone', async () => {
    const { sent } = adminServer({
      'GET /api/v1/users': { status: 200, body: { users: [] } },
      'GET /api/v1/teams': { status: 200, body: { teams: [] } },
      'GET /api/v1/tokens': { status: 200, body: { tokens: [] } },
      'GET /api/v1/audit': { status: 200, body: { entries: [], total: 0, page: 1, pageSize: 25 } },
    });
    const { wrapper } = await openAdminAs(person('admin'));
    const audit = wrapper.find('section[aria-labelledby="audit-heading"]');
    await audit.find('input[name="action"]').setValue('token.');
    await audit.find('input[name="from"]').setValue('2026-12-01');
    await audit.find('form').trigger('submit');
    await flushPromises();
    const query = new URLSearchParams(sent.filter((s) => s.path === '/api/v1/audit').at(-1)!.query);
    expect(query.get('action')).toBe('token.');
    expect(query.get('from')).toBe(new Date('2026-12-01T00:00:00').toISOString());
    expect(audit.text()).toContain('Nothing matches these filters.');
    wrapper.unmount();
  });
});
