import { performance } from 'node:perf_hooks';
import { readSketch, type SketchSample } from './exposition/read-sketch';
import { fetchBody, type FetchFailureKind } from './fetch-body';
import { checkTarget, type Allowlist, type Resolver } from './target-safety';

/** Few enough kinds to label a metric by; the reason carries the detail. */
export type FailureKind = FetchFailureKind | 'not allowed' | 'host not found' | 'parse error' | 'missing metric' | 'bad value';

export type ScrapeOutcome =
  | { ok: true; sample: SketchSample; scrapeMs: number }
  | { ok: false; kind: FailureKind; reason: string; scrapeMs: number };

export interface ScrapeSettings {
  allowlist: Allowlist | string;
  maxBytes: number;
  userAgent: string;
  resolve?: Resolver;
}

/** A scrape must end before the next one is due; ten seconds is plenty for a page of gauges. */
export function scrapeTimeoutMs(intervalSeconds: number): number {
  return Math.min(10_000, Math.round(0.8 * intervalSeconds * 1000));
}

function readFailureKind(reason: string): FailureKind {
  if (reason.startsWith('parse error')) return 'parse error';
  if (reason.startsWith('missing')) return 'missing metric';
  return 'bad value';
}

/** Checks the target, fetches it and reads one sketch; every way it can go wrong ends as a reason, never a throw. */
export async function scrapeTarget(url: string, sketchLabel: string, timeoutMs: number, settings: ScrapeSettings): Promise<ScrapeOutcome> {
  const started = performance.now();
  const elapsed = () => Math.round((performance.now() - started) * 10) / 10;
  try {
    let timer: NodeJS.Timeout | undefined;
    const resolving = new Promise<'late'>((resolve) => (timer = setTimeout(() => resolve('late'), timeoutMs)));
    const check = await Promise.race([checkTarget(url, settings.allowlist, settings.resolve), resolving]).finally(() => clearTimeout(timer));
    if (check === 'late') return { ok: false, kind: 'timeout', reason: `timeout after ${timeoutMs / 1000} s (resolving the host)`, scrapeMs: elapsed() };
    if (!check.ok) return { ok: false, kind: check.kind, reason: check.reason, scrapeMs: elapsed() };
    const remaining = Math.max(1, timeoutMs - (performance.now() - started));
    const fetched = await fetchBody(check.url, check.addresses, { timeoutMs: remaining, maxBytes: settings.maxBytes, userAgent: settings.userAgent });
    if (!fetched.ok) {
      const reason = fetched.kind === 'timeout' ? fetched.reason.replace(/after [\d.]+ s/, `after ${timeoutMs / 1000} s`) : fetched.reason;
      return { ok: false, kind: fetched.kind, reason, scrapeMs: elapsed() };
    }
    const read = readSketch(fetched.body, fetched.contentType, sketchLabel);
    if (!read.ok) return { ok: false, kind: readFailureKind(read.reason), reason: read.reason, scrapeMs: elapsed() };
    return { ok: true, sample: read.value, scrapeMs: elapsed() };
  } catch (err) {
    return { ok: false, kind: 'network', reason: `scrape failed: ${err instanceof Error ? err.message : String(err)}`, scrapeMs: elapsed() };
  }
}
