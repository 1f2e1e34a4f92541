import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import LevelBadge from '@/components/LevelBadge.vue';

// The words and shapes are Brimwatch's own (DESIGN.md levels, LOOK.md shapes).
const EXPECTED = [
  ['clear', '○'],
  ['watch', '◔'],
  ['brimmed', '●'],
  ['stale', '◌'],
  ['unreachable', '⊘'],
] as const;

describe('LevelBadge', () => {
  it.each(EXPECTED)('when the level is %s, then the badge shows the word and the shape %s', (level, shape) => {
    const wrapper = mount(LevelBadge, { props: { level } });
    expect(wrapper.find('.level-badge__word').text()).toBe(level);
    expect(wrapper.find('.level-badge__shape').text()).toBe(shape);
    expect(wrapper.classes()).toContain(`level-badge--${level}`);
  });

  it('when a screen reader reads the badge, then it hears the word, not the shape', () => {
    const wrapper = mount(LevelBadge, { props: { level: 'brimmed' } });
    expect(wrapper.find('.level-badge__shape').attributes('aria-hidden')).toBe('true');
    expect(wrapper.attributes('title')).toMatch(/error budget no longer holds/);
  });
});
