import { SketchMathsError, requirePositiveInteger } from './errors';

/**
 * Linear counting (Whang, Vander-Zanden & Taylor, "A linear-time probabilistic
 * counting algorithm for database applications", ACM TODS 15(2), 1990). D
 * distinct keys hashed into m cells leave an expected zero fraction
 * (1 − 1/m)^D ≈ e^(−t) with load factor t = D/m, so D̂ = −m·ln V.
 *
 * Its standard error, from the paper's variance of V,
 * Var(V) ≈ e^(−t)·(1 − (1 + t)·e^(−t))/m, through the delta method
 * (dD̂/dV = −m/V): Var(D̂) ≈ m²·Var(V)·e^(2t) = m·(e^t − t − 1),
 * the paper's StdError(D̂/D) = √m·√(e^t − t − 1)/D, with t estimated by t̂ = −ln V.
 */
export type OccupancyEstimate =
  | { saturated: true; zeroFraction: 0 }
  | {
      saturated: false;
      zeroFraction: number;
      /** t̂ = D̂/m. */
      loadFactor: number;
      distinctEstimate: number;
      standardError: number;
    };

function fromZeroFraction(zeroFraction: number, width: number, rows: number): OccupancyEstimate {
  // No zero cell left: the estimate is unbounded, so say so instead of printing m·ln(m·…).
  if (zeroFraction === 0) return { saturated: true, zeroFraction: 0 };
  // 0 − ln V rather than −ln V, so an empty row reads +0, not −0.
  const loadFactor = 0 - Math.log(zeroFraction);
  // e^t − t − 1 written as expm1(t) − t: near V = 1 the plain form cancels to nothing.
  const spread = Math.expm1(loadFactor) - loadFactor;
  return {
    saturated: false,
    zeroFraction,
    loadFactor,
    distinctEstimate: width * loadFactor,
    standardError: Math.sqrt((width * Math.max(0, spread)) / rows),
  };
}

export function distinctFromZeroFraction(zeroFraction: number, width: number): OccupancyEstimate {
  requirePositiveInteger('width', width);
  if (!(zeroFraction >= 0 && zeroFraction <= 1)) {
    throw new SketchMathsError('zeroFraction', `zeroFraction must be between 0 and 1 (got ${String(zeroFraction)}).`);
  }
  return fromZeroFraction(zeroFraction, width, 1);
}

function requireNonzeroCells(nonzeroCells: number, width: number): void {
  if (!Number.isSafeInteger(nonzeroCells) || nonzeroCells < 0 || nonzeroCells > width) {
    throw new SketchMathsError('nonzeroCells', `nonzeroCells must be a whole number from 0 to the width ${width} (got ${String(nonzeroCells)}).`);
  }
}

export function distinctFromNonzeroCells(nonzeroCells: number, width: number): OccupancyEstimate {
  requirePositiveInteger('width', width);
  requireNonzeroCells(nonzeroCells, width);
  return fromZeroFraction((width - nonzeroCells) / width, width, 1);
}

/**
 * One estimate from all rows. Each row hashes the same D keys independently,
 * so pooling their zero cells is linear counting over k·m cells: the same
 * estimate −m·ln V̄ with 1/k of the variance. (A median over rows would throw
 * that away.) Conservative update leaves the zero cells exactly as the
 * standard update would, since every updated key lifts all its cells off zero.
 */
export function combinedOccupancy(nonzeroCellsPerRow: readonly number[], width: number): OccupancyEstimate {
  requirePositiveInteger('width', width);
  if (nonzeroCellsPerRow.length === 0) {
    throw new SketchMathsError('nonzeroCells', 'nonzeroCells needs one count per row; none were given.');
  }
  let zeros = 0;
  for (const nonzero of nonzeroCellsPerRow) {
    requireNonzeroCells(nonzero, width);
    zeros += width - nonzero;
  }
  const rows = nonzeroCellsPerRow.length;
  return fromZeroFraction(zeros / (width * rows), width, rows);
}
