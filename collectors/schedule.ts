/**
 * When each target is scraped. Every target keeps a fixed offset within its
 * interval, derived from a hash of its id, so a fleet registered all at once
 * still spreads its scrapes evenly instead of arriving in one burst, and a
 * target's readings stay one interval apart whoever scrapes it.
 */
export function scrapeOffsetMs(targetId: number, intervalSeconds: number): number {
  // FNV-1a over the id's digits: stable across processes and restarts, and well spread for consecutive ids.
  let hash = 0x811c9dc5;
  for (const ch of String(targetId)) {
    hash ^= ch.charCodeAt(0);
    hash = Math.imul(hash, 0x01000193) >>> 0;
  }
  return hash % (intervalSeconds * 1000);
}

/** The first of the target's slots strictly after `after` (ms since the epoch). Missed slots are skipped, not caught up. */
export function nextScrapeAt(targetId: number, intervalSeconds: number, after: number): number {
  const interval = intervalSeconds * 1000;
  const offset = scrapeOffsetMs(targetId, intervalSeconds);
  return (Math.floor((after - offset) / interval) + 1) * interval + offset;
}
