import { loadConfig } from './config';
import { start } from './server';

/** The web server process, as started by ops/start.ts (or by a process manager in production). */
const config = loadConfig();
const server = await start(config);
console.log(`[web] listening on ${server.url}`);

let stopping = false;
const shutdown = async () => {
  if (stopping) return;
  stopping = true;
  await server.stop();
  process.exit(0);
};
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
