import type { DumpFigures } from '../../api-types';
import type { DumpResult } from './dump-reader';

/** The analysis as it is stored and answered: rows without their occupancy, distinct keys null when saturated. */
export function dumpFigures({ analysis: a, histogram }: DumpResult): DumpFigures {
  const distinct = a.distinct;
  return {
    width: a.width,
    depth: a.depth,
    errorBudget: a.errorBudget,
    confidence: a.confidence,
    streamTotal: a.streamTotal,
    streamTotalSource: a.streamTotalSource,
    rows: a.rows.map((r) => ({
      row: r.row,
      sum: r.sum,
      mean: r.mean,
      zeroFraction: r.zeroFraction,
      nonzeroCells: r.nonzeroCells,
      median: r.median,
      shareAtOrAboveBudget: r.shareAtOrAboveBudget,
    })),
    rowSumsAgree: a.rowSumsAgree,
    distinctEstimate: distinct.saturated ? null : distinct.distinctEstimate,
    distinctStandardError: distinct.saturated ? null : distinct.standardError,
    distinctSaturated: distinct.saturated,
    empiricalMissRisk: a.empiricalMissRisk,
    markovMissRisk: a.markovMissRisk,
    load: a.assessment.load,
    capacity: a.assessment.capacity,
    boundNow: a.assessment.boundNow,
    level: a.level,
    verdict: a.verdict,
    histogram,
  };
}
