import { FAILURES_FOR_UNREACHABLE } from '../../../../collectors/judge';
import { STALE_AFTER_INTERVALS } from '../../../../collectors/maintenance/stale';
import type { FleetHistory, SketchTimeline } from '../../api-types';
import type { Db } from '../../db';
import type { HealthLevel } from '../../maths/health-levels';
import { alertEventsIn, historySketches, type HistoryFilter, type HistorySketchRow } from '../../queries/history-sketches';
import { levelChanges, type LevelChangeRow } from '../../queries/level-changes';
import { sketchSpans, targetSpans, timeAtLevels, type LevelPoint } from './timeline';

/** Longer periods read the hourly rollups: a bar a few hundred pixels wide shows no finer detail anyway. */
export const READINGS_SPAN_MS = 2 * 86_400_000;
const MAX_ALERT_EVENTS = 5000;

export interface HistoryPeriod {
  from: Date;
  to: Date;
  now: Date;
}

const pointOf = (r: LevelChangeRow): LevelPoint => ({
  at: new Date(r.at).getTime(),
  level: r.level as HealthLevel,
  seenUntil: new Date(r.seen_until).getTime(),
  gapFrom: r.gap_from === null ? null : new Date(r.gap_from).getTime(),
  staleAfterMs: Number(r.stale_after) * 1000,
  last: r.is_last,
});

/** Timelines for some sketches: level changes from the readings, alert events beside them. */
export async function timelinesOf(db: Db, sketches: HistorySketchRow[], period: HistoryPeriod): Promise<{ resolution: FleetHistory['resolution']; end: Date; timelines: SketchTimeline[] }> {
  const end = new Date(Math.min(period.to.getTime(), period.now.getTime()));
  const hourly = end.getTime() - period.from.getTime() > READINGS_SPAN_MS;
  const ids = sketches.map((s) => Number(s.id));
  const [rows, events] = ids.length
    ? await Promise.all([
        levelChanges(db, { sketchIds: ids, from: period.from, to: end, hourly, failuresForUnreachable: FAILURES_FOR_UNREACHABLE, staleAfterIntervals: STALE_AFTER_INTERVALS }),
        alertEventsIn(db, ids, period.from, end, MAX_ALERT_EVENTS),
      ])
    : [[], []];
  // Rows come ordered by target and time: group them by sketch, then by target.
  const pointsBySketch = new Map<number, Map<number, LevelPoint[]>>();
  for (const row of rows) {
    const targets = pointsBySketch.get(Number(row.sketch_id)) ?? new Map<number, LevelPoint[]>();
    const points = targets.get(Number(row.target_id)) ?? [];
    points.push(pointOf(row));
    targets.set(Number(row.target_id), points);
    pointsBySketch.set(Number(row.sketch_id), targets);
  }
  const [from, until] = [period.from.getTime(), end.getTime()];
  const timelines = sketches.map((s): SketchTimeline => {
    const targets = [...(pointsBySketch.get(Number(s.id))?.values() ?? [])].map((points) => targetSpans(points, from, until));
    const spans = sketchSpans(targets, from, until);
    return {
      id: Number(s.id),
      service: s.service,
      sketch: s.sketch,
      team: s.team,
      teamName: s.team_name,
      spans: spans.map((x) => ({ from: new Date(x.from).toISOString(), to: new Date(x.to).toISOString(), level: x.level })),
      alerts: events
        .filter((e) => Number(e.sketch_id) === Number(s.id))
        .map((e) => ({ at: new Date(e.at).toISOString(), alertId: Number(e.alert_id), kind: e.kind, level: e.level, actor: e.actor, note: e.note })),
      secondsAt: timeAtLevels(spans),
    };
  });
  return { resolution: hourly ? 'hourly' : 'readings', end, timelines };
}

/** One page of the saturation history across the fleet, a team or a service. */
export async function fleetHistory(db: Db, filter: HistoryFilter, period: HistoryPeriod, page: number, pageSize: number): Promise<FleetHistory> {
  const { rows, total } = await historySketches(db, filter, (page - 1) * pageSize, pageSize);
  const { resolution, end, timelines } = await timelinesOf(db, rows, period);
  return { from: period.from.toISOString(), to: period.to.toISOString(), end: end.toISOString(), resolution, page, pageSize, total, sketches: timelines };
}
