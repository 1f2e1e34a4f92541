// The quiet-window form's fields and how they become the API's input.
import type { QuietScope } from '@brimwatch/api-types';
import type { QuietWindowInput } from '@/api/alerts';

export interface QuietFields {
  scope: QuietScope;
  team: string;
  service: string;
  sketchId: string;
  /** `datetime-local` values, in the reader's own zone; an empty start means now. */
  startsAt: string;
  endsAt: string;
  reason: string;
}

const pad = (n: number) => String(n).padStart(2, '0');

/** A Date as a `datetime-local` value in the reader's zone. */
export function localInputValue(date: Date): string {
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}T${pad(date.getHours())}:${pad(date.getMinutes())}`;
}

export function blankQuietFields(now: Date): QuietFields {
  return { scope: 'team', team: '', service: '', sketchId: '', startsAt: '', endsAt: localInputValue(new Date(now.getTime() + 2 * 3_600_000)), reason: '' };
}

/** Only the target that goes with the scope is sent; the server checks the rest and names the field at fault. */
export function quietInputOf(f: QuietFields): QuietWindowInput {
  const instant = (value: string) => (value ? new Date(value).toISOString() : '');
  const input: QuietWindowInput = { scope: f.scope, endsAt: instant(f.endsAt), reason: f.reason };
  if (f.startsAt) input.startsAt = instant(f.startsAt);
  if (f.scope === 'team') input.team = f.team;
  if (f.scope === 'service') input.service = f.service.trim();
  if (f.scope === 'sketch') input.sketchId = Number(f.sketchId);
  return input;
}
