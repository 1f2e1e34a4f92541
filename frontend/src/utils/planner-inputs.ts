// What the Planner's fields hold, how they read from and write to the address
// bar, and how typed text becomes numbers. The maths module judges the numbers.
import type { LocationQuery, LocationQueryRaw } from 'vue-router';

export type BudgetMode = 'errorBudget' | 'epsilon';

export interface PlannerFields {
  sizedTotal: string;
  budgetMode: BudgetMode;
  errorBudget: string;
  epsilon: string;
  confidence: string;
  counterBytes: number;
}

export const PLANNER_DEFAULTS: PlannerFields = {
  sizedTotal: '100 000 000',
  budgetMode: 'errorBudget',
  errorBudget: '10 000',
  epsilon: '0.0001',
  confidence: '0.99',
  counterBytes: 4,
};

/** A field whose text is not a number, in the same shape as the maths module's error. */
export class FieldError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
  }
}

/**
 * Reads a typed figure. Spaces, thin spaces, underscores and commas group
 * digits and are ignored; "1e6" works; a trailing % divides by 100.
 */
export function readFigure(text: string, field: string, label: string): number {
  const compact = text.replace(/[\s\u2009\u202F_,]/g, '');
  const percent = compact.endsWith('%');
  const digits = percent ? compact.slice(0, -1) : compact;
  if (digits === '') throw new FieldError(field, `Enter the ${label}.`);
  const value = Number(digits);
  if (Number.isNaN(value)) throw new FieldError(field, `“${text.trim()}” is not a number; type digits such as 1000000 or 1e6.`);
  return percent ? value / 100 : value;
}

function single(value: LocationQuery[string]): string | undefined {
  const first = Array.isArray(value) ? value[0] : value;
  return first ?? undefined;
}

/** Fields prefilled from ?sizedTotal=&errorBudget=&confidence=&counterBytes=, defaults elsewhere. */
export function fieldsFromQuery(query: LocationQuery): PlannerFields {
  const counterBytes = Number(single(query.counterBytes));
  return {
    ...PLANNER_DEFAULTS,
    sizedTotal: single(query.sizedTotal) ?? PLANNER_DEFAULTS.sizedTotal,
    errorBudget: single(query.errorBudget) ?? PLANNER_DEFAULTS.errorBudget,
    confidence: single(query.confidence) ?? PLANNER_DEFAULTS.confidence,
    counterBytes: Number.isFinite(counterBytes) && counterBytes > 0 ? counterBytes : PLANNER_DEFAULTS.counterBytes,
  };
}

export interface PlannerNumbers {
  sizedTotal: number;
  errorBudget: number;
  confidence: number;
  counterBytes: number;
}

/** The numbers the fields stand for; ε is turned into the budget it means (E = ε·n₀). */
export function numbersFromFields(fields: PlannerFields): PlannerNumbers {
  const sizedTotal = readFigure(fields.sizedTotal, 'sizedTotal', 'sized total');
  const errorBudget =
    fields.budgetMode === 'epsilon'
      ? readFigure(fields.epsilon, 'epsilon', 'ε') * sizedTotal
      : readFigure(fields.errorBudget, 'errorBudget', 'error budget');
  const confidence = readFigure(fields.confidence, 'confidence', 'confidence');
  return { sizedTotal, errorBudget, confidence, counterBytes: fields.counterBytes };
}

export function queryFromNumbers(numbers: PlannerNumbers): LocationQueryRaw {
  return {
    sizedTotal: String(numbers.sizedTotal),
    errorBudget: String(numbers.errorBudget),
    confidence: String(numbers.confidence),
    counterBytes: String(numbers.counterBytes),
  };
}
