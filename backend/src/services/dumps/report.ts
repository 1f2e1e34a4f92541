import type { LoadLevel } from '../../maths/health-levels';
import type { DumpResult } from './dump-reader';
import type { HistogramBin } from './histogram';
import type { DumpFormat } from './shape';

export interface DumpReportRow {
  row: number;
  sum: number;
  mean: number;
  zeroFraction: number;
  nonzeroCells: number;
  /** The row's noise floor. */
  median: number;
  shareAtOrAboveBudget: number;
}

/** What is stored in dump_reports.report: the analysis, flattened for the API and the page. */
export interface DumpFigures {
  width: number;
  depth: number;
  errorBudget: number;
  confidence: number;
  streamTotal: number;
  streamTotalSource: 'given' | 'largest row sum';
  rows: DumpReportRow[];
  rowSumsAgree: boolean;
  /** Null when every cell is non-zero: linear counting then has no answer. */
  distinctEstimate: number | null;
  distinctStandardError: number | null;
  distinctSaturated: boolean;
  empiricalMissRisk: number;
  markovMissRisk: number;
  load: number;
  capacity: number;
  boundNow: number;
  level: LoadLevel;
  verdict: string;
  histogram: HistogramBin[];
}

export interface DumpReport extends DumpFigures {
  id: number;
  createdAt: string;
  uploadedBy: string;
  sketch: { id: number; service: string; sketch: string; team: string } | null;
  fileName: string;
  format: DumpFormat;
  byteSize: number;
}

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
