import { combinedOccupancy, type OccupancyEstimate } from '../backend/src/maths';
import type { SketchSample } from './exposition/read-sketch';
import { scrapeTarget, scrapeTimeoutMs, type FailureKind, type ScrapeSettings } from './scrape';

export type ScrapeOnceResult =
  | { ok: true; sample: SketchSample; occupancy: OccupancyEstimate; scrapeMs: number }
  | { ok: false; kind: FailureKind; reason: string; scrapeMs: number };

/**
 * One scrape outside the schedule ("test the target" before saving): the
 * same safety check, limits and reader as every scheduled scrape, and the
 * rows' occupancy, or exactly why it failed. Stores nothing.
 */
export async function scrapeOnce(
  url: string,
  sketchLabel: string,
  settings: Omit<ScrapeSettings, 'userAgent'> & { userAgent?: string; intervalSeconds?: number },
): Promise<ScrapeOnceResult> {
  const outcome = await scrapeTarget(url, sketchLabel, scrapeTimeoutMs(settings.intervalSeconds ?? 30), {
    userAgent: 'brimwatch-target-test',
    ...settings,
  });
  if (!outcome.ok) return outcome;
  return { ...outcome, occupancy: combinedOccupancy(outcome.sample.nonzeroCells, outcome.sample.width) };
}
