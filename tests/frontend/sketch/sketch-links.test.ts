import { describe, expect, it } from 'vitest';
import { resizeSnippet } from '@/components/sketch/resize-snippet';
import { plannerLink } from '@/components/sketch/planner-link';
import { changedFields } from '@/components/sketch/audit-changes';

describe('what the sketch page hands on', () => {
  it('when the settings are copied, then they read as plain key = value lines a config reader takes', () => {
    expect(resizeSnippet({ width: 18_078, depth: 5 })).toBe('width = 18078\ndepth = 5\n');
  });

  it('when the Planner is opened from a sketch with a resize plan, then it is sized for the plan\'s target total', () => {
    const link = plannerLink({ resizePlan: { targetTotal: 6_650_353.7 } as never, sizedTotal: 1_000_000, streamTotal: 936_322, errorBudget: 1000, confidence: 0.99, counterBytes: 4 });
    expect(link).toEqual({ name: 'planner', query: { sizedTotal: '6650354', errorBudget: '1000', confidence: '0.99', counterBytes: '4' } });
  });

  it('when a sketch has neither a plan nor a sized total, then the Planner starts from today\'s total', () => {
    const link = plannerLink({ resizePlan: null, sizedTotal: null, streamTotal: 40_000, errorBudget: 500, confidence: 0.999, counterBytes: null });
    expect(link).toEqual({ name: 'planner', query: { sizedTotal: '40000', errorBudget: '500', confidence: '0.999' } });
  });

  it('when an audit entry changed the budget, then its line names the field with before and after', () => {
    expect(changedFields({ errorBudget: 500, sketch: 'a' }, { errorBudget: 800, sketch: 'a' })).toBe('errorBudget: 500 → 800');
    expect(changedFields(null, { sketch: 'a' })).toBe('registered');
  });
});
