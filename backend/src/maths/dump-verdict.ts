import { assess, type Assessment } from './assess';
import { formatCount, formatPercent } from './format';
import type { LoadLevel } from './health-levels';
import { combinedOccupancy, type OccupancyEstimate } from './occupancy';

export interface DumpRowSummary {
  row: number;
  /** n under the standard update; lower under conservative update. */
  sum: number;
  /** Exactly n/m under the standard update: an integrity check. */
  mean: number;
  zeroFraction: number;
  nonzeroCells: number;
  /** The noise floor: what a key that was never seen reads in this row, typically. */
  median: number;
  shareAtOrAboveBudget: number;
  occupancy: OccupancyEstimate;
}

export interface DumpAnalysis {
  width: number;
  depth: number;
  errorBudget: number;
  confidence: number;
  rows: DumpRowSummary[];
  rowSumsAgree: boolean;
  streamTotal: number;
  streamTotalSource: 'given' | 'largest row sum';
  distinct: OccupancyEstimate;
  /** Π over rows of the share of cells ≥ E: the chance a random key's every row is over budget. */
  empiricalMissRisk: number;
  /** min(1, (n/(m·E))^k); never below the empirical figure, by Markov's inequality per row. */
  markovMissRisk: number;
  assessment: Assessment;
  level: LoadLevel;
  verdict: string;
}

export interface DumpFacts {
  width: number;
  depth: number;
  errorBudget: number;
  confidence: number;
  streamTotal: number | undefined;
  rows: DumpRowSummary[];
}

const LEVEL_WORDS: Record<LoadLevel, string> = {
  clear: 'Clear: the error budget holds with room to spare',
  watch: 'Watch: the error budget still holds, but the sketch is past its watch line',
  brimmed: 'Brimmed: the error budget no longer holds at the target confidence',
};

/**
 * The empirical miss risk follows Ting ("Count-Min: optimal estimation and
 * tight error bounds using empirical error distributions", KDD 2018) in
 * spirit: read the error distribution off the counters instead of bounding it.
 */
export function summariseDump(facts: DumpFacts): DumpAnalysis {
  const { width, depth, errorBudget, confidence, rows } = facts;
  const sums = rows.map((r) => r.sum);
  const largestSum = Math.max(...sums);
  const smallestSum = Math.min(...sums);
  const streamTotal = facts.streamTotal ?? largestSum;
  const assessment = assess({ width, depth, errorBudget, confidence, streamTotal });
  const empiricalMissRisk = rows.reduce((risk, r) => risk * r.shareAtOrAboveBudget, 1);
  const markovMissRisk = Math.min(1, (streamTotal / (width * errorBudget)) ** depth);
  const distinct = combinedOccupancy(
    rows.map((r) => r.nonzeroCells),
    width,
  );

  const notes = [
    `${LEVEL_WORDS[assessment.level]} (load ${formatPercent(assessment.load, 3)} of a capacity of ${formatCount(assessment.capacity)}).`,
    `Empirical miss risk at an error budget of ${formatCount(errorBudget)}: ${formatPercent(empiricalMissRisk, 3)}; Markov figure ${formatPercent(markovMissRisk, 3)}.`,
  ];
  if (largestSum !== smallestSum && facts.streamTotal === undefined) {
    notes.push(
      `Row sums differ (${formatCount(smallestSum)} to ${formatCount(largestSum)}), as under conservative update; the largest row sum understates the stream total, so give the service's own total for a true load.`,
    );
  }
  if (facts.streamTotal !== undefined && largestSum > facts.streamTotal) {
    notes.push(`A row sum (${formatCount(largestSum)}) exceeds the given stream total (${formatCount(facts.streamTotal)}); check that the dump and the total were taken together.`);
  }
  const saturatedRows = rows.filter((r) => r.occupancy.saturated).length;
  if (saturatedRows > 0) notes.push(`${saturatedRows} of ${depth} rows have no zero cell left, so their distinct-key estimate is saturated.`);

  return {
    width,
    depth,
    errorBudget,
    confidence,
    rows,
    rowSumsAgree: largestSum === smallestSum,
    streamTotal,
    streamTotalSource: facts.streamTotal === undefined ? 'largest row sum' : 'given',
    distinct,
    empiricalMissRisk,
    markovMissRisk,
    assessment,
    level: assessment.level,
    verdict: notes.join(' '),
  };
}
