// The shapes of the uploads API's answers (backend/src/services/dumps/report.ts,
// backend/src/services/imports/*), written out because the server's types pull in Node.
import type { Level } from '@/utils/levels';

export type DumpFormat = 'csv' | 'json' | 'u32le' | 'u64le';

export interface HistogramBin {
  from: number;
  to: number;
  cells: number;
}

export interface DumpRow {
  row: number;
  sum: number;
  mean: number;
  zeroFraction: number;
  nonzeroCells: number;
  median: number;
  shareAtOrAboveBudget: number;
}

export interface DumpSketchRef {
  id: number;
  service: string;
  sketch: string;
  team: string;
}

export interface DumpReport {
  id: number;
  createdAt: string;
  uploadedBy: string;
  sketch: DumpSketchRef | null;
  fileName: string;
  format: DumpFormat;
  byteSize: number;
  width: number;
  depth: number;
  errorBudget: number;
  confidence: number;
  streamTotal: number;
  streamTotalSource: 'given' | 'largest row sum';
  rows: DumpRow[];
  rowSumsAgree: boolean;
  distinctEstimate: number | null;
  distinctStandardError: number | null;
  distinctSaturated: boolean;
  empiricalMissRisk: number;
  markovMissRisk: number;
  load: number;
  capacity: number;
  boundNow: number;
  level: Extract<Level, 'clear' | 'watch' | 'brimmed'>;
  verdict: string;
  histogram: HistogramBin[];
}

export type DumpListItem = Pick<DumpReport, 'id' | 'createdAt' | 'uploadedBy' | 'sketch' | 'fileName' | 'format' | 'byteSize' | 'width' | 'depth' | 'level' | 'load'>;

export interface DumpList {
  items: DumpListItem[];
  nextBefore: number | null;
}

export interface InventoryColumn {
  name: string;
  required: 'yes' | 'no' | 'targetUrl or instances';
  kind: 'text' | 'number' | 'instances';
  meaning: string;
  example: string;
}

export interface RowProblem {
  field?: string;
  code: string;
  status: number;
  message: string;
}

export interface RowVerdict {
  line: number;
  service: string | null;
  sketch: string | null;
  team: string | null;
  targets: string | null;
  newService: boolean;
  ok: boolean;
  problems: RowProblem[];
}

export interface ImportPreview {
  rows: RowVerdict[];
  ready: number;
  withProblems: number;
}

export interface ImportSummary {
  imported: number;
  servicesCreated: string[];
  sketches: { line: number; id: number; service: string; sketch: string; team: string }[];
}
