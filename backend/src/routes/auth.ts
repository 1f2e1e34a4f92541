import { Router, type Request } from 'express';
import { recordAudit } from '../audit/record';
import { allow } from '../auth/permission';
import { reasonOf, type SignInClient } from '../auth/oidc-client';
import type { Config } from '../config';
import type { Db } from '../db';
import { AppError } from '../http/errors';
import { perMinuteLimit } from '../http/rate-limit';
import { currentUserView } from '../services/access/users';
import { recordSignIn } from '../services/access/sign-in';

/**
 * Sign-in through the OpenID Connect provider, sign-out and "who am I".
 * The callback is a GET by the protocol's design; it is bound to the browser's
 * own session by `state`, the nonce and the PKCE verifier, so another site cannot complete it.
 */
export function authRoutes(config: Config, db: Db, signIn: SignInClient): Router {
  const router = Router();
  const limit = perMinuteLimit(config.SIGN_IN_RATE_PER_MINUTE, 'sign-in');

  router.get('/auth/login', allow('public'), limit, async (req, res) => {
    browserOnly(req);
    const { url, pending } = await signIn.begin();
    req.session.pendingSignIn = { ...pending, returnTo: safeReturnTo(req.query.returnTo) };
    await save(req);
    res.redirect(303, url.href);
  });

  router.get('/auth/callback', allow('public'), limit, async (req, res) => {
    browserOnly(req);
    const pending = req.session.pendingSignIn;
    const problem = (text: string) => res.redirect(303, `/sign-in?problem=${encodeURIComponent(text)}`);
    if (typeof req.query.error === 'string') {
      return problem(`The sign-in provider said: ${req.query.error_description ?? req.query.error}.`);
    }
    if (!pending) return problem('This sign-in attempt has expired or began in another browser; sign in again.');
    let userId: number;
    try {
      const claims = await signIn.finish(new URL(req.originalUrl, config.publicUrl), pending);
      userId = await recordSignIn(db, claims);
    } catch (err) {
      return problem(err instanceof AppError ? err.message : `Sign-in failed (${reasonOf(err)}); sign in again.`);
    }
    // A fresh session id at sign-in, so an id planted before sign-in is worthless.
    await new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
    req.session.userId = userId;
    req.session.signedInAt = Date.now();
    await save(req);
    res.redirect(303, pending.returnTo);
  });

  router.post('/auth/logout', allow('public'), async (req, res) => {
    if (req.user?.via === 'session') {
      await recordAudit(db, { actor: req.user, action: 'user.signed_out', subjectType: 'user', subjectId: req.user.id });
    }
    if (req.session) await new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
    res.clearCookie('brimwatch.sid', { path: '/' });
    res.status(204).end();
  });

  router.get('/auth/me', allow('viewer'), async (req, res) => {
    res.json({ user: await currentUserView(db, req.user!) });
  });

  return router;
}

/** Sign-in lives in a cookie session; a request with a bearer token has none and needs none. */
function browserOnly(req: Request): void {
  if (!req.session) throw new AppError(400, 'not_a_browser', 'Sign-in is for a browser; a request with an API token is already identified by its token.');
}

/** Only a path of Brimwatch itself, never another site (an open redirect). */
function safeReturnTo(value: unknown): string {
  return typeof value === 'string' && /^\/(?![/\\])/.test(value) ? value : '/';
}

function save(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
}
