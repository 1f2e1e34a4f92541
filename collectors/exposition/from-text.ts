import { checkFigures, failed, type FieldNaming, type FoundFigures, type ReadResult, type SketchSample } from './sketch-sample';
import { parseExposition, type Dialect, type Sample } from './text-format';

/**
 * Sample names of Brimwatch's exposition (DESIGN.md, "Sketch readings"). The
 * stream total's sample is `countmin_stream_total` in both dialects: the
 * OpenMetrics family `countmin_stream` and the older family of the same name
 * as the sample. Matching on sample names accepts both.
 */
export const METRIC_OF = {
  width: 'countmin_width',
  depth: 'countmin_depth',
  streamTotal: 'countmin_stream_total',
  counterBytes: 'countmin_counter_bytes',
  windowSeconds: 'countmin_window_seconds',
  conservative: 'countmin_conservative',
  nonzeroCells: 'countmin_nonzero_cells',
} as const satisfies Record<keyof FoundFigures, string>;

type Scalar = Exclude<keyof FoundFigures, 'nonzeroCells'>;
const SCALARS = Object.keys(METRIC_OF).filter((f) => f !== 'nonzeroCells') as Scalar[];
const FIELD_OF = new Map<string, keyof FoundFigures>(Object.entries(METRIC_OF).map(([field, metric]) => [metric, field as keyof FoundFigures]));

const quoted = (label: string) => `sketch="${label.replace(/\\/g, '\\\\').replace(/"/g, '\\"').replace(/\n/g, '\\n')}"`;

/** Reads the sketch labelled `sketch="<label>"` from a text exposition. */
export function sketchFromText(body: string, dialect: Dialect, label: string): ReadResult<SketchSample> {
  const parsed = parseExposition(body, dialect);
  if (!parsed.ok) return parsed;
  const mine = parsed.samples.filter((s) => s.labels.sketch === label && FIELD_OF.has(s.name));
  if (mine.length === 0) return failed(noSuchSketch(parsed.samples, label));

  const byField = new Map<keyof FoundFigures, Sample[]>();
  for (const sample of mine) {
    const field = FIELD_OF.get(sample.name) as keyof FoundFigures;
    const list = byField.get(field) ?? [];
    list.push(sample);
    byField.set(field, list);
  }
  const found: FoundFigures = {};
  const lineOf = new Map<keyof FoundFigures, number>();
  for (const field of SCALARS) {
    const samples = byField.get(field) ?? [];
    if (samples.length > 1) {
      return failed(`${METRIC_OF[field]} for ${quoted(label)} appears ${samples.length} times (lines ${samples.map((s) => s.line).join(', ')}); expected once`);
    }
    if (samples.length === 1) {
      found[field] = samples[0].value;
      lineOf.set(field, samples[0].line);
    }
  }
  const rows = byField.get('nonzeroCells');
  if (rows) {
    found.nonzeroCells = [];
    for (const s of rows) {
      const row = s.labels.row;
      if (row === undefined || !/^\d{1,9}$/.test(row)) {
        return failed(`${METRIC_OF.nonzeroCells} for ${quoted(label)} at line ${s.line} needs a row label 0, 1, 2, … (got ${row === undefined ? 'none' : JSON.stringify(row)})`);
      }
      found.nonzeroCells.push({ row: Number(row), value: s.value, where: ` (line ${s.line})` });
    }
  }

  const naming: FieldNaming = {
    missing: (field) => `missing metric ${METRIC_OF[field]} for ${quoted(label)}`,
    name: (field) => (field === 'nonzeroCells' ? `${METRIC_OF[field]} for ${quoted(label)}` : METRIC_OF[field]),
    where: (field) => (lineOf.has(field) ? ` for ${quoted(label)} (line ${lineOf.get(field)})` : ''),
  };
  return checkFigures(found, naming);
}

/** Names the sketches the exposition does carry, so a typo in the label is easy to spot. */
function noSuchSketch(samples: Sample[], label: string): string {
  const offered = [...new Set(samples.filter((s) => FIELD_OF.has(s.name) && s.labels.sketch !== undefined).map((s) => s.labels.sketch))];
  const hint = offered.length === 0 ? 'it carries no countmin_* metrics with a sketch label' : `it carries ${offered.slice(0, 10).map(quoted).join(', ')}`;
  return `missing sketch: no countmin_* metric with ${quoted(label)} in the exposition; ${hint}`;
}
