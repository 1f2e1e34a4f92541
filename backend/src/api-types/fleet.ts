import type { BrimForecast } from '../maths/forecast';
import type { HealthLevel } from '../maths/health-levels';
import type { ResizePlan } from '../maths/resize';

/** A sketch's own settings, as registered (GET /api/v1/sketches and /api/v1/sketches/:id). */
export interface SketchSettingsView {
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

/** What the API says about one instance, or about a sketch through its worst instance. */
export interface Figures {
  level: HealthLevel;
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

export type FleetItem = SketchSettingsView & Figures & { instanceCount: number };

export interface FleetSummary {
  perLevel: Record<HealthLevel, number>;
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

/** The sketch page's resize plan: the maths' plan and the forecast it was sized for. */
export interface ResizeAdvice extends ResizePlan {
  horizonDays: number;
  headroom: number;
  forecastTotal: number;
  forecastTrend: BrimForecast['trend'];
}

export type SketchDetail = SketchSettingsView &
  Figures & {
    targetUrl: string | null;
    instances: InstanceView[];
    resizePlan: ResizeAdvice | null;
    createdAt: string | null;
    updatedAt: string | null;
  };
