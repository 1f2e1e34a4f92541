import type { HealthLevel } from '../maths/health-levels';

/** A stretch of time at one level; null where there were no readings. */
export interface HistorySpan {
  from: string;
  to: string;
  level: HealthLevel | null;
}

/** An alert event shown beside a sketch's timeline. */
export interface HistoryAlert {
  at: string;
  alertId: number;
  kind: string;
  level: string;
  actor: string;
  note: string | null;
}

export interface SketchTimeline {
  id: number;
  service: string;
  sketch: string;
  team: string;
  teamName: string;
  spans: HistorySpan[];
  alerts: HistoryAlert[];
  /** Seconds at each level within the period; time without readings is left out. */
  secondsAt: Record<HealthLevel, number>;
}

/** GET /api/v1/history: one page of level timelines across the fleet, a team or a service. */
export interface FleetHistory {
  from: string;
  to: string;
  /** Where the timelines stop: `to`, or now when `to` lies ahead. */
  end: string;
  resolution: 'readings' | 'hourly';
  page: number;
  pageSize: number;
  total: number;
  sketches: SketchTimeline[];
}
