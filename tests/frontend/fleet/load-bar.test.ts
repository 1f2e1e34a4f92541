import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import LoadBar from '@/components/fleet/LoadBar.vue';

const NNBSP = '\u202F';

/** A part's left or width, as the percentage written in its style. */
function percent(wrapper: ReturnType<typeof mount>, part: string, property: 'left' | 'width'): number {
  return parseFloat((wrapper.find(`[data-part=${part}]`).element as HTMLElement).style[property]);
}

// The bar runs to a load of 125 %, so every position below is the load ÷ 1.25, worked by hand.
describe('the load bar', () => {
  it('when a sketch is at half its capacity, then the fill covers 40 % of the bar and the brim sits at 80 %', () => {
    const wrapper = mount(LoadBar, { props: { load: 0.5, watchLine: 0.8, level: 'clear' } });
    expect(percent(wrapper, 'fill', 'width')).toBe(40);
    expect(percent(wrapper, 'brim', 'left')).toBe(80);
    expect(percent(wrapper, 'watch', 'left')).toBe(64);
    expect(wrapper.attributes('aria-valuenow')).toBe('50');
    expect(wrapper.attributes('aria-label')).toBe(`load 50${NNBSP}% of the brim (watch line at 80${NNBSP}%)`);
  });

  it('when a sketch is over its brim, then the fill runs past the brim line in the brimmed colour', () => {
    const wrapper = mount(LoadBar, { props: { load: 1.1, watchLine: 0.8, level: 'brimmed' } });
    expect(percent(wrapper, 'fill', 'width')).toBe(88);
    expect(percent(wrapper, 'fill', 'width')).toBeGreaterThan(percent(wrapper, 'brim', 'left'));
    expect(wrapper.classes()).toContain('load-bar--brimmed');
    expect(wrapper.classes()).not.toContain('load-bar--spilling');
  });

  it('when the load is beyond the end of the bar, then the fill stops at the end and says it spills', () => {
    const wrapper = mount(LoadBar, { props: { load: 3.2, watchLine: 0.8, level: 'brimmed' } });
    expect(percent(wrapper, 'fill', 'width')).toBe(100);
    expect(wrapper.classes()).toContain('load-bar--spilling');
    expect(wrapper.attributes('aria-valuenow')).toBe('320');
  });

  it('when the watch line is set at 60 %, then its mark moves to 48 % of the bar', () => {
    const wrapper = mount(LoadBar, { props: { load: 0.7, watchLine: 0.6, level: 'watch' } });
    expect(percent(wrapper, 'watch', 'left')).toBe(48);
    expect(percent(wrapper, 'fill', 'width')).toBe(56);
  });

  it('when no good reading exists yet, then the bar is empty and says the load is unknown', () => {
    const wrapper = mount(LoadBar, { props: { load: null, watchLine: 0.8, level: 'unreachable' } });
    expect(percent(wrapper, 'fill', 'width')).toBe(0);
    expect(wrapper.attributes('aria-valuenow')).toBeUndefined();
    expect(wrapper.attributes('aria-label')).toMatch(/load unknown/);
  });
});
