// The alerts API (GET/POST /api/v1/alerts…, /api/v1/quiet-windows…), typed for the pages.
import type { Alert, AlertDetail, AlertWithEvents, QuietScope, QuietWindow } from '@brimwatch/api-types';
import { get, request } from './client';

/** The body of a new quiet window: times as ISO strings; the server starts it now when startsAt is left out. */
export interface QuietWindowInput {
  scope: QuietScope;
  sketchId?: number;
  service?: string;
  team?: string;
  startsAt?: string;
  endsAt: string;
  reason: string;
}

export async function fetchAlerts(query: { state?: string; team?: string; level?: string } = {}, signal?: AbortSignal): Promise<Alert[]> {
  return (await get<{ alerts: Alert[] }>('/api/v1/alerts', { query, signal })).alerts;
}

export function acknowledgeAlert(id: number, note: string): Promise<AlertDetail> {
  return request(`/api/v1/alerts/${id}/acknowledge`, { method: 'POST', body: note.trim() ? { note: note.trim() } : {} });
}

export async function fetchSketchAlerts(sketchId: number, signal?: AbortSignal): Promise<AlertWithEvents[]> {
  return (await get<{ alerts: AlertWithEvents[] }>(`/api/v1/sketches/${sketchId}/alerts`, { signal })).alerts;
}

export async function fetchQuietWindows(when: 'active' | 'past' | 'all' = 'active', signal?: AbortSignal): Promise<QuietWindow[]> {
  return (await get<{ quietWindows: QuietWindow[] }>('/api/v1/quiet-windows', { query: { when }, signal })).quietWindows;
}

export async function createQuietWindow(input: QuietWindowInput): Promise<QuietWindow> {
  return (await request<{ quietWindow: QuietWindow }>('/api/v1/quiet-windows', { method: 'POST', body: input })).quietWindow;
}

export async function endQuietWindow(id: number): Promise<QuietWindow> {
  return (await request<{ quietWindow: QuietWindow }>(`/api/v1/quiet-windows/${id}`, { method: 'DELETE' })).quietWindow;
}

/** The teams a quiet window can cover, for the form's choice. */
export async function fetchTeamChoices(): Promise<{ slug: string; name: string }[]> {
  return (await get<{ teams: { slug: string; name: string }[] }>('/api/v1/teams')).teams;
}
