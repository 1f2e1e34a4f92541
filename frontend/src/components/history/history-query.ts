// The History page's choices live in the address bar, so a view can be
// reloaded, shared or bookmarked; these read and write them.
import type { LocationQuery, LocationQueryRaw } from 'vue-router';
import type { HistoryQuery } from '@/api/history';
import { PERIODS, periodRange, type PeriodName } from './history-bars';

export interface HistoryChoice {
  period: PeriodName | 'custom';
  /** For a custom period: local date-times as the inputs hold them (YYYY-MM-DDTHH:mm). */
  from: string;
  to: string;
  teams: string[];
  services: string[];
  page: number;
}

const one = (v: LocationQuery[string]) => (Array.isArray(v) ? (v[0] ?? '') : (v ?? ''));
const many = (v: LocationQuery[string]) => one(v).split(',').map((s) => s.trim()).filter(Boolean);

export function choiceFromQuery(query: LocationQuery): HistoryChoice {
  const period = one(query.period);
  const page = Number(one(query.page));
  return {
    period: period in PERIODS || period === 'custom' ? (period as HistoryChoice['period']) : '7d',
    from: one(query.from),
    to: one(query.to),
    teams: many(query.team),
    services: many(query.service),
    page: Number.isInteger(page) && page > 0 ? page : 1,
  };
}

export function queryFromChoice(c: HistoryChoice): LocationQueryRaw {
  return {
    period: c.period === '7d' ? undefined : c.period,
    from: c.period === 'custom' && c.from ? c.from : undefined,
    to: c.period === 'custom' && c.to ? c.to : undefined,
    team: c.teams.length ? c.teams.join(',') : undefined,
    service: c.services.length ? c.services.join(',') : undefined,
    page: c.page > 1 ? String(c.page) : undefined,
  };
}

/** The API's query for a choice, or why the custom period cannot be asked for. */
export function apiQuery(c: HistoryChoice, now: Date, pageSize: number): { query: HistoryQuery } | { problem: string } {
  let range: { from: string; to: string };
  if (c.period === 'custom') {
    const from = new Date(c.from);
    const to = c.to ? new Date(c.to) : now;
    if (Number.isNaN(from.getTime())) return { problem: 'Choose when the period starts.' };
    if (Number.isNaN(to.getTime())) return { problem: 'The end of the period is not a date.' };
    if (from >= to) return { problem: 'The period must start before it ends.' };
    range = { from: from.toISOString(), to: to.toISOString() };
  } else range = periodRange(c.period, now);
  return {
    query: {
      ...range,
      team: c.teams.length ? c.teams.join(',') : undefined,
      service: c.services.length ? c.services.join(',') : undefined,
      page: c.page,
      pageSize,
    },
  };
}
