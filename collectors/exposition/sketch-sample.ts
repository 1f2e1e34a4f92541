// What one scrape tells about one sketch; the test-the-target answer sends the same figures.
import type { SketchSample } from '../../backend/src/api-types';

export type { SketchSample };

export type ReadResult<T> = { ok: true; value: T } | { ok: false; reason: string };

export const failed = (reason: string): { ok: false; reason: string } => ({ ok: false, reason });

/** The figures as found, before checking; undefined when the exposition lacks them. */
export interface FoundFigures {
  width?: number;
  depth?: number;
  streamTotal?: number;
  counterBytes?: number;
  windowSeconds?: number;
  conservative?: number;
  /** One entry per row; `row` is the row number the service gave. */
  nonzeroCells?: { row: number; value: number; where: string }[];
}

/** How a field is named in the reason, and where it was found: differs between the text and the JSON forms. */
export interface FieldNaming {
  missing(field: keyof FoundFigures): string;
  name(field: keyof FoundFigures): string;
  where(field: keyof FoundFigures): string;
}

const describe = (v: number) => (Number.isNaN(v) ? 'NaN' : v === Infinity ? '+Inf' : v === -Infinity ? '-Inf' : String(v));

/**
 * Checks every figure and builds the sample, or says which figure is wrong and
 * why. A missing or bad figure fails the whole scrape: storing a zero in its
 * place would read as an empty sketch and hide the fault.
 */
export function checkFigures(found: FoundFigures, naming: FieldNaming): ReadResult<SketchSample> {
  const scalars = ['width', 'depth', 'streamTotal', 'counterBytes', 'windowSeconds', 'conservative'] as const;
  for (const field of [...scalars, 'nonzeroCells'] as const) {
    if (found[field] === undefined) return failed(naming.missing(field));
  }
  for (const field of scalars) {
    const value = found[field] as number;
    const bad = badNumber(value);
    if (bad) return failed(`${naming.name(field)} ${bad}${naming.where(field)}`);
  }
  const { width, depth, streamTotal, counterBytes, windowSeconds, conservative } = found as Required<FoundFigures>;
  const wholeFields = ['width', 'depth', 'windowSeconds'] as const;
  for (const field of wholeFields) {
    const value = found[field] as number;
    if (!Number.isSafeInteger(value)) return failed(`${naming.name(field)} must be a whole number (got ${describe(value)})${naming.where(field)}`);
  }
  if (width < 1) return failed(`${naming.name('width')} must be at least 1 (got ${width})${naming.where('width')}`);
  if (depth < 1) return failed(`${naming.name('depth')} must be at least 1 (got ${depth})${naming.where('depth')}`);
  if (![1, 2, 4, 8].includes(counterBytes)) {
    return failed(`${naming.name('counterBytes')} must be 1, 2, 4 or 8 (got ${describe(counterBytes)})${naming.where('counterBytes')}`);
  }
  if (conservative !== 0 && conservative !== 1) {
    return failed(`${naming.name('conservative')} must be 0 or 1 (got ${describe(conservative)})${naming.where('conservative')}`);
  }
  const rows = checkRows(found.nonzeroCells ?? [], width, depth, naming);
  if (!rows.ok) return rows;
  return { ok: true, value: { width, depth, streamTotal, nonzeroCells: rows.value, counterBytes, windowSeconds, conservative: conservative === 1 } };
}

/** NaN, infinities and negatives are never a figure of a sketch. */
function badNumber(value: number): string | null {
  if (typeof value !== 'number' || Number.isNaN(value)) return 'is NaN';
  if (!Number.isFinite(value)) return `is ${describe(value)}`;
  if (value < 0) return `is negative (${value})`;
  return null;
}

function checkRows(cells: NonNullable<FoundFigures['nonzeroCells']>, width: number, depth: number, naming: FieldNaming): ReadResult<number[]> {
  const name = naming.name('nonzeroCells');
  if (cells.length !== depth) {
    return failed(`${name} has ${cells.length} rows but the depth is ${depth}; expected one per row 0..${depth - 1}`);
  }
  const byRow: number[] = new Array(depth);
  for (const { row, value, where } of cells) {
    if (!Number.isSafeInteger(row) || row < 0 || row >= depth) return failed(`${name} has row ${describe(row)}, outside 0..${depth - 1}${where}`);
    if (byRow[row] !== undefined) return failed(`${name} gives row ${row} twice${where}`);
    const bad = badNumber(value);
    if (bad) return failed(`${name} of row ${row} ${bad}${where}`);
    if (!Number.isSafeInteger(value)) return failed(`${name} of row ${row} must be a whole number (got ${value})${where}`);
    if (value > width) return failed(`${name} of row ${row} is ${value}, more than the width ${width}${where}`);
    byRow[row] = value;
  }
  return { ok: true, value: byRow };
}
