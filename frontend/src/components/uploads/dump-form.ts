// The counter dump form's rules, mirroring the server's (backend/src/services/dumps/dump-settings.ts),
// so most mistakes show beside the field before anything is sent; the server still decides.
import type { DumpFormat } from '@brimwatch/api-types';

export interface DumpFields {
  format: DumpFormat;
  width: string;
  depth: string;
  errorBudget: string;
  confidence: string;
  streamTotal: string;
  sketchId: number | null;
}

export const FORMAT_OPTIONS: { value: DumpFormat; label: string }[] = [
  { value: 'csv', label: 'CSV or TSV text, one sketch row per line' },
  { value: 'json', label: 'JSON { width, depth, counters }' },
  { value: 'u32le', label: 'Raw little-endian 32-bit counters' },
  { value: 'u64le', label: 'Raw little-endian 64-bit counters' },
];

export const MAX_DEPTH = 64;

export const isRaw = (format: DumpFormat) => format === 'u32le' || format === 'u64le';

export const emptyDumpFields = (): DumpFields => ({ format: 'csv', width: '', depth: '', errorBudget: '', confidence: '0.99', streamTotal: '', sketchId: null });

const number = (text: string) => (text.trim() === '' ? undefined : Number(text));

function wholeProblem(field: string, text: string, high: number, required: boolean): string | undefined {
  const value = number(text);
  if (value === undefined) return required ? `${field} is required for a raw dump: ${field === 'width' ? 'the counters in one row' : 'the number of rows'}.` : undefined;
  if (!Number.isInteger(value) || value < 1 || value > high) return `${field} must be a whole number from 1 to ${high}.`;
  return undefined;
}

/** Field name → what is wrong with it; empty when the form can be sent. */
export function dumpFormProblems(fields: DumpFields, file: File | null): Partial<Record<keyof DumpFields | 'file', string>> {
  const problems: Partial<Record<keyof DumpFields | 'file', string>> = {};
  const raw = isRaw(fields.format);
  const width = wholeProblem('width', fields.width, 2 ** 27, raw);
  const depth = wholeProblem('depth', fields.depth, MAX_DEPTH, raw);
  if (width) problems.width = width;
  if (depth) problems.depth = depth;
  const budget = number(fields.errorBudget);
  if (budget === undefined ? fields.sketchId === null : !(Number.isFinite(budget) && budget > 0)) {
    problems.errorBudget = budget === undefined ? 'errorBudget is required, or choose a sketch to use its budget.' : 'errorBudget must be a number greater than 0, such as 500.';
  }
  const confidence = number(fields.confidence);
  if (confidence === undefined ? fields.sketchId === null : !(confidence > 0 && confidence < 1)) {
    problems.confidence = confidence === undefined ? 'confidence is required, or choose a sketch to use its confidence.' : 'confidence must be a fraction strictly between 0 and 1, such as 0.99.';
  }
  const total = number(fields.streamTotal);
  if (total !== undefined && !(Number.isFinite(total) && total >= 0)) problems.streamTotal = "streamTotal must be a number of 0 or more: the service's own total.";
  if (!file) problems.file = 'Choose the dump file.';
  return problems;
}

/** The server reads the fields before the file arrives, so they go first. */
export function dumpFormData(fields: DumpFields, file: File): FormData {
  const form = new FormData();
  form.append('format', fields.format);
  for (const key of ['width', 'depth', 'errorBudget', 'confidence', 'streamTotal'] as const) {
    if (fields[key].trim() !== '') form.append(key, fields[key].trim());
  }
  if (fields.sketchId !== null) form.append('sketchId', String(fields.sketchId));
  form.append('file', file, file.name);
  return form;
}
