// Where the server's 400 lands: beside the field it names, or above the
// buttons when the form has no such field (so no message is ever lost).
import type { ApiError } from '@/api/errors';
import type { SketchFormFields } from './sketch-form-fields';

const SHOWN_FIELDS = new Set(['team', 'service', 'sketch', 'targetUrl', 'errorBudget', 'confidence', 'watchLine', 'leadTimeDays', 'scrapeIntervalSeconds', 'sizedTotal']);

export function errorsFrom(error: ApiError, fields: Pick<SketchFormFields, 'replicated'>, editing: boolean): Record<string, string> {
  const field = error.field ?? '';
  const replicaField = /^instances(\.\d+\.(instance|targetUrl))?$/.test(field);
  const hiddenHere = (field === 'targetUrl' && fields.replicated) || (editing && (field === 'team' || field === 'service'));
  const shown = replicaField ? fields.replicated : SHOWN_FIELDS.has(field) && !hiddenHere;
  return shown ? { [field]: error.message } : { form: error.message };
}
