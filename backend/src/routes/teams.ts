import { Router } from 'express';
import { z } from 'zod';
import { allow } from '../auth/permission';
import type { Db } from '../db';
import { parseInput } from '../http/validate';
import { createTeam, listTeams, removeMember, setMember, updateTeam } from '../services/access/teams';
import { idParam } from './id-param';

const address = (field: string) =>
  z.email({ error: `${field} must be an e-mail address such as payments-alerts@larkfield.test, or null for none` }).max(320).nullable().optional();
const name = z.string({ error: 'name must be text, such as Payments' }).trim().min(1, 'name must not be empty').max(100, 'name must be at most 100 characters');

const newTeam = z.strictObject({
  slug: z.string({ error: 'slug is required' }).regex(/^[a-z0-9][a-z0-9-]{0,49}$/, "slug must be 1–50 lower-case letters, digits or '-', such as payments"),
  name,
  alertEmail: address('alertEmail'),
  escalationEmail: address('escalationEmail'),
});
const teamChange = z
  .strictObject({ name: name.optional(), alertEmail: address('alertEmail'), escalationEmail: address('escalationEmail') })
  .refine((c) => Object.keys(c).length > 0, 'Send at least one of name, alertEmail, escalationEmail.');
const membership = z.strictObject({ wantsAlertMail: z.boolean({ error: 'wantsAlertMail must be true or false' }).default(false) });

/** Teams: everyone reads them; owners set their own team's alert addresses; admins do the rest. */
export function teamRoutes(db: Db): Router {
  const router = Router();
  router.get('/v1/teams', allow('viewer'), async (_req, res) => {
    res.json({ teams: await listTeams(db) });
  });
  router.post('/v1/teams', allow('admin'), async (req, res) => {
    res.status(201).json({ team: await createTeam(db, req.user!, parseInput(newTeam, req.body, 'body')) });
  });
  router.patch('/v1/teams/:id', allow('owner'), async (req, res) => {
    const change = parseInput(teamChange, req.body, 'body');
    res.json({ team: await updateTeam(db, req.user!, idParam(req.params.id, 'team'), change) });
  });
  router.put('/v1/teams/:id/members/:userId', allow('admin'), async (req, res) => {
    const { wantsAlertMail } = parseInput(membership, req.body, 'body');
    res.json({ member: await setMember(db, req.user!, idParam(req.params.id, 'team'), idParam(req.params.userId, 'user'), wantsAlertMail) });
  });
  router.delete('/v1/teams/:id/members/:userId', allow('admin'), async (req, res) => {
    await removeMember(db, req.user!, idParam(req.params.id, 'team'), idParam(req.params.userId, 'user'));
    res.status(204).end();
  });
  return router;
}
