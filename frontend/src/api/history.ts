// The history API: level timelines per sketch, and the same as a CSV file.
import type { FleetHistory } from '@brimwatch/api-types';
import { get } from './client';

export interface HistoryQuery {
  from: string;
  to: string;
  team?: string;
  service?: string;
  page?: number;
  pageSize?: number;
}

export function fetchHistory(query: HistoryQuery, signal?: AbortSignal): Promise<FleetHistory> {
  return get<FleetHistory>('/api/v1/history', { query: { ...query }, signal });
}

/** The export is a plain link: the browser downloads the server's attachment with the session cookie. */
export function historyCsvUrl(query: HistoryQuery): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) if (value !== undefined && key !== 'page' && key !== 'pageSize') params.set(key, String(value));
  return `/api/v1/history.csv?${params.toString()}`;
}
