import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeApp, createApp } from '../../../backend/src/app';
import { startProvider } from '../../../ops/oidc-provider/provider';
import { createTestDatabase, testConfig, type TestDatabase } from '../../setup/database';
import { jsonOf, signInThroughProvider, startSignInWorld, step, type SignInWorld } from './sign-in-harness';

describe('session lifetimes and sign-in limits', () => {
  let world: SignInWorld;
  beforeAll(async () => {
    world = await startSignInWorld({ SIGN_IN_RATE_PER_MINUTE: '5' });
  });
  afterAll(async () => {
    await world.close();
  });

  it('when a session is older than the absolute limit, then it no longer signs anyone in, however active it was', async () => {
    const { jar } = await signInThroughProvider(world, 'viewer');
    expect((await step(jar, `${world.appUrl}/api/auth/me`)).status).toBe(200);
    const day = 24 * 3600_000;
    await world.tdb.db.raw(`update web_sessions set sess = jsonb_set(sess::jsonb, '{signedInAt}', to_jsonb(?::bigint))::json`, [Date.now() - day - 60_000]);
    expect((await step(jar, `${world.appUrl}/api/auth/me`)).status).toBe(401);
    expect(await world.tdb.db('web_sessions').count('sid as n').first()).toEqual({ n: 0 });
  });

  it('when a session has been idle past its expiry, then it is gone', async () => {
    const { jar } = await signInThroughProvider(world, 'viewer');
    await world.tdb.db('web_sessions').update({ expire: new Date(Date.now() - 1000) });
    expect((await step(jar, `${world.appUrl}/api/auth/me`)).status).toBe(401);
  });

  it('when sign-in is started too often from one address, then it answers 429 saying when to retry', async () => {
    const statuses: number[] = [];
    let last: Response | undefined;
    for (let i = 0; i < 6; i++) {
      last = await fetch(`${world.appUrl}/api/auth/login`, { redirect: 'manual' });
      statuses.push(last.status);
    }
    expect(statuses).toContain(429);
    expect((await jsonOf(last!)).error.message).toMatch(/wait a minute/);
  });
});

describe('when the sign-in provider does not answer', () => {
  let tdb: TestDatabase;
  beforeAll(async () => {
    tdb = await createTestDatabase();
  });
  afterAll(async () => {
    await tdb.drop();
  });

  it('then sign-in answers 503 naming the provider, and works once it answers (discovery is retried)', async () => {
    // Learn a free port, then leave it empty: the provider is "down".
    const probe = await startProvider({ host: '127.0.0.1', port: 0, clients: [] });
    const port = new URL(probe.issuer).port;
    await probe.close();
    const app = createApp({ config: testConfig(tdb.url, { OIDC_ISSUER: probe.issuer, PUBLIC_URL: 'http://127.0.0.1:8080' }), db: tdb.db, log: () => {} });
    try {
      const down = await request(app).get('/api/auth/login');
      expect(down.status).toBe(503);
      expect(down.body.error).toMatchObject({ code: 'sign_in_unavailable' });
      expect(down.body.error.message).toContain(`${probe.issuer} does not answer`);

      const provider = await startProvider({ host: '127.0.0.1', port: Number(port), clients: [{ clientId: 'brimwatch', clientSecret: 'brimwatch-local-secret', redirectUris: ['http://127.0.0.1:8080/api/auth/callback'] }] });
      try {
        const up = await request(app).get('/api/auth/login');
        expect(up.status).toBe(303);
        expect(up.headers.location).toMatch(new RegExp(`^${probe.issuer}/auth\\?`));
      } finally {
        await provider.close();
      }
    } finally {
      await closeApp(app);
    }
  });
});
