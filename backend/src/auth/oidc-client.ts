import * as oidc from 'openid-client';
import type { Config } from '../config';
import { AppError } from '../http/errors';

export interface IdClaims {
  subject: string;
  login: string;
  name: string;
  email: string | null;
  roles: string[];
}

export interface PendingSignIn {
  state: string;
  nonce: string;
  codeVerifier: string;
}

/**
 * Brimwatch as an OpenID Connect client (authorization code + PKCE). The
 * provider is discovered on first use, not at start, so the web server may
 * start before the provider; a failed discovery is retried on the next sign-in.
 */
export function signInClient(config: Config) {
  const issuer = new URL(config.oidcIssuer);
  const redirectUri = `${config.publicUrl}/api/auth/callback`;
  let discovered: Promise<oidc.Configuration> | undefined;

  function provider(): Promise<oidc.Configuration> {
    discovered ??= oidc
      .discovery(issuer, config.OIDC_CLIENT_ID, undefined, oidc.ClientSecretBasic(config.OIDC_CLIENT_SECRET), {
        // Plain http is only ever the local provider fake on loopback.
        execute: issuer.protocol === 'http:' ? [oidc.allowInsecureRequests] : [],
        timeout: 5,
      })
      .catch((err: unknown) => {
        discovered = undefined;
        throw new AppError(503, 'sign_in_unavailable', `The sign-in provider at ${config.oidcIssuer} does not answer (${reasonOf(err)}); start it (npm start runs the local one) or check OIDC_ISSUER, then try again.`, undefined, { cause: err });
      });
    return discovered;
  }

  return {
    async begin(): Promise<{ url: URL; pending: PendingSignIn }> {
      const configuration = await provider();
      const pending = { state: oidc.randomState(), nonce: oidc.randomNonce(), codeVerifier: oidc.randomPKCECodeVerifier() };
      const url = oidc.buildAuthorizationUrl(configuration, {
        redirect_uri: redirectUri,
        scope: 'openid profile email roles',
        code_challenge: await oidc.calculatePKCECodeChallenge(pending.codeVerifier),
        code_challenge_method: 'S256',
        state: pending.state,
        nonce: pending.nonce,
      });
      return { url, pending };
    },

    /** Exchanges the code from the provider's redirect for a checked ID token and reads the person from it. */
    async finish(callbackUrl: URL, pending: PendingSignIn): Promise<IdClaims> {
      const configuration = await provider();
      const tokens = await oidc.authorizationCodeGrant(configuration, callbackUrl, {
        pkceCodeVerifier: pending.codeVerifier,
        expectedState: pending.state,
        expectedNonce: pending.nonce,
        idTokenExpected: true,
      });
      const claims = tokens.claims();
      if (!claims) throw new Error('the provider sent no ID token');
      return readClaims(claims);
    },
  };
}

export type SignInClient = ReturnType<typeof signInClient>;

function readClaims(claims: oidc.IDToken): IdClaims {
  const text = (value: unknown) => (typeof value === 'string' && value.trim() !== '' ? value.trim() : undefined);
  const email = text(claims.email) ?? null;
  const login = text(claims.preferred_username) ?? email?.split('@')[0] ?? claims.sub;
  const roles = Array.isArray(claims.roles) ? claims.roles.filter((r): r is string => typeof r === 'string') : text(claims.roles) ? [String(claims.roles)] : [];
  return { subject: claims.sub, login, name: text(claims.name) ?? login, email, roles };
}

export function reasonOf(err: unknown): string {
  if (err instanceof Error) {
    const cause = err.cause instanceof Error ? `: ${err.cause.message}` : '';
    return `${err.message}${cause}`;
  }
  return String(err);
}
