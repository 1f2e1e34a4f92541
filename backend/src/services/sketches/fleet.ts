import type { FleetPage, SketchSettingsView } from '../../api-types';
import type { Db } from '../../db';
import { statusesOf } from '../../queries/fleet';
import { figuresOf, type StatusRow } from './figures';
import type { FleetSnapshot } from './fleet-snapshot';
import { selectFleet, type FleetQuery } from './fleet-table';

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
export async function listFleet(db: Db, snapshot: FleetSnapshot, query: FleetQuery): Promise<FleetPage> {
  // Brim dates are counted against the minute, so requests within one minute share one answer.
  const now = new Date(Math.floor(query.now.getTime() / 60_000) * 60_000);
  const { page, total, summary } = selectFleet(await snapshot.rows(), { ...query, now });
  // The page's figures come from the status rows as they are now, judgement included.
  const statuses = await statusesOf(db, page.flatMap((r) => (r.target_id === null ? [] : [r.target_id])));
  const byTarget = new Map<number, StatusRow>(statuses.map((s: StatusRow & { target_id: number }) => [Number(s.target_id), s]));
  return {
    items: page.map((row) => ({
      ...settingsView(row),
      ...figuresOf(row.target_id === null ? null : byTarget.get(row.target_id)),
      instanceCount: row.instances,
    })),
    total,
    page: query.page,
    pageSize: query.pageSize,
    summary,
  };
}
