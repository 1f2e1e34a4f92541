import { flushPromises } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { SessionUser } from '@/api/auth';
import { useSessionStore } from '@/stores/session';
import { mountPage } from '../mount';
import { person, standInServer, standInUploads } from './stand-in-server';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const SERVER = {
  'GET /api/v1/dumps': { status: 200, body: { items: [], nextBefore: null } },
  'GET /api/v1/sketches': { status: 200, body: { items: [], total: 0 } },
  'GET /api/v1/imports/sketches/columns': {
    status: 200,
    body: { columns: [{ name: 'errorBudget', required: 'yes', kind: 'number', meaning: "The largest overcount tolerated, in the stream's units.", example: '500' }] },
  },
};

const row = (line: number, ok: boolean, problems: unknown[] = []) => ({ line, service: 'checkout', sketch: `s${line}`, team: 'payments', targets: 'http://127.0.0.1:9500/m', newService: false, ok, problems });

async function chooseFile(wrapper: Awaited<ReturnType<typeof mountPage>>['wrapper']) {
  const card = wrapper.find('[aria-labelledby="inventory-title"]');
  const input = card.find('input[type="file"]');
  Object.defineProperty(input.element, 'files', { value: [new File(['service,sketch\n'], 'inventory.csv')] });
  await input.trigger('change');
  await flushPromises();
  return card;
}

const button = (card: ReturnType<Awaited<ReturnType<typeof mountPage>>['wrapper']['find']>, label: RegExp) => card.findAll('button').find((b) => label.test(b.text()))!;

describe('the inventory import card', { timeout: 20_000 }, () => {
  it('when an owner opens Uploads, then the template link and the documented columns show', async () => {
    standInServer(SERVER);
    const { wrapper } = await mountPage('/uploads');
    useSessionStore().user = person('owner') as unknown as SessionUser;
    await flushPromises();
    await flushPromises();
    const card = wrapper.find('[aria-labelledby="inventory-title"]');
    expect(card.find('a[href="/api/v1/imports/sketches/template"]').attributes('download')).toBe('brimwatch-inventory-template.csv');
    expect(card.find('.inventory__columns').text()).toContain("The largest overcount tolerated, in the stream's units.");
    wrapper.unmount();
  });

  it('when the preview finds problems, then each shows beside its row and the import stays disabled', async () => {
    standInServer(SERVER);
    const preview = {
      rows: [
        row(2, true),
        row(3, false, [
          { field: 'team', code: 'not_your_team', status: 403, message: 'You may not import a sketch for team discovery.' },
          { field: 'targetUrl', code: 'target_not_allowed', status: 400, message: 'targetUrl is not allowed: outside TARGET_ALLOWLIST.' },
        ]),
      ],
      ready: 1,
      withProblems: 1,
    };
    const uploads = standInUploads({ status: 200, body: preview });
    uploads.release();
    const { wrapper } = await mountPage('/uploads');
    useSessionStore().user = person('owner') as unknown as SessionUser;
    await flushPromises();
    const card = await chooseFile(wrapper);
    await button(card, /^Preview$/).trigger('click');
    await flushPromises();
    await flushPromises();
    expect(uploads.sent[0]).toEqual({ path: '/api/v1/imports/sketches/preview', fields: [['file', 'file:inventory.csv']] });
    // The column is named where the message does not already start with it.
    expect(card.findAll('[data-line="3"] li').map((li) => li.text())).toEqual(['team: You may not import a sketch for team discovery.', 'targetUrl is not allowed: outside TARGET_ALLOWLIST.']);
    expect(card.find('[data-line="2"]').text()).toContain('✓ ready');
    expect(card.find('[role="status"]').text()).toMatch(/1\s*row ready,\s*1\s*with problems/);
    expect(button(card, /^Import/).attributes('disabled')).toBeDefined();
    wrapper.unmount();
  });

  it('when every row is ready and the import is made, then the summary lists the new sketches', async () => {
    standInServer(SERVER);
    const uploads = standInUploads({ status: 200, body: { rows: [row(2, true)], ready: 1, withProblems: 0 } });
    uploads.release();
    const { wrapper } = await mountPage('/uploads');
    useSessionStore().user = person('sre') as unknown as SessionUser;
    await flushPromises();
    const card = await chooseFile(wrapper);
    await button(card, /^Preview$/).trigger('click');
    await flushPromises();
    await flushPromises();
    const summary = { imported: 1, servicesCreated: ['checkout'], sketches: [{ line: 2, id: 41, service: 'checkout', sketch: 's2', team: 'payments' }] };
    standInUploads({ status: 201, body: summary }).release();
    await button(card, /^Import 1 sketch$/).trigger('click');
    await flushPromises();
    await flushPromises();
    expect(card.find('.inventory__summary').text()).toMatch(/Imported\s*1\s*sketch; new service: checkout/);
    expect(card.find('.inventory__summary a').attributes('href')).toBe('/sketches/41');
    wrapper.unmount();
  });
});
