// The shapes of the fleet API's answers (backend/src/services/sketches/*),
// written out here because the server's own types pull in Node and Knex.
import type { Level } from '@/utils/levels';

export interface SketchSettings {
  id: number;
  service: string;
  sketch: string;
  team: string;
  teamName: string;
  errorBudget: number;
  confidence: number;
  watchLine: number;
  leadTimeDays: number;
  scrapeIntervalSeconds: number;
  sizedTotal: number | null;
}

/** One instance's latest figures, or a sketch's through its worst instance. */
export interface Figures {
  level: Level;
  levelSince: string | null;
  streamTotal: number | null;
  width: number | null;
  depth: number | null;
  counterBytes: number | null;
  windowSeconds: number | null;
  conservative: boolean | null;
  load: number | null;
  capacity: number | null;
  boundNow: number | null;
  missRisk: number | null;
  missRiskNote: string | null;
  relativeError: number | null;
  distinctEstimate: number | null;
  saturatedRows: number | null;
  trend: string | null;
  trendReason: string | null;
  brimDate: string | null;
  brimEarliest: string | null;
  brimLatest: string | null;
  lastReadingAt: string | null;
  lastOkAt: string | null;
  lastError: string | null;
  memoryBytes: number | null;
}

export type FleetItem = SketchSettings & Figures & { instanceCount: number };

export interface FleetSummary {
  perLevel: Record<Level, number>;
  brimmingWithin7Days: number;
  brimmingWithin30Days: number;
  totalMemoryBytes: number;
}

export interface FleetPage {
  items: FleetItem[];
  total: number;
  page: number;
  pageSize: number;
  summary: FleetSummary;
}

export type InstanceView = Figures & {
  targetId: number;
  instance: string;
  targetUrl: string;
  nonzeroCells: number[] | null;
};

export interface ResizePlan {
  targetTotal: number;
  width: number;
  depth: number;
  memoryBytes: number;
  capacity: number;
  widthBefore: number;
  depthBefore: number;
  memoryBytesBefore: number;
  capacityBefore: number;
  memoryChangeBytes: number;
  resizeNeeded: boolean;
  reason: string;
  horizonDays: number;
  headroom: number;
  forecastTotal: number;
  forecastTrend: string;
}

export type SketchDetail = SketchSettings &
  Figures & {
    targetUrl: string | null;
    instances: InstanceView[];
    resizePlan: ResizePlan | null;
    createdAt: string | null;
    updatedAt: string | null;
  };

export interface HistoryPoint {
  t: string;
  totalMin: number | null;
  totalMax: number | null;
  totalLast: number | null;
  loadMax: number | null;
  level: string | null;
  readings: number;
  failures: number;
}

export interface HistoryMarker {
  t: string;
  kind: 'reset' | 'resize';
  instance: string;
  width: number | null;
  depth: number | null;
}

export interface SketchHistory {
  sketchId: number;
  instance: string | null;
  from: string;
  to: string;
  bucketSeconds: number;
  points: HistoryPoint[];
  markers: HistoryMarker[];
}

export interface TargetReading {
  width: number;
  depth: number;
  streamTotal: number;
  nonzeroCells: number[];
  counterBytes: number;
  windowSeconds: number;
  conservative: boolean;
  memoryBytes: number;
}

export interface TargetAssessment {
  boundNow: number;
  capacity: number;
  load: number;
  missRisk: number | null;
  level: 'clear' | 'watch' | 'brimmed';
}

export type TargetTest =
  | { ok: true; targetUrl: string; sketch: string; reading: TargetReading; assessment: TargetAssessment | null; scrapeMs: number }
  | { ok: false; targetUrl: string; sketch: string; kind: string; reason: string; scrapeMs: number };

export interface AuditEntry {
  id: number;
  at: string;
  actor: string;
  action: string;
  subjectType: string;
  subjectId: string | null;
  before: unknown;
  after: unknown;
}

export interface TeamSummary {
  id: number;
  slug: string;
  name: string;
}
