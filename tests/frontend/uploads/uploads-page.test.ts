import { flushPromises } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { SessionUser } from '@/api/auth';
import { useSessionStore } from '@/stores/session';
import { mountPage } from '../mount';
import { LIST_ITEM, REPORT } from './report-fixture';
import { person, standInServer, standInUploads } from './stand-in-server';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

async function openAs(role: string, path = '/uploads') {
  const mounted = await mountPage(path);
  useSessionStore().user = person(role) as unknown as SessionUser;
  await flushPromises();
  await flushPromises();
  return mounted;
}

const COMMON = {
  'GET /api/v1/dumps': { status: 200, body: { items: [LIST_ITEM], nextBefore: null } },
  'GET /api/v1/sketches': { status: 200, body: { items: [{ id: 3, service: 'checkout', sketch: 'per-card-limiter' }], total: 1 } },
  'GET /api/v1/imports/sketches/columns': { status: 200, body: { columns: [{ name: 'service', required: 'yes', kind: 'text', meaning: 'The service.', example: 'checkout' }] } },
};

describe('the Uploads page', { timeout: 20_000 }, () => {
  it('when the page opens, then its title is set and past reports list who, when and which sketch', async () => {
    standInServer(COMMON);
    const { wrapper } = await openAs('responder');
    expect(document.title).toBe('Uploads · Brimwatch');
    const list = wrapper.find('[aria-labelledby="dump-list-title"]');
    expect(list.text()).toContain('responder');
    expect(list.text()).toContain('checkout / per-card-limiter');
    expect(list.text()).toContain('limiter.csv');
    wrapper.unmount();
  });

  it('when a viewer opens it, then neither form shows, and each says which role it needs', async () => {
    standInServer(COMMON);
    const { wrapper } = await openAs('viewer');
    expect(wrapper.find('#dump-check-title').exists()).toBe(false);
    expect(wrapper.find('#inventory-title').exists()).toBe(false);
    expect(wrapper.text()).toContain('needs the owner role');
    expect(wrapper.text()).toContain('needs the responder role or higher');
    wrapper.unmount();
  });

  it('when a report is reopened from the list, then its verdict, figures, rows and histogram show', async () => {
    const { asked } = standInServer({ ...COMMON, 'GET /api/v1/dumps/7': { status: 200, body: REPORT } });
    const { wrapper, router } = await openAs('responder');
    await wrapper.find('button[aria-label^="Open report 7"]').trigger('click');
    await flushPromises();
    await flushPromises();
    expect(router.currentRoute.value.query.report).toBe('7');
    expect(asked).toContain('GET /api/v1/dumps/7');
    const report = wrapper.find('[aria-label="Dump report 7"]');
    expect(report.find('[data-test="verdict"]').text()).toBe(REPORT.verdict);
    expect(report.find('[data-figure="empirical"]').text()).toBe('0.13');
    expect(report.find('[data-figure="markov"]').text()).toBe('0.44');
    expect(report.find('[data-figure="noise-floor"]').text()).toBe('2 – 2');
    expect(report.find('[data-figure="distinct"]').text()).toContain('6 ± 2');
    expect(report.findAll('tbody tr')).toHaveLength(2);
    expect(report.find('.level-badge').text()).toContain('watch');
    expect(report.find('[role="img"]').attributes('aria-label')).toMatch(/Histogram of the 8 counter values/);
    wrapper.unmount();
  });

  it('when a responder checks a dump, then the fields go first, the progress bar moves, and the report opens', async () => {
    standInServer({ ...COMMON, 'GET /api/v1/dumps/7': { status: 200, body: REPORT } });
    const uploads = standInUploads({ status: 201, body: REPORT });
    const { wrapper, router } = await openAs('responder');
    const card = wrapper.find('[aria-labelledby="dump-check-title"]');
    await card.find('#dump-budget').setValue('3');
    const input = card.find('input[type="file"]');
    Object.defineProperty(input.element, 'files', { value: [new File(['0,3,1,4\n2,0,5,1\n'], 'limiter.csv')] });
    await input.trigger('change');
    await flushPromises();
    await card.find('form').trigger('submit');
    await flushPromises();
    expect(uploads.sent[0].path).toBe('/api/v1/dumps');
    expect(uploads.sent[0].fields.map(([k]) => k)).toEqual(['format', 'errorBudget', 'confidence', 'file']);
    expect(card.find('[role="status"]').text()).toContain('Uploading: 50 %');
    uploads.release();
    await flushPromises();
    await flushPromises();
    expect(router.currentRoute.value.query.report).toBe('7');
    expect(wrapper.find('[aria-label="Dump report 7"]').exists()).toBe(true);
    wrapper.unmount();
  });

  it('when the server refuses the dump, then its message shows and nothing opens', async () => {
    standInServer(COMMON);
    standInUploads({ status: 400, body: { error: { code: 'bad_dump', message: 'Line 2 has 3 counters, but line 1 has 4.', field: 'file' } } }).release();
    const { wrapper } = await openAs('sre');
    const card = wrapper.find('[aria-labelledby="dump-check-title"]');
    await card.find('#dump-budget').setValue('3');
    const input = card.find('input[type="file"]');
    Object.defineProperty(input.element, 'files', { value: [new File(['1,2,3,4\n1,2,3\n'], 'ragged.csv')] });
    await input.trigger('change');
    await card.find('form').trigger('submit');
    await flushPromises();
    await flushPromises();
    expect(card.text()).toContain('Line 2 has 3 counters, but line 1 has 4.');
    expect(wrapper.find('[aria-label^="Dump report"]').exists()).toBe(false);
    wrapper.unmount();
  });
});
