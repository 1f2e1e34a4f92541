import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadConfig, ConfigError } from '../backend/src/config';
import { createDb } from '../backend/src/db';
import { openCluster, type Cluster } from './postgres/cluster';
import { startChild, stopChildren, waitForUrl, type Child } from './run/children';
import { buildFrontendIfStale } from './run/frontend-build';
import { prepareDatabase } from './run/database';
import { ensurePortFree, ensureWritableDataDir, takeStartLock } from './run/preflight';

/**
 * `npm start`: every piece of Brimwatch on loopback, with the demo — a private
 * PostgreSQL, the web server, the collectors, the mail fake, the sign-in
 * provider fake and the demo fleet. Ctrl-C stops them all.
 */
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const log = (line: string) => console.log(`${'[start]'.padEnd(14)} ${line}`);
const began = Date.now();

let config;
try {
  config = loadConfig();
  ensureWritableDataDir(config.dataDir);
} catch (err) {
  console.error(err instanceof ConfigError ? err.message : `Brimwatch cannot start: ${(err as Error).message}`);
  process.exit(1);
}

const tmpDir = path.join(config.dataDir, 'tmp');
fs.mkdirSync(tmpDir, { recursive: true });
const childEnv = { ...process.env, TMPDIR: tmpDir, DATA_DIR: config.dataDir, NODE_ENV: config.NODE_ENV };
const tsx = (file: string) => [process.execPath, ['--import', 'tsx', path.join(root, file)]] as const;

let releaseLock: (() => void) | undefined;
let cluster: Cluster | undefined;
const children: Child[] = [];
let stopping = false;

async function shutdown(code: number): Promise<void> {
  if (stopping) return;
  stopping = true;
  log('Stopping every piece...');
  await stopChildren(children);
  try {
    cluster?.stop();
  } catch (err) {
    console.error(`PostgreSQL did not stop cleanly: ${(err as Error).message}`);
  }
  releaseLock?.();
  log('Stopped.');
  process.exit(code);
}
process.on('SIGINT', () => void shutdown(0));
process.on('SIGTERM', () => void shutdown(0));

const onChildExit = (name: string, code: number | null) => {
  console.error(`${'[start]'.padEnd(14)} ${name} stopped unexpectedly (exit ${code}); stopping the rest.`);
  void shutdown(1);
};

try {
  releaseLock = takeStartLock(config.dataDir);
  const ports: [number, string][] = [
    [config.PORT, 'PORT'],
    [config.SMTP_PORT, 'SMTP_PORT'],
    [config.MAIL_UI_PORT, 'MAIL_UI_PORT'],
    [config.OIDC_PORT, 'OIDC_PORT'],
    [config.COLLECTOR_METRICS_PORT, 'COLLECTOR_METRICS_PORT'],
  ];
  if (!config.DATABASE_URL) ports.push([config.PGPORT, 'PGPORT']);
  for (const [port, name] of ports) await ensurePortFree(config.HOST, port, name);

  if (!config.DATABASE_URL) {
    cluster = openCluster({ dataDir: config.dataDir, name: 'pg', host: config.PGHOST, port: config.PGPORT, user: config.PGUSER, log });
    cluster.start();
    cluster.createDatabase(config.PGDATABASE);
    log(`PostgreSQL is up on ${config.PGHOST}:${config.PGPORT} (data in ${cluster.dir})`);
  }
  const db = createDb(config.databaseUrl, { max: 2 });
  await prepareDatabase(db, path.join(root, 'seeds'), log, config.DEMO);
  await db.destroy();
  buildFrontendIfStale(root, log);

  const mailDir = path.join(config.dataDir, 'mail');
  fs.mkdirSync(mailDir, { recursive: true });
  const maildev = path.join(root, 'node_modules', 'maildev', 'dist', 'bin', 'maildev.js');
  children.push(
    startChild('mail', process.execPath, [maildev, '--smtp', String(config.SMTP_PORT), '--ip', config.HOST, '--web', String(config.MAIL_UI_PORT), '--web-ip', config.HOST, '--mail-directory', mailDir, '--silent'], childEnv, onChildExit),
  );
  children.push(startChild('sign-in', ...tsx('ops/oidc-provider/main.ts'), childEnv, onChildExit));
  children.push(startChild('web', ...tsx('backend/src/main.ts'), childEnv, onChildExit));
  children.push(startChild('collectors', ...tsx('collectors/main.ts'), childEnv, onChildExit));
  if (config.DEMO && fs.existsSync(path.join(root, 'ops', 'demo-fleet', 'main.ts'))) {
    children.push(startChild('demo-fleet', ...tsx('ops/demo-fleet/main.ts'), childEnv, onChildExit));
  }

  const mailUi = `http://${config.HOST}:${config.MAIL_UI_PORT}`;
  await Promise.all([
    waitForUrl('The web server', `${config.publicUrl}/api/health`),
    waitForUrl('The mail fake', mailUi),
    waitForUrl('The sign-in provider', `${config.oidcIssuer}/.well-known/openid-configuration`),
  ]);
  const seconds = ((Date.now() - began) / 1000).toFixed(1);
  console.log(`
  Brimwatch is running (ready in ${seconds} s). Ctrl-C stops everything.

    Brimwatch            ${config.publicUrl}
    Sign-in provider     ${config.oidcIssuer}   (demo logins: admin, sre, owner, responder, viewer; password: demo)
    Mail inbox (fake)    ${mailUi}   (SMTP on ${config.HOST}:${config.SMTP_PORT})
    Collector metrics    http://${config.HOST}:${config.COLLECTOR_METRICS_PORT}/metrics
    PostgreSQL           ${config.databaseUrl}
    Data folder          ${config.dataDir}
`);
} catch (err) {
  console.error(`${'[start]'.padEnd(14)} Brimwatch cannot start: ${(err as Error).message}`);
  await shutdown(1);
}
