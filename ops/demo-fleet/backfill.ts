import type { TotalReading } from '../../backend/src/maths/forecast-series';
import type { ClaimedTarget } from '../../collectors/claim';
import { readSketch, type SketchSample } from '../../collectors/exposition/read-sketch';
import { readingRows, type PreviousStatus } from '../../collectors/reading-rows';
import type { ScrapeOutcome } from '../../collectors/scrape';
import { STALE_AFTER_INTERVALS } from '../../collectors/maintenance/stale';
import { mulberry32 } from '../../backend/src/maths/random';
import { FedSketch } from './fed-sketch';
import { GARBAGE_BODY, type DemoInstance, type DemoSketch } from './scenario';

const MINUTE = 60_000;
const DAY = 86_400_000;
/** Readings of the back-filled week are ten minutes apart (or one scrape interval, if longer). */
const STEP_MS = 10 * MINUTE;
const DRAWS_PER_STEP = 150;
/** As many good readings as the collector fits each forecast to by default (COLLECTOR_HISTORY_READINGS). */
const HISTORY_READINGS = 60;

export interface Backfill {
  readings: Record<string, unknown>[];
  status: Record<string, unknown>;
}

/** The reason the collector gives for the proxy's HTML page, read by the collector's own reader. */
function garbageOutcome(label: string): ScrapeOutcome {
  const read = readSketch(GARBAGE_BODY, 'text/html', label);
  return { ok: false, kind: 'parse error', reason: read.ok ? 'unexpected' : read.reason, scrapeMs: 3 };
}

function sampleOf(fed: FedSketch, spec: DemoSketch): SketchSample {
  const s = fed.sketch;
  return { width: s.width, depth: s.depth, streamTotal: s.streamTotal, nonzeroCells: s.nonzeroCells(), counterBytes: s.counterBytes, windowSeconds: spec.windowSeconds, conservative: s.conservative };
}

/**
 * A week of one target's readings as the collector would have stored them:
 * a real sketch fed along the instance's curve, read every step, each reading
 * turned into its row, judgement and status by the collector's own code.
 */
export function backfillTarget(spec: DemoSketch, instance: DemoInstance, target: ClaimedTarget, anchor: number, seed: number): Backfill {
  const fed = new FedSketch(spec, instance, anchor, seed);
  const jitter = mulberry32(seed + 7);
  const step = Math.max(STEP_MS, spec.scrapeIntervalSeconds * 1000);
  const silentFrom = anchor - (spec.silentForMinutes ?? 0) * MINUTE;
  const failingFrom = spec.failingForHours === undefined ? Infinity : anchor - spec.failingForHours * 60 * MINUTE;
  const readings: Record<string, unknown>[] = [];
  let status: Record<string, unknown> = {};
  let previous: PreviousStatus | undefined;
  const history: TotalReading[] = [];

  for (let t = anchor - 7 * DAY; t <= silentFrom; t += step) {
    fed.feedTo(t, DRAWS_PER_STEP);
    const scrapeMs = Math.round((2 + 6 * jitter()) * 10) / 10;
    const outcome: ScrapeOutcome = t >= failingFrom ? garbageOutcome(spec.sketch) : { ok: true, sample: sampleOf(fed, spec), scrapeMs };
    const rows = readingRows({ target, outcome, takenAt: new Date(t) }, previous, history);
    readings.push(rows.reading);
    status = { ...status, ...rows.status };
    previous = {
      level: rows.level,
      levelSince: status.level_since as Date,
      failuresInRow: status.failures_in_row as number,
      streamTotal: (status.stream_total as number | undefined) ?? null,
      width: (status.width as number | undefined) ?? null,
      depth: (status.depth as number | undefined) ?? null,
    };
    if (outcome.ok) {
      history.push({ t, total: outcome.sample.streamTotal });
      if (history.length > HISTORY_READINGS) history.shift();
    }
  }

  // What the collectors' stale check writes once a target has gone three intervals without a good reading.
  const lastOk = (status.last_ok_at as Date | undefined)?.getTime() ?? -Infinity;
  const staleAt = lastOk + STALE_AFTER_INTERVALS * spec.scrapeIntervalSeconds * 1000;
  if (status.level !== 'unreachable' && staleAt <= anchor) status = { ...status, level: 'stale', level_since: new Date(staleAt) };
  return { readings, status };
}
