import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { SessionUser } from '@/api/auth';
import type { Alert, AlertWithEvents } from '@brimwatch/api-types';
import AlertTimeline from '@/components/alerts/AlertTimeline.vue';
import { useSessionStore } from '@/stores/session';
import { adminServer, person } from '../admin/admin-fake';
import { mountPage } from '../mount';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const alert = (over: Partial<Alert>): Alert => ({
  id: 1, sketchId: 10, sketch: 'per-card-limiter', service: 'checkout', team: 'payments', teamName: 'Payments', state: 'open', level: 'watch',
  load: 0.83, openedAt: '2026-12-01T09:10:00Z', levelSince: '2026-12-01T09:10:00Z', clearSince: null, acknowledgedAt: null, acknowledgedBy: null,
  acknowledgeNote: null, resolvedAt: null, escalatedAt: null, lastNotifiedAt: '2026-12-01T09:10:00Z', lastNotifiedKind: 'opened', quietUntil: null, ...over,
});
const BRIMMED = alert({ id: 2, sketchId: 11, sketch: 'per-key-quota', service: 'api-gateway', team: 'edge', teamName: 'Edge Platform', level: 'brimmed', load: 1.04 });
const WATCH = alert({});
const QUIET = { id: 5, scope: 'team', sketchId: null, sketch: null, service: null, team: 'payments', teamName: 'Payments', startsAt: '2026-12-01T10:00:00Z', endsAt: '2026-12-01T12:00:00Z', reason: 'checkout load test', createdBy: 'kai', createdAt: '2026-12-01T09:59:00Z', cancelledAt: null, cancelledBy: null, status: 'in force' };

async function openAlertsAs(role: string) {
  const mounted = await mountPage('/alerts');
  useSessionStore().user = person(role) as SessionUser;
  await flushPromises();
  await flushPromises();
  return mounted;
}

const base = () => ({
  'GET /api/v1/alerts': { status: 200, body: { alerts: [BRIMMED, WATCH] } },
  'GET /api/v1/quiet-windows': { status: 200, body: { quietWindows: [QUIET] } },
  'GET /api/v1/teams': { status: 200, body: { teams: [{ id: 1, slug: 'payments', name: 'Payments' }] } },
});

describe('the Alerts page', { timeout: 20_000 }, () => {
  it('when a responder opens it, then live alerts show worst first with their level word and shape, and the quiet windows with who set them', async () => {
    adminServer(base());
    const { wrapper } = await openAlertsAs('responder');
    const rows = wrapper.findAll('tr[data-alert]');
    expect(rows.map((r) => r.find('.level-badge').text())).toEqual(['●brimmed', '◔watch']);
    expect(rows[0].text()).toContain('api-gateway / per-key-quota');
    expect(rows[0].text()).toContain('104');
    expect(wrapper.find('[data-quiet="5"]').text()).toMatch(/team Payments.*checkout load test.*kai.*in force/);
    expect(wrapper.findAll('[data-action="acknowledge"]')).toHaveLength(2);
    wrapper.unmount();
  });

  it('when a responder acknowledges with a note, then the note is sent and the row says who took it', async () => {
    const taken = { ...WATCH, state: 'acknowledged', acknowledgedAt: new Date().toISOString(), acknowledgedBy: { login: 'responder', name: 'The responder' }, acknowledgeNote: 'resizing today' };
    const { sent } = adminServer({ ...base(), 'POST /api/v1/alerts/1/acknowledge': { status: 200, body: { alert: taken, events: [] } } });
    const { wrapper } = await openAlertsAs('responder');
    await wrapper.find('tr[data-alert="1"] [data-action="acknowledge"]').trigger('click');
    await wrapper.find('input[name="note"]').setValue('resizing today');
    await wrapper.find('form[aria-label="Acknowledge the alert"]').trigger('submit');
    await flushPromises();
    expect(sent.find((s) => s.method === 'POST')).toMatchObject({ path: '/api/v1/alerts/1/acknowledge', body: { note: 'resizing today' } });
    expect(wrapper.find('tr[data-alert="1"]').text()).toContain('acknowledged by responder just now: “resizing today”');
    expect(wrapper.find('tr[data-alert="1"] [data-action="acknowledge"]').exists()).toBe(false);
    wrapper.unmount();
  });

  it('when the alert was resolved meanwhile, then the server\'s 409 message shows in the form', async () => {
    const refusal = { error: { code: 'alert_resolved', message: 'Alert 1 was resolved at 2026-12-01T10:00:00.000Z; there is nothing to acknowledge.' } };
    adminServer({ ...base(), 'POST /api/v1/alerts/1/acknowledge': { status: 409, body: refusal } });
    const { wrapper } = await openAlertsAs('responder');
    await wrapper.find('tr[data-alert="1"] [data-action="acknowledge"]').trigger('click');
    await wrapper.find('form[aria-label="Acknowledge the alert"]').trigger('submit');
    await flushPromises();
    expect(wrapper.find('[role="alert"]').text()).toContain('there is nothing to acknowledge');
    wrapper.unmount();
  });

  it('when a viewer opens it, then there is nothing to acknowledge and no quiet-window form', async () => {
    adminServer(base());
    const { wrapper } = await openAlertsAs('viewer');
    expect(wrapper.findAll('[data-action="acknowledge"]')).toHaveLength(0);
    expect(wrapper.find('form[aria-label="Set a quiet window"]').exists()).toBe(false);
    expect(wrapper.text()).toContain('Setting a quiet window needs the responder role or higher.');
    wrapper.unmount();
  });

  it('when a quiet window ends before it starts, then the server\'s message shows beside "Until"', async () => {
    const refusal = { error: { code: 'invalid', field: 'endsAt', message: 'endsAt must be after startsAt; a quiet window ends after it starts.' } };
    const { sent } = adminServer({ ...base(), 'POST /api/v1/quiet-windows': { status: 400, body: refusal } });
    const { wrapper } = await openAlertsAs('responder');
    await wrapper.find('input[name="startsAt"]').setValue('2026-12-02T14:00');
    await wrapper.find('input[name="endsAt"]').setValue('2026-12-02T12:00');
    await wrapper.find('input[name="reason"]').setValue('load test');
    await wrapper.find('form[aria-label="Set a quiet window"]').trigger('submit');
    await flushPromises();
    const post = sent.find((s) => s.method === 'POST');
    expect(post?.body).toMatchObject({ scope: 'team', reason: 'load test', startsAt: new Date('2026-12-02T14:00').toISOString(), endsAt: new Date('2026-12-02T12:00').toISOString() });
    expect(wrapper.text()).toContain('a quiet window ends after it starts');
    wrapper.unmount();
  });
});

describe('AlertTimeline', () => {
  it('when a sketch has an alert, then its steps show with the e-mail each notice sent or still waits to send', async () => {
    const timeline: AlertWithEvents = {
      ...BRIMMED,
      events: [
        { id: 1, at: '2026-12-01T09:10:00Z', kind: 'opened', level: 'watch', actor: 'system', note: 'opened at watch, load 81 %', mail: null },
        { id: 2, at: '2026-12-01T09:10:00Z', kind: 'notified', level: 'watch', actor: 'system', note: 'opened', mail: { id: 7, subject: 's', recipients: ['payments-alerts@larkfield.test'], attempts: 1, sentAt: '2026-12-01T09:10:05Z', nextAttemptAt: null, lastError: null } },
        { id: 3, at: '2026-12-01T11:00:00Z', kind: 'notified', level: 'brimmed', actor: 'system', note: 'rose', mail: { id: 8, subject: 's', recipients: ['payments-alerts@larkfield.test'], attempts: 2, sentAt: null, nextAttemptAt: '2026-12-01T11:01:00Z', lastError: 'connect ECONNREFUSED' } },
        { id: 4, at: '2026-12-01T11:05:00Z', kind: 'acknowledged', level: 'brimmed', actor: 'kai', note: 'resizing', mail: null },
      ],
    };
    adminServer({ 'GET /api/v1/sketches/11/alerts': { status: 200, body: { sketchId: 11, alerts: [timeline] } } });
    setActivePinia(createPinia());
    const wrapper = mount(AlertTimeline, { props: { sketchId: 11 }, global: { plugins: [Quasar] } });
    await flushPromises();
    const steps = wrapper.findAll('.timeline__step').map((s) => s.text());
    expect(steps).toHaveLength(4);
    expect(steps[1]).toMatch(/e-mail.*sent .* to payments-alerts@larkfield\.test/);
    expect(steps[2]).toMatch(/not sent yet after 2 tries \(connect ECONNREFUSED\); next try/);
    expect(steps[3]).toMatch(/acknowledged by kai — resizing/);
    wrapper.unmount();
  });

  it('when the sketch never had an alert, then it says so', async () => {
    adminServer({ 'GET /api/v1/sketches/12/alerts': { status: 200, body: { sketchId: 12, alerts: [] } } });
    const wrapper = mount(AlertTimeline, { props: { sketchId: 12 }, global: { plugins: [Quasar] } });
    await flushPromises();
    expect(wrapper.text()).toContain('No alert has been raised for this sketch.');
    wrapper.unmount();
  });
});
