import { sketchFromJson } from './from-json';
import { sketchFromText } from './from-text';
import { failed, type ReadResult, type SketchSample } from './sketch-sample';
import type { Dialect } from './text-format';

export type { SketchSample, ReadResult } from './sketch-sample';

/** What the collector asks for, best first: OpenMetrics ends with # EOF, so a cut-short body is caught. */
export const ACCEPT = 'application/openmetrics-text;version=1.0.0,text/plain;version=0.0.4;q=0.5,application/json;q=0.3';

type Form = Dialect | 'json';

/** The form a response says it is in; without a Content-Type, the first character decides. */
export function formOf(contentType: string | undefined, body: string): Form {
  const type = (contentType ?? '').split(';')[0].trim().toLowerCase();
  if (type === 'application/openmetrics-text') return 'openmetrics';
  if (type === 'application/json' || type.endsWith('+json')) return 'json';
  if (type === '' && body.trimStart().startsWith('{')) return 'json';
  return 'prometheus';
}

/**
 * One sketch out of a scraped body, in whichever form it came; a reason when
 * the body is not a valid exposition or lacks a figure. Never throws.
 */
export function readSketch(body: string, contentType: string | undefined, label: string): ReadResult<SketchSample> {
  try {
    const form = formOf(contentType, body);
    return form === 'json' ? sketchFromJson(body, label) : sketchFromText(body, form, label);
  } catch (err) {
    // The readers return their reasons; reaching here is a fault of ours, still reported as a failed reading.
    return failed(`the exposition could not be read: ${err instanceof Error ? err.message : String(err)}`);
  }
}
