import cron from 'node-cron';
import type { Config } from '../config';
import type { Db } from '../db';
import { systemClock } from './clock';
import { queueDigests } from './digest';
import { smtpTransport } from './mail-transport';
import { drainOutbox } from './outbox-sender';
import { reviewAlerts } from './review';
import { alertSettingsFrom } from './settings';

/** How often the sender looks for mail that is due, and how often alerts are reviewed for reminders and held notices. */
const SEND_EVERY = '*/5 * * * * *';
const REVIEW_EVERY = '*/30 * * * * *';

/**
 * The scheduled side of alerts, run inside each collectors process: the
 * outbox sender, the review of live alerts (reminders, escalation, the end of
 * quiet windows, settling without new readings) and the daily digest. Every
 * job takes its rows with SKIP LOCKED or a dedupe key, so any number of
 * collector processes may run them at once.
 */
export function startAlertJobs(db: Db, config: Config, log: (message: string) => void): { stop(): Promise<void> } {
  const settings = alertSettingsFrom(config);
  const transport = smtpTransport(config);
  const guarded = (what: string, job: () => Promise<unknown>) => async () => {
    try {
      await job();
    } catch (err) {
      log(`${what} failed, will try again on the next tick: ${err instanceof Error ? err.message : String(err)}`);
    }
  };
  const send = guarded('mail sender', async () => {
    const { sent, failed } = await drainOutbox(db, transport, systemClock, { from: settings.from, retryBaseMs: settings.retryBaseMs, retryMaxMs: settings.retryMaxMs });
    if (sent || failed) log(`mail: ${sent} sent, ${failed} failed (kept in the outbox for a later try)`);
  });
  const tasks = [
    cron.schedule(SEND_EVERY, send, { name: 'mail-sender', noOverlap: true }),
    cron.schedule(REVIEW_EVERY, guarded('alert review', () => reviewAlerts(db, systemClock, settings)), { name: 'alert-review', noOverlap: true }),
    cron.schedule(config.DIGEST_CRON, guarded('daily digest', () => queueDigests(db, systemClock, settings)), { name: 'daily-digest', noOverlap: true }),
  ];
  return {
    async stop() {
      for (const task of tasks) await task.destroy();
      transport.close();
    },
  };
}
