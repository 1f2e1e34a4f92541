// Designs next to the one entered, so a team sees what a looser budget or a
// different confidence would cost before settling.
import { plan, SketchMathsError, type Plan } from '@brimwatch/maths';
import type { PlannerNumbers } from './planner-inputs';

export interface Alternative {
  label: string;
  numbers: PlannerNumbers;
  /** null when the maths refuses the variant (say, an absurd size); the reason is kept. */
  plan: Plan | null;
  refusal?: string;
  isEntered: boolean;
}

export const ALTERNATIVE_CONFIDENCES = [0.9, 0.99, 0.999] as const;

function variant(label: string, numbers: PlannerNumbers, entered: PlannerNumbers): Alternative {
  const isEntered =
    numbers.errorBudget === entered.errorBudget && numbers.confidence === entered.confidence;
  try {
    return { label, numbers, plan: plan(numbers), isEntered };
  } catch (error) {
    if (!(error instanceof SketchMathsError)) throw error;
    return { label, numbers, plan: null, refusal: error.message, isEntered };
  }
}

export function alternativesTo(entered: PlannerNumbers): Alternative[] {
  return [
    variant('error budget × ½', { ...entered, errorBudget: entered.errorBudget / 2 }, entered),
    variant('error budget × 2', { ...entered, errorBudget: entered.errorBudget * 2 }, entered),
    ...ALTERNATIVE_CONFIDENCES.map((confidence) =>
      variant(`confidence ${confidence}`, { ...entered, confidence }, entered),
    ),
  ];
}
