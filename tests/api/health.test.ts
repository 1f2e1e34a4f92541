import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../backend/src/app';
import { createDb } from '../../backend/src/db';
import { createTestDatabase, testConfig, type TestDatabase } from '../setup/database';

describe('GET /api/health', () => {
  let tdb: TestDatabase;
  beforeAll(async () => {
    tdb = await createTestDatabase();
  });
  afterAll(async () => {
    await tdb.drop();
  });

  it('when the database answers, then it reports ok', async () => {
    const app = createApp({ config: testConfig(tdb.url), db: tdb.db });
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'ok', database: 'up' });
  });

  it('when the database does not answer, then it reports 503 with a reason', async () => {
    // Nothing listens on port 1 of loopback: the pool's connection is refused.
    const deadDb = createDb('postgres://brimwatch@127.0.0.1:1/nothing');
    const app = createApp({ config: testConfig(tdb.url), db: deadDb, log: () => {} });
    const res = await request(app).get('/api/health');
    await deadDb.destroy();
    expect(res.status).toBe(503);
    expect(res.body.status).toBe('down');
    expect(res.body.reason).toMatch(/database does not answer/);
  });

  it('when an unknown API route is asked for, then it answers 404 in the error shape', async () => {
    const app = createApp({ config: testConfig(tdb.url), db: tdb.db });
    const res = await request(app).get('/api/nowhere');
    expect(res.status).toBe(404);
    expect(res.body.error).toMatchObject({ code: 'not_found' });
  });
});
