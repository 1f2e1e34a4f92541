import type { RequestHandler } from 'express';
import { AppError } from '../http/errors';
import { atLeast, type Role } from './roles';

/**
 * Every API route declares who may call it, as its first handler:
 *
 *   router.get('/v1/sketches', allow('viewer'), handler)
 *   router.post('/v1/tokens', allow('viewer', { sessionOnly: true }), handler)
 *
 * `public` routes answer anyone; a role lets that role and every higher one in.
 * A route without a declaration fails tests/api/auth/route-permissions.test.ts.
 */
export type Access = 'public' | Role;

export interface Permission {
  access: Access;
  /** Only a signed-in person, not an API token (e.g. minting new tokens). */
  sessionOnly: boolean;
}

const PERMISSION = Symbol.for('brimwatch.permission');

type DeclaredHandler = RequestHandler & { [PERMISSION]: Permission };

export function allow(access: Access, options: { sessionOnly?: boolean } = {}): RequestHandler {
  const permission: Permission = { access, sessionOnly: options.sessionOnly ?? false };
  const handler: RequestHandler = (req, _res, next) => {
    if (access === 'public') return next();
    const user = req.user;
    if (!user) {
      return next(new AppError(401, 'signed_out', 'Sign in first (GET /api/auth/login), or send an API token as "Authorization: Bearer <token>".'));
    }
    if (permission.sessionOnly && user.via === 'token') {
      return next(new AppError(403, 'session_only', 'An API token cannot do this; sign in to Brimwatch in the browser and do it there.'));
    }
    if (!atLeast(user.role, access)) {
      const whose = user.via === 'token' ? `your token carries the ${user.role} role` : `you are ${user.role}`;
      return next(new AppError(403, 'forbidden', `This needs the ${access} role or higher; ${whose}. Ask an admin if you need more.`));
    }
    next();
  };
  return Object.assign(handler, { [PERMISSION]: permission }) as DeclaredHandler;
}

/** The permission a handler declares, or undefined for any other function (used by the route-coverage test). */
export function permissionOf(handler: unknown): Permission | undefined {
  return typeof handler === 'function' ? (handler as Partial<DeclaredHandler>)[PERMISSION] : undefined;
}
