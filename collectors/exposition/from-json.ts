import { checkFigures, failed, type FieldNaming, type FoundFigures, type ReadResult, type SketchSample } from './sketch-sample';

/**
 * The JSON form of the exposition, for services without a metrics library
 * (documented in collectors/README.md):
 *
 *   { "sketches": { "<label>": { "width": 2719, "depth": 5, "streamTotal": 120000,
 *       "nonzeroCells": [812, 799, 805, 790, 811], "counterBytes": 4,
 *       "windowSeconds": 0, "conservative": false } } }
 *
 * Every field is required; `conservative` is true/false (or 1/0).
 */
export function sketchFromJson(body: string, label: string): ReadResult<SketchSample> {
  let document: unknown;
  try {
    document = JSON.parse(body);
  } catch (err) {
    return failed(`parse error in JSON: ${err instanceof Error ? err.message : String(err)}`);
  }
  if (!isObject(document) || !isObject(document.sketches)) {
    return failed('the JSON form needs an object {"sketches": {"<label>": {...}}}; no "sketches" object found');
  }
  const sketches = document.sketches;
  if (!Object.hasOwn(sketches, label)) {
    const offered = Object.keys(sketches).slice(0, 10).map((k) => JSON.stringify(k));
    return failed(`missing sketch: no sketch ${JSON.stringify(label)} in the JSON form; it carries ${offered.length ? offered.join(', ') : 'none'}`);
  }
  const entry = sketches[label];
  if (!isObject(entry)) return failed(`sketch ${JSON.stringify(label)} in the JSON form must be an object of figures`);

  const found: FoundFigures = {};
  for (const field of ['width', 'depth', 'streamTotal', 'counterBytes', 'windowSeconds'] as const) {
    const value = entry[field];
    if (value === undefined || value === null) continue;
    if (typeof value !== 'number') return failed(`field ${field} of sketch ${JSON.stringify(label)} must be a number (got ${typeof value})`);
    found[field] = value;
  }
  const conservative = entry.conservative;
  if (typeof conservative === 'boolean') found.conservative = conservative ? 1 : 0;
  else if (typeof conservative === 'number') found.conservative = conservative;
  else if (conservative !== undefined && conservative !== null) {
    return failed(`field conservative of sketch ${JSON.stringify(label)} must be true or false (got ${typeof conservative})`);
  }
  const cells = entry.nonzeroCells;
  if (cells !== undefined && cells !== null) {
    if (!Array.isArray(cells)) return failed(`field nonzeroCells of sketch ${JSON.stringify(label)} must be a list with one count per row`);
    const notNumber = cells.findIndex((c) => typeof c !== 'number');
    if (notNumber >= 0) return failed(`field nonzeroCells of sketch ${JSON.stringify(label)} must hold numbers (entry ${notNumber} is ${typeof cells[notNumber]})`);
    found.nonzeroCells = cells.map((value: number, row) => ({ row, value, where: '' }));
  }

  const naming: FieldNaming = {
    missing: (field) => `missing field ${field} for sketch ${JSON.stringify(label)}`,
    name: (field) => (field === 'nonzeroCells' ? `field nonzeroCells of sketch ${JSON.stringify(label)}` : `field ${field}`),
    where: () => ` for sketch ${JSON.stringify(label)}`,
  };
  return checkFigures(found, naming);
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}
