import { SketchMathsError, requireConfidence, requirePositive, requirePositiveInteger } from './errors';
import { formatBytes, formatCount, formatPercent } from './format';
import type { BrimForecast } from './forecast';
import { capacityOf, plan, requireCounterBytes } from './sizing';

export const DEFAULT_HEADROOM = 1.25;
export const DEFAULT_HORIZON_DAYS = 90;
const DAY_MS = 86_400_000;

export interface ForecastTotalInput {
  forecast: BrimForecast;
  /** The latest stream total (or, for a windowed sketch, the latest window peak). */
  currentTotal: number;
  now: number;
  horizonDays?: number;
}

/** The stream total the trend reaches at the horizon; with no trend, today's total is the best guess. */
export function forecastTotalAt(input: ForecastTotalInput): number {
  const horizonDays = requirePositive('horizonDays', input.horizonDays ?? DEFAULT_HORIZON_DAYS);
  const { forecast, currentTotal } = input;
  if (forecast.trend === 'none') return currentTotal;
  const seconds = (input.now + horizonDays * DAY_MS - forecast.anchorAt) / 1000;
  return Math.max(currentTotal, forecast.anchorTotal + forecast.slopePerSecond * seconds);
}

export interface ResizeInput {
  width: number;
  depth: number;
  counterBytes: number;
  errorBudget: number;
  confidence: number;
  forecastTotal: number;
  headroom?: number;
  /** Only for the wording of `reason`. */
  horizonDays?: number;
}

export interface ResizePlan {
  /** forecastTotal × headroom: the sized total of the new plan. */
  targetTotal: number;
  width: number;
  depth: number;
  memoryBytes: number;
  capacity: number;
  widthBefore: number;
  depthBefore: number;
  memoryBytesBefore: number;
  capacityBefore: number;
  /** After minus before; negative when the new plan is smaller. */
  memoryChangeBytes: number;
  /** False when the current sketch already holds the target total within budget. */
  resizeNeeded: boolean;
  reason: string;
}

/** The smallest width and depth that keep the same budget and confidence at the forecast total plus headroom. */
export function resizePlan(input: ResizeInput): ResizePlan {
  const widthBefore = requirePositiveInteger('width', input.width);
  const depthBefore = requirePositiveInteger('depth', input.depth);
  const counterBytes = requireCounterBytes(input.counterBytes);
  const errorBudget = requirePositive('errorBudget', input.errorBudget);
  const confidence = requireConfidence(input.confidence);
  const forecastTotal = requirePositive('forecastTotal', input.forecastTotal);
  const headroom = input.headroom ?? DEFAULT_HEADROOM;
  if (!(Number.isFinite(headroom) && headroom >= 1)) {
    throw new SketchMathsError('headroom', `headroom must be a factor of 1 or more, such as 1.25 for 25 % spare (got ${String(headroom)}).`);
  }

  const targetTotal = forecastTotal * headroom;
  const next = plan({ sizedTotal: targetTotal, errorBudget, confidence, counterBytes });
  const memoryBytesBefore = widthBefore * depthBefore * counterBytes;
  const capacityBefore = capacityOf(widthBefore, depthBefore, errorBudget, 1 - confidence);
  const resizeNeeded = capacityBefore < targetTotal;

  const when = input.horizonDays === undefined ? '' : ` in ${formatCount(input.horizonDays)} days`;
  const target = `the forecast stream total of ${formatCount(forecastTotal)}${when} (${formatCount(targetTotal)} with ${formatPercent(headroom - 1)} headroom)`;
  const budget = `the error budget of ${formatCount(errorBudget)} at ${formatPercent(confidence)} confidence`;
  const memoryChangeBytes = next.memoryBytes - memoryBytesBefore;
  const change = `${memoryChangeBytes >= 0 ? '+' : ''}${formatBytes(memoryChangeBytes)}`;
  const reason = resizeNeeded
    ? `The current capacity of ${formatCount(capacityBefore)} is below ${target}. Width ${formatCount(next.width)} and depth ${next.depth} ` +
      `(now ${formatCount(widthBefore)} × ${depthBefore}) keep ${budget} up to ${formatCount(next.capacity)}; ` +
      `memory goes from ${formatBytes(memoryBytesBefore)} to ${formatBytes(next.memoryBytes)} (${change}).`
    : `The current capacity of ${formatCount(capacityBefore)} already covers ${target} within ${budget}; no resize needed. ` +
      `The smallest sketch that would do is ${formatCount(next.width)} × ${next.depth} (${formatBytes(next.memoryBytes)}).`;

  return {
    targetTotal,
    width: next.width,
    depth: next.depth,
    memoryBytes: next.memoryBytes,
    capacity: next.capacity,
    widthBefore,
    depthBefore,
    memoryBytesBefore,
    capacityBefore,
    memoryChangeBytes,
    resizeNeeded,
    reason,
  };
}
