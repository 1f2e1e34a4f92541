import type { Knex } from 'knex';
import { claimDueTargets } from '../../collectors/claim';
import type { FinishedScrape } from '../../collectors/reading-rows';
import { scrapeTarget, scrapeTimeoutMs } from '../../collectors/scrape';
import type { AlertsHook } from '../../collectors/sketch-level';
import { storeBatch } from '../../collectors/store';

let made = 0;

export interface SketchTermsInput {
  errorBudget?: number;
  confidence?: number;
  watchLine?: number;
  leadTimeDays?: number;
  intervalSeconds?: number;
}

/** A team, a service and a sketch with one target per URL; returns the ids. */
export async function addSketch(db: Knex, urls: string[], terms: SketchTermsInput = {}, label = 'limiter'): Promise<{ sketchId: number; targetIds: number[] }> {
  const n = ++made;
  const [team] = await db('teams').insert({ slug: `team-${n}`, name: `Team ${n}` }).returning('id');
  const [service] = await db('services').insert({ team_id: team.id, name: `checkout-${n}` }).returning('id');
  const [sketch] = await db('sketches')
    .insert({
      service_id: service.id,
      team_id: team.id,
      name: label,
      error_budget: terms.errorBudget ?? 100,
      confidence: terms.confidence ?? 0.99,
      watch_line: terms.watchLine ?? 0.8,
      lead_time_days: terms.leadTimeDays ?? 7,
      scrape_interval_seconds: terms.intervalSeconds ?? 30,
    })
    .returning('id');
  const targets = await db('targets')
    .insert(urls.map((url, i) => ({ sketch_id: sketch.id, url, instance: `replica-${i}` })))
    .returning('id');
  return { sketchId: Number(sketch.id), targetIds: targets.map((t: { id: number }) => Number(t.id)) };
}

export const noAlerts: AlertsHook = async () => undefined;

/**
 * One round of the collector's pipeline, in the test's own process: claim
 * everything due, scrape it, store it. The loop does the same continuously.
 */
export async function collectRound(db: Knex, options: { owner?: string; alertsHook?: AlertsHook; maxBytes?: number } = {}) {
  const owner = options.owner ?? 'test-collector';
  const claimed = await claimDueTargets(db, owner, 1000, 20);
  const finished: FinishedScrape[] = await Promise.all(
    claimed.map(async (target) => {
      const takenAt = new Date();
      const outcome = await scrapeTarget(target.url, target.sketchLabel, scrapeTimeoutMs(target.intervalSeconds), {
        allowlist: '127.0.0.0/8',
        maxBytes: options.maxBytes ?? 64 * 1024,
        userAgent: 'brimwatch-test',
      });
      return { target, outcome, takenAt };
    }),
  );
  const logs: string[] = [];
  const stored = await storeBatch(db, finished, { owner, historyReadings: 60, alertsHook: options.alertsHook ?? noAlerts, log: (m) => logs.push(m) });
  return { claimed, stored, logs };
}

/** Makes every target due now, as if its next slot had come. */
export const makeAllDue = (db: Knex) => db('targets').update({ next_scrape_at: db.raw("now() - interval '1 millisecond'") });
