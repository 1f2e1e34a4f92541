import os from 'node:os';
import { randomBytes } from 'node:crypto';
import cron from 'node-cron';
import { loadConfig } from '../backend/src/config';
import { createDb } from '../backend/src/db';
import { recordHeartbeat, type CollectorIdentity } from './heartbeat';

/** The collectors process: scheduled work, on node-cron ticks, sharing the database with the web server. */
const config = loadConfig();
const db = createDb(config.databaseUrl, { max: 4 });
const me: CollectorIdentity = { id: `${os.hostname()}-${process.pid}-${randomBytes(3).toString('hex')}`, host: os.hostname(), pid: process.pid, startedAt: new Date() };

const beat = async () => {
  try {
    await recordHeartbeat(db, me);
  } catch (err) {
    console.error(`[collectors] heartbeat not recorded: ${err instanceof Error ? err.message : String(err)}`);
  }
};

await beat();
console.log(`[collectors] ${me.id} started; heartbeat every 10 s`);
const heartbeat = cron.schedule('*/10 * * * * *', beat, { name: 'heartbeat', noOverlap: true });

let stopping = false;
const shutdown = async () => {
  if (stopping) return;
  stopping = true;
  await heartbeat.destroy();
  await db.destroy();
  process.exit(0);
};
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
