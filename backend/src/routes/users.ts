import { Router } from 'express';
import { z } from 'zod';
import { allow } from '../auth/permission';
import { ROLES, roleList } from '../auth/roles';
import type { Db } from '../db';
import { parseInput } from '../http/validate';
import { changeRole, listUsers } from '../services/access/users';
import { idParam } from './id-param';

const roleChange = z.strictObject({
  role: z.enum(ROLES, { error: `role must be one of ${roleList}` }),
});

/** Admins see every user and set their roles. */
export function userRoutes(db: Db): Router {
  const router = Router();
  router.get('/v1/users', allow('admin'), async (_req, res) => {
    res.json({ users: await listUsers(db) });
  });
  router.patch('/v1/users/:id', allow('admin'), async (req, res) => {
    const { role } = parseInput(roleChange, req.body, 'body');
    res.json({ user: await changeRole(db, req.user!, idParam(req.params.id, 'user'), role) });
  });
  return router;
}
