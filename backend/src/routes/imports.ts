import { Router } from 'express';
import { allow } from '../auth/permission';
import type { Caller } from '../auth/caller';
import type { Config } from '../config';
import type { Db } from '../db';
import { AppError } from '../http/errors';
import { streamedUpload, type StreamedFile } from '../http/streamed-upload';
import { importSketches, ImportRefused, previewImport } from '../services/imports/import-sketches';
import { INVENTORY_COLUMNS } from '../services/imports/inventory-columns';
import { inventoryTemplate } from '../services/imports/inventory-template';
import { targetPolicyOf } from '../services/sketches/target-check';

/** An inventory is a short text file; two megabytes hold thousands of rows. */
const INVENTORY_MAX_BYTES = 2 * 1024 * 1024;

function collected(req: { file?: unknown }): { name: string; bytes: Uint8Array } {
  const file = req.file as StreamedFile<Uint8Array> | undefined;
  if (!file) throw new AppError(400, 'invalid', "Send the inventory as multipart/form-data with the CSV file in the field 'file'.", 'file');
  return { name: file.originalname, bytes: file.result };
}

/**
 * Registering sketches in bulk from a CSV file. Owners import for their own
 * teams (rows for other teams are refused with 403), sre and admin for any;
 * the columns and the template are for everyone to read.
 */
export function importRoutes(db: Db, config: Config): Router {
  const router = Router();
  const policy = targetPolicyOf(config);
  const upload = streamedUpload<Uint8Array>({
    field: 'file',
    maxBytes: Math.min(config.UPLOAD_MAX_BYTES, INVENTORY_MAX_BYTES),
    idleMs: config.UPLOAD_IDLE_SECONDS * 1000,
    async open() {
      const chunks: Uint8Array[] = [];
      return { write: (chunk) => void chunks.push(chunk), finish: () => Buffer.concat(chunks) };
    },
  });

  router.get('/v1/imports/sketches/columns', allow('viewer'), (_req, res) => {
    res.json({ columns: INVENTORY_COLUMNS });
  });

  router.get('/v1/imports/sketches/template', allow('viewer'), (_req, res) => {
    res.type('text/csv; charset=utf-8').attachment('brimwatch-inventory-template.csv').send(inventoryTemplate());
  });

  router.post('/v1/imports/sketches/preview', allow('owner'), upload, async (req, res) => {
    const { bytes } = collected(req);
    res.json(await previewImport(db, req.user as Caller, bytes, policy));
  });

  router.post('/v1/imports/sketches', allow('owner'), upload, async (req, res) => {
    const { name, bytes } = collected(req);
    try {
      res.status(201).json(await importSketches(db, req.user as Caller, bytes, name, policy));
    } catch (error) {
      if (!(error instanceof ImportRefused)) throw error;
      res.status(error.status).json({ error: { code: error.code, message: error.message, field: error.field }, ...error.preview });
    }
  });

  return router;
}
