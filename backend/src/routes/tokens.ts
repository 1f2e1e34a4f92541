import { Router } from 'express';
import { z } from 'zod';
import { allow } from '../auth/permission';
import { ROLES, roleList } from '../auth/roles';
import type { Config } from '../config';
import type { Db } from '../db';
import { parseInput } from '../http/validate';
import { perMinuteLimit } from '../http/rate-limit';
import { createToken, listTokens, revokeToken } from '../services/access/tokens';
import { idParam } from './id-param';

/**
 * API tokens for automation. Anyone signed in may make tokens for themselves
 * (in the browser only: a leaked token must not mint more), list and revoke
 * them; admins list and revoke everyone's.
 */
export function tokenRoutes(config: Config, db: Db): Router {
  const newToken = z.strictObject({
    label: z.string({ error: 'label is required: a few words saying what the token is for, such as "deploy pipeline"' })
      .trim()
      .min(1, 'label must not be empty: say what the token is for, such as "deploy pipeline"')
      .max(100, 'label must be at most 100 characters'),
    role: z.enum(ROLES, { error: `role must be one of ${roleList} (at most your own)` }).optional(),
    expiresInDays: z
      .number({ error: `expiresInDays must be a whole number of days from 1 to ${config.TOKEN_MAX_DAYS}` })
      .int(`expiresInDays must be a whole number of days from 1 to ${config.TOKEN_MAX_DAYS}`)
      .min(1, `expiresInDays must be a whole number of days from 1 to ${config.TOKEN_MAX_DAYS}`)
      .max(config.TOKEN_MAX_DAYS, `expiresInDays must be at most ${config.TOKEN_MAX_DAYS} (TOKEN_MAX_DAYS)`)
      .default(config.TOKEN_DEFAULT_DAYS),
  });
  const listQuery = z.strictObject({ scope: z.enum(['own', 'all'], { error: 'scope must be own or all' }).default('own') });

  const router = Router();
  const limit = perMinuteLimit(config.TOKEN_RATE_PER_MINUTE, 'token');
  router.get('/v1/tokens', allow('viewer'), limit, async (req, res) => {
    const { scope } = parseInput(listQuery, req.query, 'query');
    res.json({ tokens: await listTokens(db, req.user!, scope) });
  });
  router.post('/v1/tokens', allow('viewer', { sessionOnly: true }), limit, async (req, res) => {
    const input = parseInput(newToken, req.body, 'body');
    const created = await createToken(db, req.user!, { ...input, role: input.role ?? req.user!.role, userId: req.user!.id });
    res.status(201).json({ ...created, note: 'Copy the secret now: Brimwatch keeps only its hash and cannot show it again.' });
  });
  router.delete('/v1/tokens/:id', allow('viewer'), limit, async (req, res) => {
    res.json({ token: await revokeToken(db, req.user!, idParam(req.params.id, 'token')) });
  });
  return router;
}
