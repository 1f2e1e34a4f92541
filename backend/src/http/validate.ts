import type { z } from 'zod';
import { AppError } from './errors';

/**
 * Checks input at the edge of a route against a zod schema. The first problem
 * becomes a 400 that names the field (dotted path, e.g. `instances.1.targetUrl`)
 * and says what would be accepted, so a form can show it beside the field.
 */
export function parseInput<S extends z.ZodType>(schema: S, input: unknown, where: 'body' | 'query'): z.infer<S> {
  const parsed = schema.safeParse(input ?? {});
  if (parsed.success) return parsed.data;
  const issue = parsed.error.issues[0];
  if (issue.code === 'unrecognized_keys') {
    const keys = issue.keys.join(', ');
    const field = [...issue.path, issue.keys[0]].join('.');
    throw new AppError(400, 'invalid', `Unknown ${where === 'body' ? 'field' : 'parameter'} ${keys}; remove it (see the API reference in the README for the accepted names).`, field);
  }
  const field = issue.path.join('.') || undefined;
  const message = where === 'body' && !field ? `The request body must be a JSON object with the fields in the README (${issue.message}).` : issue.message;
  throw new AppError(400, 'invalid', message, field);
}
