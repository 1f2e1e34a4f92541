// The settings a resize plan asks for, as text to paste into a service's
// configuration. Plain digits (no grouping) so any config reader takes them.
import type { ResizePlan } from '@brimwatch/maths';

export function resizeSnippet(plan: Pick<ResizePlan, 'width' | 'depth'>): string {
  return `width = ${plan.width}\ndepth = ${plan.depth}\n`;
}
