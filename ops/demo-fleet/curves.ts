/**
 * How each simulated sketch's stream total moves with time, as loads (shares
 * of the sketch's capacity) so the demo lands in the intended level whatever
 * the sketch's size. Every curve is anchored at `anchor`, the moment the demo
 * starts: the back-filled week and the live fleet follow the same curve.
 */
export type Growth =
  /** A total that only grows, by the same amount each day, since long before the week shown. */
  | { kind: 'cumulative'; loadWeekAgo: number; loadNow: number }
  /** A replica restarted every `periodHours` (a deploy): its total climbs from zero each time, a little faster each week. */
  | { kind: 'restarts'; peakLoadWeekAgo: number; peakLoadNow: number; periodHours: number; lastRestartHoursAgo: number }
  /** A windowed sketch: empty at each window's start, its per-window peak growing week over week. */
  | { kind: 'windowed'; peakLoadWeekAgo: number; peakLoadNow: number; windowSeconds: number };

const HOUR = 3_600_000;
const DAY = 24 * HOUR;

/** A level that moves in a straight line from a week ago to now, and on past now at the same pace. */
const linear = (weekAgo: number, now: number, t: number, anchor: number) => now + ((now - weekAgo) / 7) * ((t - anchor) / DAY);

/** When the segment holding `t` began: the last restart or window start at or before `t`; -Infinity for a cumulative total. */
export function segmentStart(growth: Growth, t: number, anchor: number): number {
  if (growth.kind === 'cumulative') return -Infinity;
  if (growth.kind === 'windowed') {
    const w = growth.windowSeconds * 1000;
    return Math.floor(t / w) * w;
  }
  const period = growth.periodHours * HOUR;
  const first = anchor - growth.lastRestartHoursAgo * HOUR;
  return first + Math.floor((t - first) / period) * period;
}

/** The stream total at time `t` (ms), for a sketch of this capacity; whole increments, never negative. */
export function totalAt(growth: Growth, capacity: number, t: number, anchor: number): number {
  if (growth.kind === 'cumulative') return Math.max(0, Math.floor(capacity * linear(growth.loadWeekAgo, growth.loadNow, t, anchor)));
  const peak = Math.max(0, capacity * linear(growth.peakLoadWeekAgo, growth.peakLoadNow, t, anchor));
  const span = growth.kind === 'windowed' ? growth.windowSeconds * 1000 : growth.periodHours * HOUR;
  return Math.floor((peak * (t - segmentStart(growth, t, anchor))) / span);
}
