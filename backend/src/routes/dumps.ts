import { Router, type Request } from 'express';
import { z } from 'zod';
import { allow } from '../auth/permission';
import type { Caller } from '../auth/caller';
import type { Config } from '../config';
import type { Db } from '../db';
import { AppError } from '../http/errors';
import { streamedUpload, type StreamedFile } from '../http/streamed-upload';
import { parseInput } from '../http/validate';
import { createDumpReader, type DumpResult } from '../services/dumps/dump-reader';
import { dumpReport, listDumps, saveDumpReport } from '../services/dumps/dump-reports';
import { resolveDumpFields, type ResolvedDump } from '../services/dumps/dump-settings';
import { idParam } from './id-param';

type DumpUpload = { resolved: ResolvedDump; result: DumpResult };

const positive = (field: string, high: number) =>
  z.coerce.number(`${field} must be a whole number from 1 to ${high}`).int(`${field} must be a whole number from 1 to ${high}`).min(1, `${field} must be a whole number from 1 to ${high}`).max(high, `${field} must be a whole number from 1 to ${high}`);

const listQuery = z.strictObject({
  limit: positive('limit', 200).default(50),
  before: positive('before', Number.MAX_SAFE_INTEGER).optional(),
  sketchId: positive('sketchId', Number.MAX_SAFE_INTEGER).optional(),
});

/**
 * Counter dump checks. Uploading is for responders and above (it stores a
 * report, and on-call is who needs the check); every signed-in role may read
 * the reports, as every role may read the fleet.
 */
export function dumpRoutes(db: Db, config: Config): Router {
  const router = Router();

  const upload = streamedUpload<DumpUpload>({
    field: 'file',
    maxBytes: config.UPLOAD_MAX_BYTES,
    idleMs: config.UPLOAD_IDLE_SECONDS * 1000,
    async open(req) {
      const resolved = await resolveDumpFields(db, req.body);
      const reader = createDumpReader(resolved.settings);
      return { write: (chunk) => reader.write(chunk), finish: () => ({ resolved, result: reader.finish() }) };
    },
  });

  router.post('/v1/dumps', allow('responder'), upload, async (req: Request, res) => {
    const file = req.file as StreamedFile<DumpUpload> | undefined;
    if (!file) {
      throw new AppError(400, 'invalid', "Send the dump as multipart/form-data: the fields format, width, depth, errorBudget, confidence (and optionally streamTotal, sketchId) first, then the file in the field 'file'.", 'file');
    }
    const report = await saveDumpReport(db, req.user as Caller, { fileName: file.originalname, ...file.result });
    res.status(201).location(`/api/v1/dumps/${report.id}`).json(report);
  });

  router.get('/v1/dumps', allow('viewer'), async (req, res) => {
    res.json(await listDumps(db, parseInput(listQuery, req.query, 'query')));
  });

  router.get('/v1/dumps/:id', allow('viewer'), async (req, res) => {
    res.json(await dumpReport(db, idParam(req.params.id, 'dump report')));
  });

  return router;
}
