import type { HealthLevel, TotalReading } from '../backend/src/maths';
import type { ClaimedTarget } from './claim';
import { judgeReading, levelAfterFailure, type Judgement, type ReadingJudgement } from './judge';
import type { ScrapeOutcome } from './scrape';

/** A scrape that has finished, waiting to be stored. */
export interface FinishedScrape {
  target: ClaimedTarget;
  outcome: ScrapeOutcome;
  takenAt: Date;
}

/** The target's latest word before this scrape (its target_status row), if it has one. */
export interface PreviousStatus {
  level: HealthLevel;
  levelSince: Date;
  failuresInRow: number;
  streamTotal: number | null;
  width: number | null;
  depth: number | null;
  /** When its last good reading was taken; lets a store tell whether its cached history still ends there. */
  lastOkAt?: Date | null;
}

export interface ReadingRows {
  reading: Record<string, unknown>;
  status: Record<string, unknown>;
  good: boolean;
  level: HealthLevel;
}

/**
 * Turns one finished scrape into its reading and its new target_status. A
 * fall in the stream total is a reset (restart or new window): marked, and the
 * forecast's segment starts again there, with the history kept. A change of
 * width or depth is a resize: a new sizing epoch whose forecast ignores what
 * came before. A failure stores its reason and no figures, never zeros.
 */
export function readingRows(done: FinishedScrape, previous: PreviousStatus | undefined, history: readonly TotalReading[]): ReadingRows {
  const { target, outcome, takenAt } = done;
  const base = { target_id: target.targetId, sketch_id: target.sketchId, taken_at: takenAt, scrape_ms: outcome.scrapeMs };
  const sinceOf = (level: HealthLevel) => (previous && previous.level === level ? previous.levelSince : takenAt);

  if (!outcome.ok) {
    const failuresInRow = (previous?.failuresInRow ?? 0) + 1;
    const level = levelAfterFailure(previous?.level ?? 'stale', failuresInRow);
    return {
      good: false,
      level,
      reading: { ...base, ok: false, failure_reason: outcome.reason },
      status: { target_id: target.targetId, sketch_id: target.sketchId, level, taken_at: takenAt, last_error: outcome.reason, failures_in_row: failuresInRow, level_since: sinceOf(level) },
    };
  }

  const s = outcome.sample;
  const isResize = previous?.width != null && (previous.width !== s.width || previous.depth !== s.depth);
  const isReset = previous?.streamTotal != null && s.streamTotal < previous.streamTotal;
  const judgement: Judgement = judgeReading(s, isResize ? [] : history, target, takenAt.getTime());
  const figures = {
    stream_total: s.streamTotal,
    width: s.width,
    depth: s.depth,
    counter_bytes: s.counterBytes,
    window_seconds: s.windowSeconds,
    conservative: s.conservative,
    nonzero_cells: s.nonzeroCells,
  };
  // Readers of past readings (level timelines, charts, hourly rollups) want only the level and the load; the whole
  // judgement is the target's latest word. Keeping the rest out of every reading halves the row.
  const kept: ReadingJudgement = { level: judgement.level, load: judgement.load };
  return {
    good: true,
    level: judgement.level,
    reading: { ...base, ok: true, ...figures, is_reset: isReset, is_resize: isResize, judgement: JSON.stringify(kept) },
    status: {
      target_id: target.targetId,
      sketch_id: target.sketchId,
      level: judgement.level,
      taken_at: takenAt,
      last_ok_at: takenAt,
      last_error: null,
      failures_in_row: 0,
      ...figures,
      judgement: JSON.stringify(judgement),
      level_since: sinceOf(judgement.level),
    },
  };
}
