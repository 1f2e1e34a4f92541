import type { Config } from '../config';
import { loadConfig } from '../config';
import type { AlertLevel } from '../api-types';

export const ALERT_LEVELS: readonly AlertLevel[] = ['brimmed', 'unreachable', 'stale', 'watch'];

export interface AlertSettings {
  /** How long after the last notice an unchanged, unacknowledged alert is told again, per level. */
  repeatMs: Record<AlertLevel, number>;
  /** A brimmed alert still open (not acknowledged) this long after it brimmed also goes to the escalation address. */
  escalationDelayMs: number;
  /** How long a sketch must stay calmly clear before its alert resolves. */
  settlingMs: number;
  /** How far below a line (as a share of capacity) the load must fall before a live alert lets go of it. */
  clearBand: number;
  retryBaseMs: number;
  retryMaxMs: number;
  publicUrl: string;
  from: string;
}

const HOUR = 3_600_000;
const MINUTE = 60_000;

export function alertSettingsFrom(config: Config): AlertSettings {
  return {
    repeatMs: {
      brimmed: config.REPEAT_BRIMMED_HOURS * HOUR,
      unreachable: config.REPEAT_UNREACHABLE_HOURS * HOUR,
      stale: config.REPEAT_STALE_HOURS * HOUR,
      watch: config.REPEAT_WATCH_HOURS * HOUR,
    },
    escalationDelayMs: config.ESCALATION_DELAY_MINUTES * MINUTE,
    settlingMs: config.ALERT_SETTLING_MINUTES * MINUTE,
    clearBand: config.ALERT_CLEAR_BAND,
    retryBaseMs: config.MAIL_RETRY_BASE_SECONDS * 1000,
    retryMaxMs: config.MAIL_RETRY_MAX_MINUTES * MINUTE,
    publicUrl: config.publicUrl,
    from: config.SMTP_FROM,
  };
}

let fromEnvironment: AlertSettings | undefined;

/** The settings of this process's environment, read once (the hook is called without them). */
export function defaultAlertSettings(): AlertSettings {
  fromEnvironment ??= alertSettingsFrom(loadConfig());
  return fromEnvironment;
}
