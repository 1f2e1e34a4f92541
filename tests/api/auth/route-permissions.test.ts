import express from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeApp, createApp } from '../../../backend/src/app';
import { allow } from '../../../backend/src/auth/permission';
import { createTestDatabase, testConfig, type TestDatabase } from '../../setup/database';
import { apiRoutes } from './api-routes';

describe('every API route declares who may call it', () => {
  let tdb: TestDatabase;
  let app: express.Express;
  beforeAll(async () => {
    tdb = await createTestDatabase();
    app = createApp({ config: testConfig(tdb.url), db: tdb.db, log: () => {} });
  });
  afterAll(async () => {
    await closeApp(app);
    await tdb.drop();
  });

  it('when the app is built, then the router stack holds API routes (the walk itself works)', () => {
    expect(apiRoutes(app)).toContainEqual(expect.objectContaining({ method: 'GET', path: '/api/health' }));
  });

  it('when the app is built, then no /api route lacks an allow(...) as its first handler', () => {
    const undeclared = apiRoutes(app).filter((r) => r.permission === undefined).map((r) => `${r.method} ${r.path}`);
    expect(undeclared, 'declare each with allow(...) from backend/src/auth/permission.ts, see DEVELOPERS.md').toEqual([]);
  });

  it('when a route is added without a declaration, then the walk reports it', () => {
    const probe = express();
    const api = express.Router();
    const v1 = express.Router();
    v1.get('/declared', allow('viewer'), (_req, res) => void res.end());
    v1.post('/forgotten', (_req, res) => void res.end());
    api.use('/v1', v1);
    probe.use('/api', api);
    const routes = apiRoutes(probe);
    expect(routes.find((r) => r.path === '/api/v1/declared')?.permission).toEqual({ access: 'viewer', sessionOnly: false });
    expect(routes.filter((r) => r.permission === undefined)).toEqual([{ method: 'POST', path: '/api/v1/forgotten', permission: undefined }]);
  });
});
