import { generateKeyPairSync, randomBytes } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import Provider, { interactionPolicy, type KoaContextWithOIDC } from 'oidc-provider';
import { demoAccountBySubject } from './demo-accounts';
import { errorPage } from './sign-in-page';
import { interactionHandler } from './interactions';

export interface ProviderClient {
  clientId: string;
  clientSecret: string;
  redirectUris: string[];
}

export interface RunningProvider {
  issuer: string;
  close(): Promise<void>;
}

/**
 * The local OpenID Connect provider: a real oidc-provider instance with the
 * demo accounts, its own sign-in page, authorization code + PKCE only.
 * Port 0 picks a free port; the issuer is then built from the bound port,
 * because clients compare it exactly.
 */
export async function startProvider(options: { host: string; port: number; clients: ProviderClient[]; issuer?: string }): Promise<RunningProvider> {
  let handle: http.RequestListener = (_req, res) => res.writeHead(503).end();
  const server = http.createServer((req, res) => handle(req, res));
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, options.host, () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  const host = options.host.includes(':') ? `[${options.host}]` : options.host;
  const issuer = options.issuer ?? `http://${host}:${port}`;

  const provider = new Provider(issuer, configuration(options.clients));
  const interactions = interactionHandler(provider);
  const oidc = provider.callback();
  handle = (req, res) => {
    if (req.url?.startsWith('/interaction/')) void interactions(req, res);
    else oidc(req, res);
  };
  return {
    issuer,
    async close() {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}

function configuration(clients: ProviderClient[]): Record<string, unknown> {
  // Ask for the password on every sign-in, so a person can switch demo accounts after signing out of Brimwatch.
  const policy = interactionPolicy.base();
  policy.get('login').checks.add(
    new interactionPolicy.Check('demo_asks_every_time', 'the local provider asks on every sign-in', (ctx) =>
      ctx.oidc.result?.login ? interactionPolicy.Check.NO_NEED_TO_PROMPT : interactionPolicy.Check.REQUEST_PROMPT,
    ),
  );
  const signingKey = generateKeyPairSync('rsa', { modulusLength: 2048 }).privateKey.export({ format: 'jwk' });
  return {
    clients: clients.map((c) => ({
      client_id: c.clientId,
      client_secret: c.clientSecret,
      redirect_uris: c.redirectUris,
      response_types: ['code'],
      grant_types: ['authorization_code'],
      token_endpoint_auth_method: 'client_secret_basic',
    })),
    pkce: { required: () => true },
    features: { devInteractions: { enabled: false } },
    scopes: ['openid', 'profile', 'email', 'roles'],
    claims: { openid: ['sub'], profile: ['name', 'preferred_username'], email: ['email', 'email_verified'], roles: ['roles'] },
    // Put the profile, e-mail and roles into the ID token itself, so the client needs no userinfo call.
    conformIdTokenClaims: false,
    findAccount: async (_ctx: unknown, subject: string) => {
      const account = demoAccountBySubject(subject);
      if (!account) return undefined;
      return {
        accountId: subject,
        claims: async () => ({
          sub: subject,
          name: account.name,
          preferred_username: account.login,
          email: account.email,
          email_verified: true,
          roles: [account.role],
        }),
      };
    },
    // A first-party client: the grant is given without a consent screen.
    loadExistingGrant: async (ctx: KoaContextWithOIDC & { oidc: { provider: Provider } }) => {
      const clientId = ctx.oidc.client!.clientId;
      const grantId = ctx.oidc.result?.consent?.grantId ?? ctx.oidc.session?.grantIdFor(clientId);
      if (grantId) return ctx.oidc.provider.Grant.find(grantId);
      const grant = new ctx.oidc.provider.Grant({ clientId, accountId: ctx.oidc.session!.accountId! });
      grant.addOIDCScope('openid profile email roles');
      await grant.save();
      return grant;
    },
    interactions: { url: (_ctx: unknown, interaction: { uid: string }) => `/interaction/${interaction.uid}`, policy },
    cookies: { keys: [randomBytes(32).toString('hex')] },
    // Short lives: a sign-in takes seconds, and Brimwatch keeps its own session after it.
    ttl: { Interaction: 600, Session: 8 * 3600, Grant: 8 * 3600, AuthorizationCode: 60, AccessToken: 600, IdToken: 600 },
    jwks: { keys: [{ ...signingKey, use: 'sig', alg: 'RS256' }] },
    renderError: async (ctx: { type: string; body: string }, out: { error?: string; error_description?: string }) => {
      ctx.type = 'html';
      ctx.body = errorPage(out.error ?? 'Sign-in failed', out.error_description ?? 'The sign-in request was not valid.');
    },
  };
}
