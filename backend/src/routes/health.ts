import { Router } from 'express';
import { allow } from '../auth/permission';
import { databaseAnswers, type Db } from '../db';

/** Public: tells a load balancer, the start script and the shell whether Brimwatch can serve. */
export function healthRoutes(db: Db, version: string): Router {
  const router = Router();
  router.get('/health', allow('public'), async (_req, res) => {
    const database = await databaseAnswers(db);
    if (database.up) {
      res.json({ status: 'ok', database: 'up', version });
    } else {
      res.status(503).json({ status: 'down', database: 'down', reason: `the database does not answer: ${database.reason}`, version });
    }
  });
  return router;
}
