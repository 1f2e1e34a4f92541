import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import express from 'express';
import helmet from 'helmet';
import type { Config } from './config';
import type { Db } from './db';
import { errorHandler, notFoundRoute } from './http/errors';
import { healthRoutes } from './routes/health';
import { sizingRoutes } from './routes/sizing';
import { refuseCrossSite } from './auth/csrf';
import { identifyCaller } from './auth/identify';
import { createSessions } from './auth/session';
import { signInClient } from './auth/oidc-client';
import { authRoutes } from './routes/auth';
import { auditRoutes } from './routes/audit';
import { teamRoutes } from './routes/teams';
import { tokenRoutes } from './routes/tokens';
import { userRoutes } from './routes/users';
import { sketchRoutes } from './routes/sketches';
import { metricsRoutes } from './routes/metrics';
import { fleetSnapshot } from './services/sketches/fleet-snapshot';
import { fleetRows } from './queries/fleet';
import { dumpRoutes } from './routes/dumps';
import { historyRoutes } from './routes/history';
import { importRoutes } from './routes/imports';
import { alertRoutes } from './routes/alerts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
export const spaDir = path.join(root, 'frontend', 'dist');
const version = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8')).version as string;

const closers = new WeakMap<express.Express, () => Promise<void>>();

/** Releases what the app holds besides the database (the session store's pruning timer). */
export function closeApp(app: express.Express): Promise<void> {
  return closers.get(app)?.() ?? Promise.resolve();
}

export interface AppDeps {
  config: Config;
  db: Db;
  log?: (line: string) => void;
}

/** The web application: the JSON API under /api and the built single-page front end for everything else. */
export function createApp({ config, db, log = console.error }: AppDeps): express.Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'", "'unsafe-inline'"], // Quasar and uPlot set inline styles on elements
          imgSrc: ["'self'", 'data:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          formAction: ["'self'", config.oidcIssuer],
          frameAncestors: ["'none'"],
          upgradeInsecureRequests: null,
        },
      },
    }),
  );
  app.use(express.json({ limit: '1mb' }));

  const sessions = createSessions(config, db);
  closers.set(app, sessions.close);
  const api = express.Router();
  // Who is calling, before any route: every route then declares who may (auth/permission.ts).
  api.use(refuseCrossSite(config.publicUrl), sessions.middleware, identifyCaller(db, config.SESSION_ABSOLUTE_HOURS * 3600_000));
  api.use(healthRoutes(db, version), sizingRoutes());
  api.use(authRoutes(config, db, signInClient(config)), userRoutes(db), teamRoutes(db), tokenRoutes(config, db), auditRoutes(db));
  const fleet = fleetSnapshot(() => fleetRows(db), config.FLEET_SNAPSHOT_MS, log);
  api.use(sketchRoutes(db, config, fleet));
  api.use(dumpRoutes(db, config), historyRoutes(db), importRoutes(db, config));
  api.use(alertRoutes(db));
  api.use(notFoundRoute);
  app.use('/api', api);
  app.use(metricsRoutes(db, config, fleet));

  app.use(express.static(spaDir, { index: false, maxAge: '1h' }));
  app.get(/^(?!\/api\/).*/, (_req, res, next) => {
    const index = path.join(spaDir, 'index.html');
    if (!fs.existsSync(index)) {
      res.status(503).type('text/plain').send('The front end is not built yet: run `npm run build` (npm start does it for you).');
      return;
    }
    res.sendFile(index, (err) => err && next(err));
  });
  app.use(errorHandler(log));
  return app;
}
