import { Router } from 'express';
import { z } from 'zod';
import { readAudit } from '../audit/read';
import { allow } from '../auth/permission';
import type { Db } from '../db';
import { AppError } from '../http/errors';
import { parseInput } from '../http/validate';
import { idParam } from './id-param';

const instant = (field: string) =>
  z.iso.datetime({ offset: true, error: `${field} must be an ISO 8601 time such as 2026-12-01T08:00:00Z` }).transform((v) => new Date(v)).optional();
const text = z.string().trim().min(1).max(200).optional();
const whole = (field: string, max: number, fallback: number) =>
  z.coerce.number({ error: `${field} must be a whole number from 1 to ${max}` }).int(`${field} must be a whole number from 1 to ${max}`).min(1, `${field} must be a whole number from 1 to ${max}`).max(max, `${field} must be at most ${max}`).default(fallback);

const filter = z.strictObject({
  actor: text,
  action: text,
  subjectType: text,
  subjectId: text,
  from: instant('from'),
  to: instant('to'),
  page: whole('page', 1_000_000, 1),
  pageSize: whole('pageSize', 200, 50),
});

const sketchPage = z.strictObject({ page: whole('page', 1_000_000, 1), pageSize: whole('pageSize', 200, 50) });

/**
 * Admins read who changed what, newest first. One sketch's own entries (who
 * registered it, who changed its budget or watch line) are open to everyone
 * who may read the sketch: on-call needs them to explain a change of level.
 */
export function auditRoutes(db: Db): Router {
  const router = Router();
  router.get('/v1/sketches/:id/audit', allow('viewer'), async (req, res) => {
    const id = idParam(req.params.id, 'sketch');
    const { page, pageSize } = parseInput(sketchPage, req.query, 'query');
    if (!(await db('sketches').where({ id }).first('id'))) throw new AppError(404, 'not_found', `There is no sketch ${id}; it may have been deleted.`);
    res.json(await readAudit(db, { subjectType: 'sketch', subjectId: String(id), page, pageSize }));
  });
  router.get('/v1/audit', allow('admin'), async (req, res) => {
    const f = parseInput(filter, req.query, 'query');
    if (f.from && f.to && f.from >= f.to) throw new AppError(400, 'invalid', 'from must be before to.', 'from');
    res.json(await readAudit(db, f));
  });
  return router;
}
