import type { FleetSummary } from '../../api-types';
import { HEALTH_LEVELS_WORST_FIRST, type HealthLevel } from '../../maths/health-levels';
import type { FleetRow } from '../../queries/fleet';

/** Columns the fleet table can be sorted by, each with the figure it sorts on. */
export const FLEET_SORTS = {
  service: (r: FleetRow) => r.service,
  sketch: (r: FleetRow) => r.sketch,
  team: (r: FleetRow) => r.team,
  level: (r: FleetRow) => r.severity,
  load: (r: FleetRow) => r.load,
  streamTotal: (r: FleetRow) => r.stream_total,
  capacity: (r: FleetRow) => r.capacity,
  boundNow: (r: FleetRow) => r.bound_now,
  missRisk: (r: FleetRow) => r.miss_risk,
  brimDate: (r: FleetRow) => r.brim_date,
  lastReadingAt: (r: FleetRow) => r.taken_at,
  memoryBytes: (r: FleetRow) => r.memory_bytes,
  errorBudget: (r: FleetRow) => r.error_budget,
  width: (r: FleetRow) => r.width,
  depth: (r: FleetRow) => r.depth,
  instances: (r: FleetRow) => r.instances,
} as const;

export type FleetSort = keyof typeof FLEET_SORTS;

export interface FleetQuery {
  teams: string[];
  services: string[];
  levels: HealthLevel[];
  q: string | undefined;
  sort: FleetSort;
  order: 'asc' | 'desc';
  page: number;
  pageSize: number;
  now: Date;
}

type Value = string | number | null;

/** Ascending or descending as asked, with missing figures always last (a sketch not read yet has no load). */
function compareValues(a: Value, b: Value, direction: 1 | -1): number {
  if (a === null || b === null) return a === b ? 0 : a === null ? 1 : -1;
  return (a < b ? -1 : a > b ? 1 : 0) * direction;
}

function worstFirst(a: FleetRow, b: FleetRow): number {
  return b.severity - a.severity || compareValues(a.load, b.load, -1) || a.id - b.id;
}

const DAY_MS = 86_400_000;

/** Sketches brimming within `days`: a brim date ahead, not yet brimmed. */
const brimmingWithin = (rows: FleetRow[], now: number, days: number) =>
  rows.filter((r) => r.level !== 'brimmed' && r.brim_date !== null && r.brim_date > now && r.brim_date <= now + days * DAY_MS).length;

/**
 * Sorted, filtered and summed once per snapshot and question: while a
 * snapshot is served, repeated requests (the table refreshing itself, other
 * pages of the same list) only pick their page.
 */
const answered = new WeakMap<FleetRow[], Map<string, { matching: FleetRow[]; summary: FleetSummary }>>();
const MAX_QUESTIONS_PER_SNAPSHOT = 200;

function sortRows(rows: FleetRow[], sort: FleetSort, order: 'asc' | 'desc'): FleetRow[] {
  const key = FLEET_SORTS[sort];
  const direction = order === 'asc' ? 1 : -1;
  return rows.slice().sort((a, b) => compareValues(key(a), key(b), direction) || worstFirst(a, b));
}

function summarise(matching: FleetRow[], now: number): FleetSummary {
  const perLevel = Object.fromEntries(HEALTH_LEVELS_WORST_FIRST.map((level) => [level, 0])) as Record<HealthLevel, number>;
  for (const r of matching) perLevel[r.level as HealthLevel]++;
  return {
    perLevel,
    brimmingWithin7Days: brimmingWithin(matching, now, 7),
    brimmingWithin30Days: brimmingWithin(matching, now, 30),
    totalMemoryBytes: matching.reduce((sum, r) => sum + Number(r.all_memory), 0),
  };
}

function answer(rows: FleetRow[], q: FleetQuery): { matching: FleetRow[]; summary: FleetSummary } {
  const needle = q.q?.toLowerCase();
  const key = JSON.stringify([q.teams, q.services, needle, q.sort, q.order, q.now.getTime()]);
  let byQuestion = answered.get(rows);
  if (!byQuestion || byQuestion.size > MAX_QUESTIONS_PER_SNAPSHOT) answered.set(rows, (byQuestion = new Map()));
  const known = byQuestion.get(key);
  if (known) return known;
  const matching = sortRows(rows, q.sort, q.order).filter(
    (r) =>
      (q.teams.length === 0 || q.teams.includes(r.team)) &&
      (q.services.length === 0 || q.services.includes(r.service)) &&
      (!needle || [r.service, r.sketch, r.team, r.team_name].some((text) => text.toLowerCase().includes(needle))),
  );
  const result = { matching, summary: summarise(matching, q.now.getTime()) };
  byQuestion.set(key, result);
  return result;
}

/**
 * The fleet table from the snapshot: filtered, summarised, sorted and paged.
 * The summary covers the team/service/search filters but not the level filter,
 * so the counts per level stay visible while one level is shown.
 */
export function selectFleet(rows: FleetRow[], q: FleetQuery): { page: FleetRow[]; total: number; summary: FleetSummary } {
  const { matching, summary } = answer(rows, q);
  const shown = q.levels.length === 0 ? matching : matching.filter((r) => q.levels.includes(r.level as HealthLevel));
  const start = (q.page - 1) * q.pageSize;
  return { page: shown.slice(start, start + q.pageSize), total: shown.length, summary };
}
