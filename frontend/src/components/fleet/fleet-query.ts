// The fleet table's filters, sort and page live in the address bar, so a
// reload, a shared link or the automatic refresh never loses them.
import type { LocationQuery, LocationQueryRaw } from 'vue-router';
import { HEALTH_LEVELS_WORST_FIRST } from '@brimwatch/maths';
import type { FleetQuery } from '@/api/sketches';
import type { Level } from '@/utils/levels';

/** Columns the server sorts by (the `sort` names of GET /api/v1/sketches). */
export const FLEET_SORTS = ['level', 'service', 'sketch', 'team', 'load', 'boundNow', 'missRisk', 'brimDate', 'lastReadingAt', 'memoryBytes'] as const;
export type FleetSortName = (typeof FLEET_SORTS)[number];

/** Names read best A→Z and brim dates soonest first; figures read best worst first (the server's defaults too). */
const ASCENDING_FIRST: readonly FleetSortName[] = ['service', 'sketch', 'team', 'brimDate'];

export const PAGE_SIZES = [25, 50, 100, 200] as const;

export interface FleetFilters {
  teams: string[];
  services: string[];
  levels: Level[];
  q: string;
  sort: FleetSortName;
  descending: boolean;
  page: number;
  pageSize: number;
}

export const DEFAULT_FILTERS: FleetFilters = {
  teams: [],
  services: [],
  levels: [],
  q: '',
  sort: 'level',
  descending: true,
  page: 1,
  pageSize: 50,
};

export function descendingByDefault(sort: FleetSortName): boolean {
  return !ASCENDING_FIRST.includes(sort);
}

function single(value: LocationQuery[string]): string | undefined {
  const first = Array.isArray(value) ? value[0] : value;
  return first ?? undefined;
}

function list(value: LocationQuery[string]): string[] {
  const all = (Array.isArray(value) ? value : [value]).filter((v): v is string => typeof v === 'string');
  return all.flatMap((v) => v.split(',')).map((v) => v.trim()).filter(Boolean);
}

function wholeNumber(value: string | undefined, allowed: (n: number) => boolean, fallback: number): number {
  const n = Number(value);
  return value !== undefined && Number.isInteger(n) && allowed(n) ? n : fallback;
}

/** Reads the address bar; anything it cannot use falls back to the default rather than failing the page. */
export function filtersFromQuery(query: LocationQuery): FleetFilters {
  const sortText = single(query.sort);
  const sort = FLEET_SORTS.find((s) => s === sortText) ?? DEFAULT_FILTERS.sort;
  const order = single(query.order);
  return {
    teams: list(query.team),
    services: list(query.service),
    levels: list(query.level).filter((l): l is Level => (HEALTH_LEVELS_WORST_FIRST as readonly string[]).includes(l)),
    q: single(query.q)?.trim() ?? '',
    sort,
    descending: order === 'asc' ? false : order === 'desc' ? true : descendingByDefault(sort),
    page: wholeNumber(single(query.page), (n) => n >= 1, 1),
    pageSize: wholeNumber(single(query.pageSize), (n) => (PAGE_SIZES as readonly number[]).includes(n), DEFAULT_FILTERS.pageSize),
  };
}

/** Writes only what differs from the default, so the plain fleet keeps a plain address. */
export function queryFromFilters(f: FleetFilters): LocationQueryRaw {
  const query: LocationQueryRaw = {};
  if (f.teams.length) query.team = f.teams.join(',');
  if (f.services.length) query.service = f.services.join(',');
  if (f.levels.length) query.level = f.levels.join(',');
  if (f.q) query.q = f.q;
  if (f.sort !== DEFAULT_FILTERS.sort) query.sort = f.sort;
  if (f.descending !== descendingByDefault(f.sort)) query.order = f.descending ? 'desc' : 'asc';
  if (f.page !== 1) query.page = String(f.page);
  if (f.pageSize !== DEFAULT_FILTERS.pageSize) query.pageSize = String(f.pageSize);
  return query;
}

export function apiQueryFromFilters(f: FleetFilters): FleetQuery {
  return {
    team: f.teams.length ? f.teams.join(',') : undefined,
    service: f.services.length ? f.services.join(',') : undefined,
    level: f.levels.length ? f.levels.join(',') : undefined,
    q: f.q || undefined,
    sort: f.sort,
    order: f.descending ? 'desc' : 'asc',
    page: f.page,
    pageSize: f.pageSize,
  };
}

/** A change of filter or search shows its first page; paging and sorting keep the rest. */
export function withFilterChange(f: FleetFilters, change: Partial<Pick<FleetFilters, 'teams' | 'services' | 'levels' | 'q'>>): FleetFilters {
  return { ...f, ...change, page: 1 };
}
