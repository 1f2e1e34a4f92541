import { worstLevel, type HealthLevel } from '../../maths/health-levels';

/** A span of time at one level; null where nothing was read. Times in ms since 1970. */
export interface Span {
  from: number;
  to: number;
  level: HealthLevel | null;
}

/** A point from the level-change query, in the form the timeline needs. */
export interface LevelPoint {
  at: number;
  level: HealthLevel;
  /** Until when this point vouches for the target (a reading: its own time; an hourly rollup: the hour's end). */
  seenUntil: number;
  /** Nothing was read for longer than the stale limit before this point, since this time. */
  gapFrom: number | null;
  staleAfterMs: number;
  /** The target's last point in the period: after it the target goes stale once the limit passes. */
  last: boolean;
}

function clip(spans: Span[], from: number, end: number): Span[] {
  return spans
    .filter((s) => s.to > from && s.from < end)
    .map((s) => ({ from: Math.max(s.from, from), to: Math.min(s.to, end), level: s.level }));
}

function merged(spans: Span[]): Span[] {
  const out: Span[] = [];
  for (const s of spans) {
    const last = out[out.length - 1];
    if (last && last.level === s.level && last.to === s.from) last.to = s.to;
    else out.push({ ...s });
  }
  return out;
}

/**
 * One target's levels over [from, end] from its change points (sorted by
 * time). A point sets the level from its time on; a break in readings longer
 * than the stale limit (DESIGN.md: three scrape intervals) turns the target
 * stale from the limit until the next reading, and after its last reading too.
 */
export function targetSpans(points: LevelPoint[], from: number, end: number): Span[] {
  const spans: Span[] = [];
  let level: HealthLevel | null = null;
  let since = -Infinity;
  const switchTo = (at: number, next: HealthLevel) => {
    if (next === level) return;
    if (at > since) spans.push({ from: since, to: at, level });
    level = next;
    since = Math.max(since, at);
  };
  for (const p of points) {
    if (p.gapFrom !== null) switchTo(p.gapFrom + p.staleAfterMs, 'stale');
    switchTo(p.at, p.level);
    if (p.last && end - p.seenUntil > p.staleAfterMs) switchTo(p.seenUntil + p.staleAfterMs, 'stale');
  }
  spans.push({ from: since, to: Infinity, level });
  return merged(clip(spans, from, end));
}

/** A sketch is as bad as its worst instance at every moment (DESIGN.md's severity order). */
export function sketchSpans(targets: Span[][], from: number, end: number): Span[] {
  const edges = [...new Set([from, end, ...targets.flatMap((spans) => spans.flatMap((s) => [s.from, s.to]))])]
    .filter((t) => t >= from && t <= end)
    .sort((a, b) => a - b);
  const cursor = targets.map(() => 0);
  const out: Span[] = [];
  for (let i = 0; i + 1 < edges.length; i++) {
    const [a, b] = [edges[i], edges[i + 1]];
    const levels: HealthLevel[] = [];
    targets.forEach((spans, t) => {
      while (cursor[t] < spans.length && spans[cursor[t]].to <= a) cursor[t]++;
      const s = spans[cursor[t]];
      if (s && s.from <= a && s.level !== null) levels.push(s.level);
    });
    out.push({ from: a, to: b, level: worstLevel(levels) ?? null });
  }
  return merged(out);
}

/** Seconds spent at each level; time with no reading is not counted. */
export function timeAtLevels(spans: Span[]): Record<HealthLevel, number> {
  const seconds: Record<HealthLevel, number> = { clear: 0, watch: 0, brimmed: 0, stale: 0, unreachable: 0 };
  for (const s of spans) if (s.level !== null) seconds[s.level] += (s.to - s.from) / 1000;
  return seconds;
}
