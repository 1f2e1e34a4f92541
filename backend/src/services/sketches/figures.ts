import type { Figures } from '../../api-types';
import type { HealthLevel } from '../../maths/health-levels';
import { UNREAD_LEVEL } from '../../queries/level-order';

/** A target_status row as the queries return it (null columns when the target was never read). */
export interface StatusRow {
  level: string | null;
  level_since: Date | string | null;
  taken_at: Date | string | null;
  last_ok_at: Date | string | null;
  last_error: string | null;
  stream_total: number | null;
  width: number | null;
  depth: number | null;
  counter_bytes: number | null;
  window_seconds: number | null;
  conservative: boolean | null;
  nonzero_cells?: number[] | null;
  judgement: Record<string, unknown> | null;
}

export const isoOrNull = (value: unknown): string | null => {
  if (value === null || value === undefined || value === '') return null;
  const date = value instanceof Date ? value : new Date(String(value));
  return Number.isNaN(date.getTime()) ? null : date.toISOString();
};

const numberOrNull = (value: unknown): number | null => (typeof value === 'number' && Number.isFinite(value) ? value : null);
const textOrNull = (value: unknown): string | null => (typeof value === 'string' ? value : null);

/** One mapping for the fleet list, the sketch page and its instances, so they never disagree. */
export function figuresOf(row: StatusRow | null | undefined): Figures {
  const j = row?.judgement ?? {};
  const { width, depth, counter_bytes: bytes } = row ?? {};
  return {
    level: (row?.level ?? UNREAD_LEVEL) as HealthLevel,
    levelSince: isoOrNull(row?.level_since),
    streamTotal: row?.stream_total ?? null,
    width: width ?? null,
    depth: depth ?? null,
    counterBytes: bytes ?? null,
    windowSeconds: row?.window_seconds ?? null,
    conservative: row?.conservative ?? null,
    load: numberOrNull(j.load),
    capacity: numberOrNull(j.capacity),
    boundNow: numberOrNull(j.boundNow),
    missRisk: numberOrNull(j.missRisk),
    missRiskNote: textOrNull(j.missRiskNote),
    relativeError: numberOrNull(j.relativeError),
    distinctEstimate: numberOrNull(j.distinctEstimate),
    saturatedRows: numberOrNull(j.saturatedRows),
    trend: textOrNull(j.trend),
    trendReason: textOrNull(j.trendReason),
    brimDate: isoOrNull(j.brimAt),
    brimEarliest: isoOrNull(j.brimEarliest),
    brimLatest: isoOrNull(j.brimLatest),
    lastReadingAt: isoOrNull(row?.taken_at),
    lastOkAt: isoOrNull(row?.last_ok_at),
    lastError: row?.last_error ?? null,
    memoryBytes: width && depth && bytes ? width * depth * bytes : null,
  };
}
