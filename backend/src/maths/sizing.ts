import { SketchMathsError, requireConfidence, requirePositive } from './errors';

export type CounterBytes = 1 | 2 | 4 | 8;
export const COUNTER_BYTES: readonly CounterBytes[] = [1, 2, 4, 8];

/**
 * Beyond these a design is a typing slip, not a sketch: 2^31 counters per row
 * is where typed-array indexes and most libraries' 32-bit widths give out, and
 * 2^36 bytes (64 GiB) is more memory than any one service process would hold.
 */
export const SIZING_LIMITS = { maxWidth: 2 ** 31, maxMemoryBytes: 2 ** 36 } as const;

/**
 * Doubles carry about 16 significant digits, and `e/ε`, `ln(1/δ)` and `1 − confidence`
 * each add an error of an ulp or so. When the exact answer is a whole number
 * (say ln(1/δ) = 4 for δ = e⁻⁴), that noise can land just above it (4.0000000001)
 * and a plain ceil would add a whole row or column for nothing. A value within
 * one part in 10¹⁰ of a whole number is taken to be that number: far above the
 * noise, far below any difference an input could mean, and still under half a
 * unit at the largest width allowed (2^31 · 10⁻¹⁰ ≈ 0.2), so it never skips a
 * real step.
 */
const NOISE = 1e-10;

export function ceilIgnoringNoise(x: number): number {
  const nearest = Math.round(x);
  if (Math.abs(x - nearest) <= NOISE * Math.max(1, Math.abs(x))) return nearest;
  return Math.ceil(x);
}

export interface PlanInput {
  /** n₀: the stream total the sketch must hold within budget. */
  sizedTotal: number;
  /** E: the largest overcount tolerated, in the stream's units. */
  errorBudget: number;
  /** 1 − δ, as a fraction. */
  confidence: number;
  counterBytes?: number;
}

export interface Plan {
  width: number;
  depth: number;
  epsilon: number;
  delta: number;
  memoryBytes: number;
  /** m·E·δ^(1/k): at least the sized total, as the sizing rule rounds up. */
  capacity: number;
}

export function requireCounterBytes(value: number): CounterBytes {
  if (!COUNTER_BYTES.includes(value as CounterBytes)) {
    throw new SketchMathsError('counterBytes', `counterBytes must be 1, 2, 4 or 8 (got ${String(value)}).`);
  }
  return value as CounterBytes;
}

/** m·E·δ^(1/k): the largest stream total whose bound at confidence 1 − δ stays within E. */
export function capacityOf(width: number, depth: number, errorBudget: number, delta: number): number {
  const capacity = width * errorBudget * delta ** (1 / depth);
  // Only inputs at the edge of what a double holds get here (a budget of 10⁻³⁰⁰, say); every load would be 0 or ∞.
  if (!(capacity > 0 && capacity < Infinity)) {
    throw new SketchMathsError('errorBudget', `absurd size: a width of ${width}, depth ${depth} and error budget of ${errorBudget} give no usable capacity; use an error budget in the stream's own units.`);
  }
  return capacity;
}

/** Width and depth by Cormode & Muthukrishnan (J. Algorithms 55(1), 2005): m = ⌈e/ε⌉, k = ⌈ln(1/δ)⌉. */
export function plan(input: PlanInput): Plan {
  const sizedTotal = requirePositive('sizedTotal', input.sizedTotal);
  const errorBudget = requirePositive('errorBudget', input.errorBudget);
  const confidence = requireConfidence(input.confidence);
  const counterBytes = requireCounterBytes(input.counterBytes ?? 4);

  const epsilon = errorBudget / sizedTotal;
  const delta = 1 - confidence;
  const widthNeeded = ceilIgnoringNoise(Math.E / epsilon);
  if (!(widthNeeded <= SIZING_LIMITS.maxWidth)) {
    throw new SketchMathsError(
      'errorBudget',
      `absurd size: an error budget of ${errorBudget} on a sized total of ${sizedTotal} needs more than 2^31 counters per row; raise errorBudget or lower sizedTotal.`,
    );
  }
  const width = Math.max(1, widthNeeded);
  const depth = Math.max(1, ceilIgnoringNoise(Math.log(1 / delta)));
  const memoryBytes = width * depth * counterBytes;
  if (memoryBytes > SIZING_LIMITS.maxMemoryBytes) {
    throw new SketchMathsError(
      'errorBudget',
      `absurd size: ${width} × ${depth} counters of ${counterBytes} bytes is more than 64 GiB; raise errorBudget, lower sizedTotal or lower confidence.`,
    );
  }
  return { width, depth, epsilon, delta, memoryBytes, capacity: capacityOf(width, depth, errorBudget, delta) };
}
