import type { Knex } from 'knex';
import { severity, type HealthLevel } from '../backend/src/maths';
import { evaluateSketchAlerts, type SketchJudged } from '../backend/src/alerts/evaluate';
import type { Clock } from '../backend/src/alerts/clock';
import type { Judgement } from './judge';

export type AlertsHook = (trx: Knex.Transaction, judged: SketchJudged[]) => Promise<void>;

/** The alerts engine's own entry point, reading the system clock. */
export const alertsHookWith = (clock?: Clock): AlertsHook => (trx, judged) => evaluateSketchAlerts(trx, judged, clock);

interface InstanceRow {
  sketch_id: number;
  level: HealthLevel;
  /** What the verdict and the alerts read of an instance's judgement. */
  judgement: Pick<Judgement, 'load' | 'watchLine'> | null;
}

/** A sketch is as bad as its worst instance; among equals, the one with the higher load speaks for it. */
export function sketchVerdicts(instances: InstanceRow[], at: Date): SketchJudged[] {
  const worst = new Map<number, InstanceRow>();
  for (const row of instances) {
    const current = worst.get(Number(row.sketch_id));
    const worse =
      !current ||
      severity(row.level) > severity(current.level) ||
      (severity(row.level) === severity(current.level) && (row.judgement?.load ?? -1) > (current.judgement?.load ?? -1));
    if (worse) worst.set(Number(row.sketch_id), row);
  }
  // Judged now: a sketch that turned stale has an old last attempt, but the news is today's.
  return [...worst.entries()].map(([sketchId, row]) => ({ sketchId, level: row.level, judgement: row.judgement, at }));
}

/**
 * Re-judges each sketch from its instances' latest word and hands the result
 * to the alerts, inside the caller's transaction. The alerts engine finds the
 * few sketches whose alert would move in one read and makes its changes under
 * a savepoint of its own: a fault there is rolled back to it, logged here and
 * retried with the next round instead of throwing away the readings just stored.
 */
export async function rejudgeSketches(trx: Knex.Transaction, sketchIds: number[], hook: AlertsHook, log: (message: string) => void, at = new Date()): Promise<SketchJudged[]> {
  if (sketchIds.length === 0) return [];
  // Only the two figures read, not each whole judgement: a batch re-judges every instance of the sketches it touched.
  const { rows } = await trx.raw(
    `select sketch_id, level, judgement is not null as judged, (judgement->>'load')::float8 as load, (judgement->>'watchLine')::float8 as watch_line
     from target_status where sketch_id = any(?::bigint[])`,
    [sketchIds],
  );
  const instances: InstanceRow[] = rows.map((r: { sketch_id: number; level: HealthLevel; judged: boolean; load: number; watch_line: number }) => ({
    sketch_id: r.sketch_id,
    level: r.level,
    judgement: r.judged ? { load: r.load, watchLine: r.watch_line } : null,
  }));
  const judged = sketchVerdicts(instances, at);
  try {
    await hook(trx, judged);
  } catch (err) {
    log(`alerts not evaluated for sketches ${sketchIds.slice(0, 10).join(', ')}: ${err instanceof Error ? err.message : String(err)}`);
  }
  return judged;
}
