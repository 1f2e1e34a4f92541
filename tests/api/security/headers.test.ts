import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeApp, createApp } from '../../../backend/src/app';
import { hashTokenSecret, newTokenSecret, tokenPrefix } from '../../../backend/src/tokens/token-secret';
import { createTestDatabase, testConfig, type TestDatabase } from '../../setup/database';
import { startSignInWorld, type SignInWorld } from '../auth/sign-in-harness';

/** The Content-Security-Policy as a map of directive → sources. */
function policyOf(header: string | undefined): Map<string, string[]> {
  return new Map((header ?? '').split(';').map((d) => d.trim().split(/\s+/)).filter((d) => d[0]).map(([name, ...sources]) => [name, sources]));
}

describe('security headers', () => {
  let t: TestDatabase;
  beforeAll(async () => {
    t = await createTestDatabase();
  });
  afterAll(async () => {
    await t?.drop();
  });

  it('when the API or a page is served, then a strict CSP and the other helmet headers come with it, and nothing names the server', async () => {
    const app = createApp({ config: testConfig(t.url), db: t.db, log: () => {} });
    try {
      for (const path of ['/api/health', '/', '/fleet', '/api/no-such-route']) {
        const res = await request(app).get(path);
        const csp = policyOf(res.headers['content-security-policy']);
        expect(csp.get('default-src'), path).toEqual(["'self'"]);
        // Scripts only from Brimwatch itself: no inline script, no eval, no other host.
        expect(csp.get('script-src'), path).toEqual(["'self'"]);
        expect(csp.get('script-src-attr'), path).toEqual(["'none'"]);
        expect(csp.get('object-src'), path).toEqual(["'none'"]);
        expect(csp.get('frame-ancestors'), path).toEqual(["'none'"]);
        expect(csp.get('base-uri'), path).toEqual(["'self'"]);
        expect(csp.get('connect-src'), path).toEqual(["'self'"]);
        // Forms may go to Brimwatch and to the sign-in provider only; no other directive names a host.
        expect(csp.get('form-action'), path).toEqual(["'self'", testConfig(t.url).oidcIssuer]);
        const others = [...csp].filter(([name]) => name !== 'form-action').flatMap(([, sources]) => sources);
        expect(others.filter((s) => s === "'unsafe-eval'" || s === '*' || /^https?:/.test(s)), path).toEqual([]);
        expect(res.headers['x-content-type-options'], path).toBe('nosniff');
        expect(res.headers['x-frame-options'], path).toBe('SAMEORIGIN');
        expect(res.headers['referrer-policy'], path).toBe('no-referrer');
        expect(res.headers['cross-origin-opener-policy'], path).toBe('same-origin');
        expect(res.headers['strict-transport-security'], path).toMatch(/max-age=\d{7,}/);
        expect(res.headers['x-powered-by'], path).toBeUndefined();
      }
    } finally {
      await closeApp(app);
    }
  });

  it('when API tokens are listed, made or revoked too often from one address, then 429 says when to try again, with the standard rate-limit headers', async () => {
    const app = createApp({ config: testConfig(t.url, { TOKEN_RATE_PER_MINUTE: '3' }), db: t.db, log: () => {} });
    const [user] = await t.db('users').insert({ login: 'automation', name: 'Automation', email: 'automation@larkfield.test', role: 'viewer' }).returning('id');
    const secret = newTokenSecret();
    await t.db('api_tokens').insert({ user_id: user.id, label: 'limits', token_hash: hashTokenSecret(secret), prefix: tokenPrefix(secret), role: 'viewer', expires_at: new Date(Date.now() + 86_400_000) });
    try {
      const statuses: number[] = [];
      let last: request.Response | undefined;
      for (let i = 0; i < 5; i++) {
        last = await request(app).get('/api/v1/tokens').set('authorization', `Bearer ${secret}`);
        statuses.push(last.status);
      }
      expect(statuses).toEqual([200, 200, 200, 429, 429]);
      expect(last!.body.error).toMatchObject({ code: 'too_many_requests', message: expect.stringMatching(/more than 3 a minute.*wait a minute/) });
      expect(last!.headers['ratelimit-policy']).toMatch(/q=3/);
      expect(last!.headers['ratelimit']).toMatch(/r=0/);
      // Revoking is limited too: a guessed-at route, counted on the same address.
      const revoke = await request(app).delete('/api/v1/tokens/1').set('authorization', `Bearer ${secret}`);
      expect(revoke.status).toBe(429);
    } finally {
      await closeApp(app);
    }
  });
});

describe('the session cookie', () => {
  let world: SignInWorld;
  beforeAll(async () => {
    world = await startSignInWorld({ PUBLIC_URL: 'https://brimwatch.larkfield.test' });
  });
  afterAll(async () => {
    await world?.close();
  });

  it('when Brimwatch is served over https behind a proxy on the same host, then the cookie is Secure, HttpOnly, SameSite=Lax and for the whole site', async () => {
    const res = await fetch(`${world.appUrl}/api/auth/login`, { redirect: 'manual', headers: { 'x-forwarded-proto': 'https' } });
    expect(res.status).toBe(303);
    const cookie = res.headers.getSetCookie().find((c) => c.startsWith('brimwatch.sid='));
    expect(cookie).toBeDefined();
    const attributes = cookie!.split(';').map((a) => a.trim().toLowerCase());
    expect(attributes).toEqual(expect.arrayContaining(['httponly', 'secure', 'samesite=lax', 'path=/']));
    expect(attributes.some((a) => a.startsWith('expires='))).toBe(true);
  });

  it('when the same https site is reached over plain http, then no session cookie is handed out at all', async () => {
    const res = await fetch(`${world.appUrl}/api/auth/login`, { redirect: 'manual' });
    expect(res.headers.getSetCookie().filter((c) => c.startsWith('brimwatch.sid='))).toEqual([]);
  });
});
