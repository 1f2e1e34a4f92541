import type { DumpRowSummary } from '../maths/dump-verdict';
import type { LoadLevel } from '../maths/health-levels';

export type DumpFormat = 'csv' | 'json' | 'u32le' | 'u64le';

/**
 * How the counter values of a dump spread, in bins that double in width:
 * one bin for 0, then [1, 1], [2, 3], [4, 7], …
 */
export interface HistogramBin {
  from: number;
  to: number;
  cells: number;
}

/** A row of the dump as reported; the per-row occupancy stays with the analysis. */
export type DumpRow = Omit<DumpRowSummary, 'occupancy'>;

/** What is stored in dump_reports.report: the analysis, flattened for the API and the page. */
export interface DumpFigures {
  width: number;
  depth: number;
  errorBudget: number;
  confidence: number;
  streamTotal: number;
  streamTotalSource: 'given' | 'largest row sum';
  rows: DumpRow[];
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

/** Who checked which file, for which sketch if any: the part of a report that is not the analysis. */
export interface DumpHead {
  id: number;
  createdAt: string;
  uploadedBy: string;
  sketch: { id: number; service: string; sketch: string; team: string } | null;
  fileName: string;
  format: DumpFormat;
  byteSize: number;
}

export type DumpReport = DumpHead & DumpFigures;

export type DumpListItem = DumpHead & Pick<DumpFigures, 'width' | 'depth' | 'level' | 'load'>;

/** GET /api/v1/dumps: newest first; `nextBefore` asks for the next page. */
export interface DumpList {
  items: DumpListItem[];
  nextBefore: number | null;
}
