import { Router } from 'express';
import { z } from 'zod';
import { allow } from '../auth/permission';
import type { Db } from '../db';
import { parseInput } from '../http/validate';
import { writeHistoryCsv } from '../services/history/history-csv';
import { fleetHistory } from '../services/history/history';
import { instant, list, MAX_RANGE_DAYS, wholeNumber } from './fleet-input';

const DAY_MS = 86_400_000;

const historyQuery = z
  .strictObject({
    from: instant('from'),
    to: instant('to'),
    team: list,
    service: list,
    sketch: list.refine((ids) => ids.every((id) => /^[1-9]\d{0,15}$/.test(id)), 'sketch must be one or more sketch ids (whole numbers, comma-separated or repeated)'),
    page: wholeNumber('page', 1, 1_000_000, 1),
    pageSize: wholeNumber('pageSize', 1, 200, 50),
  })
  .transform((q, ctx) => {
    const to = q.to ?? new Date();
    const from = q.from ?? new Date(to.getTime() - 7 * DAY_MS);
    if (from >= to) {
      ctx.addIssue({ code: 'custom', path: ['from'], message: `from must be before to (got from ${from.toISOString()}, to ${to.toISOString()}).` });
      return z.NEVER;
    }
    if (to.getTime() - from.getTime() > MAX_RANGE_DAYS * DAY_MS) {
      ctx.addIssue({ code: 'custom', path: ['from'], message: `The period from … to must span at most ${MAX_RANGE_DAYS} days; narrow it.` });
      return z.NEVER;
    }
    return { from, to, filter: { teams: q.team, services: q.service, sketchIds: q.sketch.map(Number) }, page: q.page, pageSize: q.pageSize };
  });

const stamp = (d: Date) => d.toISOString().slice(0, 16).replace(/[-:]/g, '').replace('T', '-');

/** Saturation history for on-call: every role may read it, as every role may read the fleet. */
export function historyRoutes(db: Db): Router {
  const router = Router();

  router.get('/v1/history', allow('viewer'), async (req, res) => {
    const q = parseInput(historyQuery, req.query, 'query');
    res.json(await fleetHistory(db, q.filter, { from: q.from, to: q.to, now: new Date() }, q.page, q.pageSize));
  });

  router.get('/v1/history.csv', allow('viewer'), async (req, res) => {
    const q = parseInput(historyQuery, req.query, 'query');
    res.type('text/csv; charset=utf-8').attachment(`brimwatch-history-${stamp(q.from)}-to-${stamp(q.to)}.csv`);
    try {
      await writeHistoryCsv(db, q.filter, { from: q.from, to: q.to, now: new Date() }, (chunk) => res.write(chunk));
    } catch (error) {
      // Once rows are on their way the status is sent: cut the download short so it cannot pass for a whole file.
      if (!res.headersSent) throw error;
      res.destroy(error instanceof Error ? error : new Error(String(error)));
      return;
    }
    res.end();
  });

  return router;
}
