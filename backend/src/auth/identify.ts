import type { Request, RequestHandler } from 'express';
import type { Db } from '../db';
import { AppError } from '../http/errors';
import { hashTokenSecret, TOKEN_SHAPE } from '../tokens/token-secret';
import { loadCaller, type Caller } from './caller';
import { lowerOf, isRole } from './roles';

/**
 * Works out who is calling and sets `req.user`; it never refuses an anonymous
 * request (the route's `allow(...)` decides). A malformed or dead bearer token
 * is refused here, so automation learns at once why it is not let in.
 */
export function identifyCaller(db: Db, absoluteTimeoutMs: number): RequestHandler {
  return async (req, _res, next) => {
    const header = req.get('authorization');
    if (header !== undefined) {
      req.user = await callerFromToken(db, header);
      return next();
    }
    const userId = req.session?.userId;
    if (userId !== undefined) {
      const tooOld = Date.now() - (req.session.signedInAt ?? 0) > absoluteTimeoutMs;
      const user = tooOld ? undefined : await loadCaller(db, userId, 'session');
      if (user) req.user = user;
      else await endSession(req);
    }
    next();
  };
}

async function callerFromToken(db: Db, header: string): Promise<Caller> {
  const match = /^Bearer ([^\s]+)$/.exec(header.trim());
  if (!match || !TOKEN_SHAPE.test(match[1])) {
    throw new AppError(401, 'bad_authorization', 'The Authorization header must read "Bearer <token>" with a Brimwatch API token (it starts with "bwt_"); create one on the Admin page or with `npm run admin -- token create`.');
  }
  const token = await db('api_tokens').where({ token_hash: hashTokenSecret(match[1]) }).first();
  if (!token) throw new AppError(401, 'unknown_token', 'This API token is not known to Brimwatch; check that you copied all of it, or create a new one.');
  if (token.revoked_at) throw new AppError(401, 'token_revoked', `This API token ("${token.label}") was revoked; create a new one.`);
  if (new Date(token.expires_at).getTime() <= Date.now()) {
    throw new AppError(401, 'token_expired', `This API token ("${token.label}") expired on ${new Date(token.expires_at).toISOString()}; create a new one.`);
  }
  const user = await loadCaller(db, Number(token.user_id), 'token');
  if (!user || !isRole(token.role)) throw new AppError(401, 'unknown_token', 'The user of this API token no longer exists; create a new token.');
  await db('api_tokens').where({ id: token.id }).update({ last_used_at: db.fn.now() });
  return { ...user, role: lowerOf(token.role, user.role), tokenId: Number(token.id), tokenLabel: token.label };
}

function endSession(req: Request): Promise<void> {
  return new Promise((resolve) => req.session.destroy(() => resolve()));
}
