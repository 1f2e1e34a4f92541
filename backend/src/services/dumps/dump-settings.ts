import { z } from 'zod';
import type { Db } from '../../db';
import { AppError } from '../../http/errors';
import { tunables } from '../../routes/sketch-input';
import { findSketch, type SketchRow } from '../../queries/sketches';
import type { DumpSettings } from './dump-reader';
import { DUMP_FORMATS, MAX_DUMP_DEPTH } from './shape';

/** Multipart fields arrive as text; an empty field counts as left out. */
const numeric = (value: unknown) => (typeof value === 'string' ? (value.trim() === '' ? undefined : Number(value)) : value);

const whole = (field: string, high: number) => {
  const text = `${field} must be a whole number from 1 to ${high}`;
  return z.preprocess(numeric, z.number(text).int(text).min(1, text).max(high, text).optional());
};

const streamTotalText = "streamTotal must be a number of 0 or more: the service's own stream total when the dump was taken";

export const dumpFields = z.strictObject({
  format: z.enum(DUMP_FORMATS, `format is required and must come before the file in the form: one of ${DUMP_FORMATS.join(', ')}`),
  width: whole('width', 2 ** 27),
  depth: whole('depth', MAX_DUMP_DEPTH),
  errorBudget: z.preprocess(numeric, tunables.errorBudget.optional()),
  confidence: z.preprocess(numeric, tunables.confidence.optional()),
  streamTotal: z.preprocess(numeric, z.number(streamTotalText).refine((v) => Number.isFinite(v) && v >= 0, streamTotalText).optional()),
  sketchId: whole('sketchId', Number.MAX_SAFE_INTEGER),
});

export interface ResolvedDump {
  settings: DumpSettings;
  sketch: SketchRow | null;
}

/**
 * The form's fields, checked before the file is read: a dump names its
 * sketch optionally, and then the sketch's own error budget and confidence
 * stand in for any the form leaves empty.
 */
export async function resolveDumpFields(db: Db, body: unknown): Promise<ResolvedDump> {
  const parsed = dumpFields.safeParse(body ?? {});
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const field = issue.code === 'unrecognized_keys' ? issue.keys[0] : issue.path.join('.') || undefined;
    const message = issue.code === 'unrecognized_keys' ? `Unknown form field ${issue.keys.join(', ')}; the fields are format, width, depth, errorBudget, confidence, streamTotal, sketchId and file.` : issue.message;
    throw new AppError(400, 'invalid', message, field);
  }
  const { sketchId, ...fields } = parsed.data;
  const sketch = sketchId === undefined ? null : ((await findSketch(db, sketchId)) ?? null);
  if (sketchId !== undefined && !sketch) {
    throw new AppError(400, 'invalid', `sketchId ${sketchId} names no sketch; pick one from the fleet, or leave it empty.`, 'sketchId');
  }
  const errorBudget = fields.errorBudget ?? sketch?.error_budget;
  const confidence = fields.confidence ?? sketch?.confidence;
  if (errorBudget === undefined) throw new AppError(400, 'invalid', 'errorBudget is required (or name a sketch, whose budget is used): the largest overcount tolerated, e.g. 500.', 'errorBudget');
  if (confidence === undefined) throw new AppError(400, 'invalid', 'confidence is required (or name a sketch, whose confidence is used): a fraction such as 0.99.', 'confidence');
  return { settings: { ...fields, errorBudget: Number(errorBudget), confidence: Number(confidence) }, sketch };
}
