import type { Knex } from 'knex';
import { holdSchedulerLease } from '../scheduler-election';
import type { AlertsHook } from '../sketch-level';
import { rollUpHours } from './rollups';
import { dropOldReadings, dropOldRollups, ensureDailyPartitions } from './retention';
import { markStaleTargets } from './stale';

export interface MaintenanceSettings {
  owner: string;
  rawRetentionDays: number;
  rollupRetentionDays: number;
  /** How long the scheduler's lease lasts without renewal. */
  leaseSeconds: number;
  alertsHook: AlertsHook;
  log: (message: string) => void;
}

const ROLLUP_EVERY_MS = 60_000;
const RETENTION_EVERY_MS = 3_600_000;

/**
 * The maintenance jobs, run only by the elected scheduler: stale marking on
 * every call, rollups every minute, partitions and retention every hour (and
 * as soon as a process becomes the scheduler).
 */
export function createMaintenance(db: Knex, settings: MaintenanceSettings, clock: () => number = Date.now) {
  let lastRollup = -Infinity;
  let lastRetention = -Infinity;
  let running = false;
  let schedulerSince: Date | undefined;
  return async function maintain(): Promise<{ scheduler: boolean }> {
    if (running) return { scheduler: true };
    running = true;
    try {
      if (!(await holdSchedulerLease(db, settings.owner, settings.leaseSeconds))) {
        lastRollup = lastRetention = -Infinity;
        schedulerSince = undefined;
        return { scheduler: false };
      }
      schedulerSince ??= new Date(clock());
      await markStaleTargets(db, settings.alertsHook, settings.log, schedulerSince);
      const now = clock();
      if (now - lastRollup >= ROLLUP_EVERY_MS) {
        await rollUpHours(db);
        lastRollup = now;
      }
      if (now - lastRetention >= RETENTION_EVERY_MS) {
        await ensureDailyPartitions(db, now, 3, settings.log);
        const { droppedPartitions, deletedRows } = await dropOldReadings(db, now, settings.rawRetentionDays);
        if (droppedPartitions.length > 0 || deletedRows > 0) settings.log(`retention: dropped ${droppedPartitions.join(', ') || 'no partitions'}, deleted ${deletedRows} old readings`);
        const deletedHours = await dropOldRollups(db, now, settings.rollupRetentionDays);
        if (deletedHours > 0) settings.log(`retention: deleted ${deletedHours} hourly rollups older than ${settings.rollupRetentionDays} days`);
        lastRetention = now;
      }
      return { scheduler: true };
    } catch (err) {
      settings.log(`maintenance failed, retrying on the next run: ${err instanceof Error ? err.message : String(err)}`);
      return { scheduler: true };
    } finally {
      running = false;
    }
  };
}
