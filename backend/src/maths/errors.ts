/**
 * The one error the maths module throws. `field` names the input to change, in
 * the same words as the API's query parameters, so a route can turn it into a
 * 400 without guessing which input was wrong.
 */
export class SketchMathsError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'SketchMathsError';
    this.field = field;
  }
}

export function requirePositive(field: string, value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new SketchMathsError(field, `${field} must be a finite number greater than 0 (got ${String(value)}).`);
  }
  return value;
}

export function requireNonNegative(field: string, value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
    throw new SketchMathsError(field, `${field} must be a finite number of 0 or more (got ${String(value)}).`);
  }
  return value;
}

export function requirePositiveInteger(field: string, value: number): number {
  if (typeof value !== 'number' || !Number.isSafeInteger(value) || value < 1) {
    throw new SketchMathsError(field, `${field} must be a whole number of 1 or more (got ${String(value)}).`);
  }
  return value;
}

/** A confidence of exactly 0 or 1 has no sketch: 1 needs infinitely many rows. */
export function requireConfidence(value: number, field = 'confidence'): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0 || value >= 1) {
    throw new SketchMathsError(
      field,
      `${field} must be a fraction strictly between 0 and 1, such as 0.99 for 99 % (got ${String(value)}).`,
    );
  }
  return value;
}

/** A watch line is a share of capacity; above 1 it would never warn before brimming. */
export function requireWatchLine(value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0 || value > 1) {
    throw new SketchMathsError('watchLine', `watchLine must be a fraction above 0 and at most 1, such as 0.8 (got ${String(value)}).`);
  }
  return value;
}
