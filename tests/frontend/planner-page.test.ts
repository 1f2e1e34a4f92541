import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, type DOMWrapper } from '@vue/test-utils';
import { answerWith, HEALTHY, SIGNED_OUT } from './fake-server';
import { mountPage, type Mounted } from './mount';

const THIN = '\u2009';
const UNIT = '\u202F';

beforeEach(() => {
  answerWith({ '/api/health': HEALTHY, '/api/auth/me': SIGNED_OUT });
});

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

function figure(mounted: Mounted, name: string): string {
  return mounted.wrapper.find(`[data-figure="${name}"]`).text();
}

async function type(mounted: Mounted, selector: string, text: string): Promise<void> {
  await (mounted.wrapper.find(selector) as DOMWrapper<HTMLInputElement>).setValue(text);
  await flushPromises();
}

/** The message Quasar shows under the field that holds `selector`. */
function messageBeside(mounted: Mounted, selector: string): string {
  const field = mounted.wrapper.find(selector).element.closest('.q-field');
  return field?.querySelector('.q-field__messages')?.textContent?.trim() ?? '';
}

// Mounting the whole app compiles Quasar on first use; a busy machine needs more than the default 5 s.
describe('the Planner', { timeout: 20_000 }, () => {
  it('when the sized total and budget are typed, then width and depth answer at once', async () => {
    const mounted = await mountPage('/planner');
    await type(mounted, '#planner-sized-total', '1 000 000');
    await type(mounted, '#planner-error-budget', '10000');
    await type(mounted, '#planner-confidence', '0.99');
    // Cormode & Muthukrishnan, J. Algorithms 55(1) 2005: ε = 0.01, δ = 0.01 → m = ⌈e/0.01⌉ = 272, k = ⌈ln 100⌉ = 5.
    expect(figure(mounted, 'width')).toBe('272');
    expect(figure(mounted, 'depth')).toBe('5');
    // 272 × 5 counters × 4 B = 5440 B = 5.3125 KiB, worked by hand.
    expect(figure(mounted, 'memory')).toBe(`5.3${UNIT}KiB`);
    // m·E·δ^(1/k) (DESIGN.md) = 272 × 10 000 × 10^(−0.4) = 2 720 000 × 0.398107… = 1 082 851.5, by hand.
    expect(figure(mounted, 'capacity')).toBe(`1${THIN}082${THIN}852`);
    expect(mounted.router.currentRoute.value.query).toMatchObject({ sizedTotal: '1000000', errorBudget: '10000' });
  });

  it('when the confidence is raised to 0.999, then the depth grows to 7 as you type', async () => {
    const mounted = await mountPage('/planner?sizedTotal=1000000&errorBudget=1000&confidence=0.99&counterBytes=4');
    // ε = 1000/1 000 000 = 0.001 → m = ⌈2718.28…⌉ = 2719 (the formula of Cormode & Muthukrishnan 2005, by hand).
    expect(figure(mounted, 'width')).toBe(`2${THIN}719`);
    await type(mounted, '#planner-confidence', '0.999');
    // δ = 0.001 → k = ⌈ln 1000⌉ = ⌈6.9078…⌉ = 7.
    expect(figure(mounted, 'depth')).toBe('7');
  });

  it('when ε is chosen instead of a budget, then ε = 0.01 gives the same 272 × 5', async () => {
    const mounted = await mountPage('/planner?sizedTotal=5000000&errorBudget=1&confidence=0.99');
    const epsilonToggle = mounted.wrapper.findAll('.q-btn-toggle button').find((b) => b.text().startsWith('ε'));
    await epsilonToggle!.trigger('click');
    await flushPromises();
    await type(mounted, '#planner-epsilon', '0.01');
    // Cormode & Muthukrishnan 2005: ε = 0.01, δ = 0.01 → 272 × 5, whatever the sized total.
    expect(figure(mounted, 'width')).toBe('272');
    expect(figure(mounted, 'depth')).toBe('5');
    expect(mounted.router.currentRoute.value.query.errorBudget).toBe('50000');
  });

  it('when a field is not a number, then the message sits beside that field and the figures wait', async () => {
    const mounted = await mountPage('/planner');
    await type(mounted, '#planner-sized-total', 'lots');
    expect(messageBeside(mounted, '#planner-sized-total')).toMatch(/not a number/);
    expect(mounted.wrapper.find('[data-figure="width"]').exists()).toBe(false);
  });

  it('when the link carries a confidence of 1.5, then the maths module\'s reason shows beside confidence', async () => {
    const mounted = await mountPage('/planner?sizedTotal=1000000&errorBudget=10000&confidence=1.5&counterBytes=4');
    expect(messageBeside(mounted, '#planner-confidence')).toMatch(/strictly between 0 and 1/);
    expect(messageBeside(mounted, '#planner-sized-total')).toBe(
      'Sum of all increments the sketch must hold — not the number of distinct keys.',
    );
  });

  it('when a design is shown, then the alternatives table prices a doubled budget', async () => {
    const mounted = await mountPage('/planner?sizedTotal=1000000&errorBudget=10000&confidence=0.99&counterBytes=4');
    const row = mounted.wrapper.findAll('tbody tr').find((r) => r.text().startsWith('error budget × 2'));
    const cells = row!.findAll('td').map((td) => td.text());
    // ε = 0.02 → m = ⌈135.91…⌉ = 136, k = 5, memory 136 × 5 × 4 = 2720 B = 2.656 KiB → "2.7 KiB", all by hand.
    expect(cells.slice(0, 3)).toEqual(['136', '5', `2.7${UNIT}KiB`]);
    expect(document.title).toBe('Planner · Brimwatch');
  });
});
