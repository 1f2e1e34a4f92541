// Turns a sketch's level timeline into positioned pieces of a bar, and the
// words that go with it; pure, so the page and its tests share it.
import type { HistoryAlert, HistorySpan, SketchTimeline } from '@brimwatch/api-types';
import { HEALTH_LEVELS_WORST_FIRST } from '@brimwatch/maths';
import type { Level } from '@/utils/levels';

export interface BarPiece {
  left: number;
  width: number;
  level: Level;
  title: string;
}

export interface AlertMark {
  left: number;
  kind: string;
  title: string;
}

const MIN_MS = 60_000;

/** A duration in the largest two units that matter: "45 s", "12 min", "3 h 20 min", "2 d 4 h". */
export function formatDuration(seconds: number): string {
  if (!(seconds > 0)) return '0';
  if (seconds < 60) return `${Math.round(seconds)} s`;
  const minutes = Math.round(seconds / 60);
  if (minutes < 60) return `${minutes} min`;
  const hours = Math.floor(minutes / 60);
  if (hours < 24) return minutes % 60 ? `${hours} h ${minutes % 60} min` : `${hours} h`;
  const days = Math.floor(hours / 24);
  return hours % 24 ? `${days} d ${hours % 24} h` : `${days} d`;
}

const when = (iso: string) => new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** Percent positions within [from, end]; spans without a reading are left as gaps. */
export function barPieces(spans: HistorySpan[], from: string, end: string): BarPiece[] {
  const start = Date.parse(from);
  const total = Date.parse(end) - start;
  if (!(total > 0)) return [];
  return spans
    .filter((s): s is HistorySpan & { level: Level } => s.level !== null)
    .map((s) => {
      const a = Date.parse(s.from);
      const b = Date.parse(s.to);
      return {
        left: ((a - start) / total) * 100,
        width: ((b - a) / total) * 100,
        level: s.level,
        title: `${s.level} for ${formatDuration((b - a) / 1000)}, ${when(s.from)} – ${when(s.to)}`,
      };
    });
}

export function alertMarks(alerts: HistoryAlert[], from: string, end: string): AlertMark[] {
  const start = Date.parse(from);
  const total = Date.parse(end) - start;
  if (!(total > 0)) return [];
  return alerts.map((a) => ({
    left: Math.min(100, Math.max(0, ((Date.parse(a.at) - start) / total) * 100)),
    kind: a.kind,
    title: `Alert ${a.kind.replace('_', ' ')} (${a.level}) by ${a.actor}, ${when(a.at)}${a.note ? `: ${a.note}` : ''}`,
  }));
}

/** What a screen reader hears for one sketch's bar. */
export function timelineSummary(t: SketchTimeline): string {
  const parts = HEALTH_LEVELS_WORST_FIRST
    .filter((level) => t.secondsAt[level] > 0)
    .map((level) => `${level} ${formatDuration(t.secondsAt[level])}`);
  const alerts = t.alerts.length ? `, ${t.alerts.length} alert event${t.alerts.length === 1 ? '' : 's'}` : '';
  return `${t.service} ${t.sketch}: ${parts.length ? parts.join(', ') : 'no readings in this period'}${alerts}`;
}

export const PERIODS = {
  '24h': { label: '24 h', ms: 24 * 60 * MIN_MS },
  '7d': { label: '7 days', ms: 7 * 24 * 60 * MIN_MS },
  '30d': { label: '30 days', ms: 30 * 24 * 60 * MIN_MS },
  '90d': { label: '90 days', ms: 90 * 24 * 60 * MIN_MS },
} as const;

export type PeriodName = keyof typeof PERIODS;

export function periodRange(name: PeriodName, now: Date): { from: string; to: string } {
  return { from: new Date(now.getTime() - PERIODS[name].ms).toISOString(), to: now.toISOString() };
}
