import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { closeApp, createApp } from '../../../backend/src/app';
import { startProvider, type RunningProvider } from '../../../ops/oidc-provider/provider';
import { createTestDatabase, testConfig, type TestDatabase } from '../../setup/database';

/** Cookies by name, as a browser would send them back to 127.0.0.1 (cookies ignore the port). */
export class CookieJar {
  private cookies = new Map<string, string>();
  take(response: Response): void {
    for (const line of response.headers.getSetCookie()) {
      const [pair, ...attributes] = line.split(';');
      const at = pair.indexOf('=');
      const name = pair.slice(0, at).trim();
      const expired = attributes.some((a) => /^\s*expires=Thu, 01 Jan 1970/i.test(a)) || attributes.some((a) => /^\s*max-age=0\s*$/i.test(a));
      if (expired) this.cookies.delete(name);
      else this.cookies.set(name, pair.slice(at + 1).trim());
    }
  }
  header(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }
  get(name: string): string | undefined {
    return this.cookies.get(name);
  }
}

/** One step as a browser would take it: send the jar's cookies, keep what comes back, never follow redirects by itself. */
export async function step(jar: CookieJar, url: string, init: RequestInit = {}): Promise<Response> {
  const headers = new Headers(init.headers);
  if (jar.header()) headers.set('cookie', jar.header());
  const response = await fetch(url, { ...init, headers, redirect: 'manual' });
  jar.take(response);
  return response;
}

export interface SignInWorld {
  appUrl: string;
  issuer: string;
  tdb: TestDatabase;
  close(): Promise<void>;
}

/**
 * The web app and the local provider fake, both real and on loopback. The app's
 * port is taken first, because the provider must know the exact redirect URI
 * and the app the exact issuer.
 */
export async function startSignInWorld(overrides: Record<string, string> = {}): Promise<SignInWorld> {
  const tdb = await createTestDatabase();
  let handler: http.RequestListener = (_req, res) => res.writeHead(503).end();
  const server = http.createServer((req, res) => handler(req, res));
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  const appUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const provider: RunningProvider = await startProvider({
    host: '127.0.0.1',
    port: 0,
    clients: [{ clientId: 'brimwatch', clientSecret: 'brimwatch-local-secret', redirectUris: [`${appUrl}/api/auth/callback`] }],
  });
  const config = testConfig(tdb.url, { PUBLIC_URL: appUrl, OIDC_ISSUER: provider.issuer, SIGN_IN_RATE_PER_MINUTE: '1000', TOKEN_RATE_PER_MINUTE: '1000', ...overrides });
  const app = createApp({ config, db: tdb.db, log: () => {} });
  handler = app;
  return {
    appUrl,
    issuer: provider.issuer,
    tdb,
    async close() {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await closeApp(app);
      await provider.close();
      await tdb.drop();
    },
  };
}

/**
 * The whole authorization code + PKCE flow through the provider's own sign-in
 * form. Returns the jar holding the Brimwatch session cookie, and the
 * provider's answer to the password (401 when refused).
 */
export async function signInThroughProvider(world: SignInWorld, login: string, password = 'demo'): Promise<{ jar: CookieJar; passwordAnswer: Response; finalLocation?: string }> {
  const jar = new CookieJar();
  const start = await step(jar, `${world.appUrl}/api/auth/login?returnTo=/fleet`);
  if (start.status !== 303) throw new Error(`sign-in did not start: ${start.status} ${await start.text()}`);
  let location = new URL(start.headers.get('location')!);
  let response = await step(jar, location.href);
  while (response.status >= 300 && response.status < 400 && !location.pathname.startsWith('/interaction/')) {
    location = new URL(response.headers.get('location')!, location);
    response = await step(jar, location.href);
  }
  if (response.status !== 200) throw new Error(`the provider did not show its sign-in page: ${response.status}`);
  const form = new URLSearchParams({ login, password });
  const passwordAnswer = await step(jar, `${location.href}/login`, { method: 'POST', body: form, headers: { 'content-type': 'application/x-www-form-urlencoded' } });
  if (passwordAnswer.status !== 303) return { jar, passwordAnswer };
  location = new URL(passwordAnswer.headers.get('location')!, location);
  response = await step(jar, location.href);
  // Follow the provider's own redirects until it hands the browser back to Brimwatch.
  while (response.status >= 300 && response.status < 400) {
    location = new URL(response.headers.get('location')!, location);
    if (location.origin === world.appUrl && !location.pathname.startsWith('/api/')) return { jar, passwordAnswer, finalLocation: location.pathname + location.search };
    response = await step(jar, location.href);
  }
  throw new Error(`sign-in ended at ${location.href} with ${response.status}`);
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const jsonOf = async (response: Response): Promise<any> => response.json();
