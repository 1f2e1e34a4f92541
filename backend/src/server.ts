import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { closeApp, createApp } from './app';
import type { Config } from './config';
import { createDb, type Db } from './db';

export interface RunningServer {
  url: string;
  port: number;
  db: Db;
  stop(): Promise<void>;
}

/** Starts the web server; `PORT=0` (tests) picks a free port. */
export async function start(config: Config, options: { db?: Db; log?: (line: string) => void } = {}): Promise<RunningServer> {
  const db = options.db ?? createDb(config.databaseUrl);
  const app = createApp({ config, db, log: options.log });
  const server = http.createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.PORT, config.HOST, () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  const host = config.HOST.includes(':') ? `[${config.HOST}]` : config.HOST;
  return {
    url: `http://${host}:${port}`,
    port,
    db,
    async stop() {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await closeApp(app);
      if (!options.db) await db.destroy();
    },
  };
}
