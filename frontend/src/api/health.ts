import { get } from './client';

export type HealthReport =
  | { status: 'ok'; database: 'up'; version: string }
  | { status: 'down'; reason: string };

/** GET /api/health: 200 when the database answers, 503 with a reason when not. */
export function fetchHealth(signal?: AbortSignal): Promise<HealthReport> {
  return get<HealthReport>('/api/health', { answerStatuses: [503], anonymousOk: true, signal });
}
