// The fleet API (GET/POST/PATCH /api/v1/sketches…), typed for the pages.
import type { FleetPage, SketchDetail, SketchHistory, TargetTest } from '@brimwatch/api-types';
import type { ChangeInput, RegistrationInput } from '../../../backend/src/routes/sketch-input';
import type { AuditRow } from './admin';
import type { TeamRef } from './auth';
import { get, request } from './client';

export type { ChangeInput, RegistrationInput };

/** The fleet list's query, as the server reads it: lists comma-separated, sort by column name. */
export interface FleetQuery {
  team?: string;
  service?: string;
  level?: string;
  q?: string;
  sort?: string;
  order?: 'asc' | 'desc';
  page?: number;
  pageSize?: number;
}

export function fetchFleet(query: FleetQuery, signal?: AbortSignal): Promise<FleetPage> {
  return get<FleetPage>('/api/v1/sketches', { query: { ...query }, signal });
}

export function fetchSketch(id: number, signal?: AbortSignal): Promise<SketchDetail> {
  return get<SketchDetail>(`/api/v1/sketches/${id}`, { signal });
}

/** The sketch's readings over a range, bucketed on the server; `instance` narrows them to one replica. */
export function fetchReadings(id: number, range: { from: Date; to: Date; points: number; instance?: string | null }, signal?: AbortSignal): Promise<SketchHistory> {
  return get<SketchHistory>(`/api/v1/sketches/${id}/readings`, {
    query: { from: range.from.toISOString(), to: range.to.toISOString(), points: range.points, ...(range.instance ? { instance: range.instance } : {}) },
    signal,
  });
}

export function registerSketch(input: RegistrationInput): Promise<SketchDetail> {
  return request<SketchDetail>('/api/v1/sketches', { method: 'POST', body: input });
}

export function changeSketch(id: number, change: ChangeInput): Promise<SketchDetail> {
  return request<SketchDetail>(`/api/v1/sketches/${id}`, { method: 'PATCH', body: change });
}

export function testTarget(input: { targetUrl: string; sketch: string; errorBudget?: number; confidence?: number; watchLine?: number }): Promise<TargetTest> {
  return request<TargetTest>('/api/v1/sketches/test-target', { method: 'POST', body: input });
}

export async function fetchTeams(): Promise<TeamRef[]> {
  const answer = await get<{ teams: TeamRef[] }>('/api/v1/teams');
  return answer.teams;
}

/** The sketch's own entries in the audit log, newest first (open to every role that reads the sketch). */
export async function fetchSketchAudit(id: number): Promise<AuditRow[]> {
  const answer = await get<{ entries: AuditRow[] }>(`/api/v1/sketches/${id}/audit`, { query: { pageSize: 50 } });
  return answer.entries;
}
