import { requireConfidence, requireNonNegative, requirePositive, requirePositiveInteger, requireWatchLine } from './errors';
import { DEFAULT_WATCH_LINE, levelForLoad, type LoadLevel } from './health-levels';
import { capacityOf } from './sizing';

export interface AssessInput {
  width: number;
  depth: number;
  errorBudget: number;
  confidence: number;
  /** n: the sum of all increments so far (or within the current window). */
  streamTotal: number;
  watchLine?: number;
}

export const NO_GUARANTEE = 'no guarantee';

export interface Assessment {
  /** B(n) = n/(m·δ^(1/k)): the overcount not exceeded with probability 1 − δ at this total. */
  boundNow: number;
  capacity: number;
  /** n / capacity, as a fraction (1 = 100 %). */
  load: number;
  /** min(1, (n/(m·E))^k); null when n/(m·E) ≥ 1, where the Markov bound says nothing. */
  missRisk: number | null;
  missRiskNote?: typeof NO_GUARANTEE;
  /** δ^(−1/k)/m: the bound as a share of n; fixed for a given sketch. */
  relativeError: number;
  level: LoadLevel;
}

/**
 * Judges a sketch of width m and depth k at stream total n against an absolute
 * error budget. Per row the expected overcount is at most n/m (Cormode &
 * Muthukrishnan 2005); Markov's inequality over k independent rows gives
 * P[overcount ≥ t] ≤ (n/(m·t))^k, from which every figure here follows.
 */
export function assess(input: AssessInput): Assessment {
  const width = requirePositiveInteger('width', input.width);
  const depth = requirePositiveInteger('depth', input.depth);
  const errorBudget = requirePositive('errorBudget', input.errorBudget);
  const confidence = requireConfidence(input.confidence);
  const streamTotal = requireNonNegative('streamTotal', input.streamTotal);
  const watchLine = requireWatchLine(input.watchLine ?? DEFAULT_WATCH_LINE);

  const delta = 1 - confidence;
  const rowFactor = delta ** (1 / depth);
  const capacity = capacityOf(width, depth, errorBudget, delta);
  const load = streamTotal / capacity;
  const perCellShare = streamTotal / (width * errorBudget);
  const assessment: Assessment = {
    boundNow: streamTotal / (width * rowFactor),
    capacity,
    load,
    missRisk: perCellShare >= 1 ? null : perCellShare ** depth,
    relativeError: 1 / (rowFactor * width),
    level: levelForLoad(load, watchLine),
  };
  if (assessment.missRisk === null) assessment.missRiskNote = NO_GUARANTEE;
  return assessment;
}
