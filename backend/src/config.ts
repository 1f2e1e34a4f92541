import path from 'node:path';
import { z } from 'zod';
import { validate as validCron } from 'node-cron';

/**
 * Every setting Brimwatch reads, in one place, read once at start.
 * Each key has an environment variable of the same name and a default that
 * works on a developer's machine (everything on loopback).
 */
const port = (name: string, fallback: number, lowest = 1) => {
  const rule = `${name} must be a whole number between ${lowest} and 65535`;
  return z.coerce.number({ error: rule }).int(rule).min(lowest, rule).max(65535, rule).default(fallback);
};

const positiveInt = (name: string, fallback: number) =>
  z.coerce.number({ error: `${name} must be a positive whole number` }).int(`${name} must be a positive whole number`).positive(`${name} must be a positive whole number`).default(fallback);

const flag = (fallback: boolean) =>
  z.enum(['true', 'false', '1', '0', 'yes', 'no']).default(fallback ? 'true' : 'false').transform((v) => ['true', '1', 'yes'].includes(v));

const bandRule = 'ALERT_CLEAR_BAND must be a fraction from 0 to 0.5 of capacity, such as 0.05 for 5 points';

const schema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: port('PORT', 8080, 0), // 0 picks a free port (tests)
  PUBLIC_URL: z.url('PUBLIC_URL must be a full URL such as http://127.0.0.1:8080').optional(),
  DATA_DIR: z.string().min(1).default('./.data'),
  DATABASE_URL: z.string().optional(),
  PGHOST: z.string().min(1).default('127.0.0.1'),
  PGPORT: port('PGPORT', 54329),
  PGUSER: z.string().min(1).default('brimwatch'),
  PGDATABASE: z.string().min(1).default('brimwatch'),
  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: port('SMTP_PORT', 1025),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  SMTP_FROM: z.string().min(3).default('Brimwatch <brimwatch@brimwatch.test>'),
  SMTP_SECURE: flag(false),
  MAIL_UI_PORT: port('MAIL_UI_PORT', 1080),
  OIDC_PORT: port('OIDC_PORT', 9400),
  OIDC_ISSUER: z.url('OIDC_ISSUER must be the provider URL, e.g. http://127.0.0.1:9400').optional(),
  OIDC_CLIENT_ID: z.string().min(1).default('brimwatch'),
  OIDC_CLIENT_SECRET: z.string().min(1).default('brimwatch-local-secret'),
  SESSION_SECRET: z.string().min(16, 'SESSION_SECRET must be at least 16 characters').default('brimwatch-local-session-secret'),
  SESSION_IDLE_HOURS: positiveInt('SESSION_IDLE_HOURS', 8),
  SESSION_ABSOLUTE_HOURS: positiveInt('SESSION_ABSOLUTE_HOURS', 24),
  SIGN_IN_RATE_PER_MINUTE: positiveInt('SIGN_IN_RATE_PER_MINUTE', 20),
  TOKEN_RATE_PER_MINUTE: positiveInt('TOKEN_RATE_PER_MINUTE', 30),
  TOKEN_DEFAULT_DAYS: positiveInt('TOKEN_DEFAULT_DAYS', 90),
  TOKEN_MAX_DAYS: positiveInt('TOKEN_MAX_DAYS', 365),
  COLLECTOR_METRICS_PORT: port('COLLECTOR_METRICS_PORT', 9464, 0), // 0 picks a free port (tests, several collectors on one host)
  COLLECTOR_CONCURRENCY: positiveInt('COLLECTOR_CONCURRENCY', 64),
  COLLECTOR_BATCH_SIZE: positiveInt('COLLECTOR_BATCH_SIZE', 200),
  COLLECTOR_LEASE_MARGIN_SECONDS: positiveInt('COLLECTOR_LEASE_MARGIN_SECONDS', 20),
  COLLECTOR_HISTORY_READINGS: positiveInt('COLLECTOR_HISTORY_READINGS', 60),
  COLLECTOR_ID: z.string().min(1).optional(),
  DEMO_FLEET_PORT: port('DEMO_FLEET_PORT', 9500),
  TARGET_ALLOWLIST: z.string().default('127.0.0.0/8,::1/128,localhost'),
  SCRAPE_MAX_BYTES: positiveInt('SCRAPE_MAX_BYTES', 1024 * 1024),
  UPLOAD_MAX_BYTES: positiveInt('UPLOAD_MAX_BYTES', 64 * 1024 * 1024),
  UPLOAD_IDLE_SECONDS: positiveInt('UPLOAD_IDLE_SECONDS', 30),
  RAW_RETENTION_DAYS: positiveInt('RAW_RETENTION_DAYS', 14),
  // Thirteen months, so a chart can compare a month with the same month a year before (common practice for capacity reviews).
  ROLLUP_RETENTION_DAYS: positiveInt('ROLLUP_RETENTION_DAYS', 400),
  // How old the fleet table's snapshot may be before the web server reads it again (0: read on every request).
  FLEET_SNAPSHOT_MS: z.coerce.number({ error: 'FLEET_SNAPSHOT_MS must be a whole number of milliseconds, 0 or more' }).int('FLEET_SNAPSHOT_MS must be a whole number of milliseconds, 0 or more').min(0, 'FLEET_SNAPSHOT_MS must be a whole number of milliseconds, 0 or more').default(2000),
  DEMO: flag(true),
  // Alerts and e-mail (backend/src/alerts/): when to repeat, escalate and resolve, and how the outbox retries.
  ESCALATION_DELAY_MINUTES: positiveInt('ESCALATION_DELAY_MINUTES', 30),
  REPEAT_BRIMMED_HOURS: positiveInt('REPEAT_BRIMMED_HOURS', 4),
  REPEAT_UNREACHABLE_HOURS: positiveInt('REPEAT_UNREACHABLE_HOURS', 4),
  REPEAT_STALE_HOURS: positiveInt('REPEAT_STALE_HOURS', 12),
  REPEAT_WATCH_HOURS: positiveInt('REPEAT_WATCH_HOURS', 24),
  ALERT_SETTLING_MINUTES: positiveInt('ALERT_SETTLING_MINUTES', 15),
  ALERT_CLEAR_BAND: z.coerce.number({ error: bandRule }).min(0, bandRule).max(0.5, bandRule).default(0.05),
  MAIL_RETRY_BASE_SECONDS: positiveInt('MAIL_RETRY_BASE_SECONDS', 30),
  MAIL_RETRY_MAX_MINUTES: positiveInt('MAIL_RETRY_MAX_MINUTES', 30),
  DIGEST_CRON: z.string().refine((v) => validCron(v), 'DIGEST_CRON must be a cron expression such as "0 8 * * *" (08:00 every day)').default('0 8 * * *'),
});

export type Config = z.infer<typeof schema> & {
  publicUrl: string;
  oidcIssuer: string;
  dataDir: string;
  databaseUrl: string;
};

export class ConfigError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ConfigError';
  }
}

/** Reads and checks the environment; a bad value stops the start with the variable's name and the fix. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const present = Object.fromEntries(Object.entries(env).filter(([, v]) => v !== undefined && v !== ''));
  const parsed = schema.safeParse(present);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => {
      const name = String(issue.path[0]);
      const got = env[name] === undefined ? '' : ` (got '${env[name]}')`;
      return `  ${name}: ${issue.message}${got}. Fix: unset ${name} to use its default, or set it to a valid value.`;
    });
    throw new ConfigError(`Brimwatch cannot start, the configuration is wrong:\n${lines.join('\n')}`);
  }
  const c = parsed.data;
  if (c.ROLLUP_RETENTION_DAYS < c.RAW_RETENTION_DAYS) {
    throw new ConfigError(
      `Brimwatch cannot start, the configuration is wrong:\n  ROLLUP_RETENTION_DAYS: must be at least RAW_RETENTION_DAYS (${c.RAW_RETENTION_DAYS}), since charts of ranges older than the raw readings come from the hourly rollups (got '${c.ROLLUP_RETENTION_DAYS}'). Fix: raise ROLLUP_RETENTION_DAYS, or lower RAW_RETENTION_DAYS.`,
    );
  }
  const urlHost = c.HOST.includes(':') ? `[${c.HOST}]` : c.HOST;
  return {
    ...c,
    publicUrl: (c.PUBLIC_URL ?? `http://${urlHost}:${c.PORT}`).replace(/\/$/, ''),
    oidcIssuer: (c.OIDC_ISSUER ?? `http://${urlHost}:${c.OIDC_PORT}`).replace(/\/$/, ''),
    dataDir: path.resolve(c.DATA_DIR),
    databaseUrl: c.DATABASE_URL ?? `postgres://${c.PGUSER}@${c.PGHOST}:${c.PGPORT}/${c.PGDATABASE}`,
  };
}
