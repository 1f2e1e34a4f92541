import rateLimit from 'express-rate-limit';
import { AppError } from './errors';

/** A per-address limit for routes worth guessing at (sign-in, tokens); over it, a 429 that says when to retry. */
export function perMinuteLimit(limit: number, what: string) {
  return rateLimit({
    windowMs: 60_000,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(new AppError(429, 'too_many_requests', `Too many ${what} requests from your address (more than ${limit} a minute); wait a minute and try again.`)),
  });
}
