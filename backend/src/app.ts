import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import express from 'express';
import helmet from 'helmet';
import type { Config } from './config';
import type { Db } from './db';
import { errorHandler, notFoundRoute } from './http/errors';
import { healthRoutes } from './routes/health';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
export const spaDir = path.join(root, 'frontend', 'dist');
const version = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8')).version as string;

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

  const api = express.Router();
  api.use(healthRoutes(db, version));
  api.use(notFoundRoute);
  app.use('/api', api);

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
