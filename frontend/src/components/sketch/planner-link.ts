// "Open in Planner" with this sketch's figures: its budget, confidence and
// counter size, and the total it must hold from now on.
import type { RouteLocationRaw } from 'vue-router';
import type { SketchDetail } from '@brimwatch/api-types';

type PlannerFields = Pick<SketchDetail, 'resizePlan' | 'sizedTotal' | 'streamTotal' | 'errorBudget' | 'confidence' | 'counterBytes'>;

/** The resize plan's target (forecast plus headroom) when there is one, else the sized total, else today's total. */
export function plannerTotal(d: PlannerFields): number | null {
  return d.resizePlan?.targetTotal ?? d.sizedTotal ?? d.streamTotal;
}

export function plannerLink(d: PlannerFields): RouteLocationRaw {
  const total = plannerTotal(d);
  const query: Record<string, string> = { errorBudget: String(d.errorBudget), confidence: String(d.confidence) };
  if (total !== null && total > 0) query.sizedTotal = String(Math.ceil(total));
  if (d.counterBytes !== null) query.counterBytes = String(d.counterBytes);
  return { name: 'planner', query };
}
