import type { Db } from '../../db';
import { HEALTH_LEVELS_WORST_FIRST } from '../../maths/health-levels';
import { queryFleet, type FleetQuery } from '../../queries/fleet';
import { figuresOf, type Figures, type StatusRow } from './figures';

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

export type FleetItem = SketchSettingsView & Figures & { instanceCount: number };

export interface FleetPage {
  items: FleetItem[];
  total: number;
  page: number;
  pageSize: number;
  summary: {
    perLevel: Record<string, number>;
    brimmingWithin7Days: number;
    brimmingWithin30Days: number;
    totalMemoryBytes: number;
  };
}

interface SettingsColumns {
  id: number;
  service: string;
  sketch?: string;
  name?: string;
  team: string;
  team_name: string;
  error_budget: number;
  confidence: number;
  watch_line: number;
  lead_time_days: number;
  scrape_interval_seconds: number;
  sized_total: number | null;
}

export function settingsView(row: SettingsColumns): SketchSettingsView {
  return {
    id: Number(row.id),
    service: row.service,
    sketch: (row.sketch ?? row.name) as string,
    team: row.team,
    teamName: row.team_name,
    errorBudget: row.error_budget,
    confidence: row.confidence,
    watchLine: row.watch_line,
    leadTimeDays: row.lead_time_days,
    scrapeIntervalSeconds: row.scrape_interval_seconds,
    sizedTotal: row.sized_total,
  };
}

/** The fleet table: every sketch judged by its worst instance, worst first unless the caller sorts otherwise. */
export async function listFleet(db: Db, query: FleetQuery): Promise<FleetPage> {
  const rows = await queryFleet(db, query);
  const perLevel = Object.fromEntries(HEALTH_LEVELS_WORST_FIRST.map((level) => [level, rows.perLevel[level] ?? 0]));
  return {
    items: rows.items.map((row) => ({
      ...settingsView(row as unknown as SettingsColumns),
      ...figuresOf(row as unknown as StatusRow),
      instanceCount: Number(row.instances),
    })),
    total: rows.total,
    page: query.page,
    pageSize: query.pageSize,
    summary: {
      perLevel,
      brimmingWithin7Days: rows.brimmingWithin7Days,
      brimmingWithin30Days: rows.brimmingWithin30Days,
      totalMemoryBytes: rows.totalMemoryBytes,
    },
  };
}
