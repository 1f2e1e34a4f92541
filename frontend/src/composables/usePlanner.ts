// The Planner's state: fields as typed, the plan they give (computed in the
// browser by the shared maths module), and the address bar kept in step so a
// design can be shared as a link.
import { computed, ref, watch } from 'vue';
import { useRoute, useRouter } from 'vue-router';
import { plan, SketchMathsError, type Plan } from '@brimwatch/maths';
import {
  FieldError,
  fieldsFromQuery,
  numbersFromFields,
  queryFromNumbers,
  type PlannerFields,
  type PlannerNumbers,
} from '@/utils/planner-inputs';

export type PlannerAnswer =
  | { ok: true; numbers: PlannerNumbers; plan: Plan }
  | { ok: false; field: string; message: string };

function answer(fields: PlannerFields): PlannerAnswer {
  try {
    const numbers = numbersFromFields(fields);
    return { ok: true, numbers, plan: plan(numbers) };
  } catch (error) {
    if (error instanceof FieldError || error instanceof SketchMathsError) {
      // In ε mode the budget is derived from ε, so that is the field to change.
      const field = fields.budgetMode === 'epsilon' && error.field === 'errorBudget' ? 'epsilon' : error.field;
      return { ok: false, field, message: error.message };
    }
    throw error;
  }
}

export function usePlanner() {
  const route = useRoute();
  const router = useRouter();
  const fields = ref<PlannerFields>(fieldsFromQuery(route.query));
  const result = computed(() => answer(fields.value));

  /** Applies a chosen alternative: back to the budget form, with its numbers. */
  function apply(numbers: PlannerNumbers): void {
    fields.value = {
      ...fields.value,
      budgetMode: 'errorBudget',
      sizedTotal: String(numbers.sizedTotal),
      errorBudget: String(numbers.errorBudget),
      confidence: String(numbers.confidence),
      counterBytes: numbers.counterBytes,
    };
  }

  watch(result, (current) => {
    if (current.ok) void router.replace({ query: queryFromNumbers(current.numbers) });
  });

  return { fields, result, apply };
}
