import type { DumpFormat, HistogramBin } from '../../api-types';
import { analyseDump } from '../../maths/dump';
import type { DumpAnalysis } from '../../maths/dump-verdict';
import { SketchMathsError } from '../../maths/errors';
import { AppError } from '../../http/errors';
import { DelimitedReader, type TextMatrix } from './delimited-reader';
import { badDump } from './dump-error';
import { CounterHistogram } from './histogram';
import { JsonDumpReader } from './json-reader';
import { RawReader } from './raw-reader';
import { isRawFormat, MAX_DUMP_DEPTH } from './shape';
import { mismatch, sniff, SNIFF_BYTES } from './sniff';

export interface DumpSettings {
  format: DumpFormat;
  /** Required for the raw formats; for text, a check against the file's own shape. */
  width?: number;
  depth?: number;
  errorBudget: number;
  confidence: number;
  streamTotal?: number;
}

export interface DumpResult {
  analysis: DumpAnalysis;
  histogram: HistogramBin[];
  byteSize: number;
}

interface Inner {
  write(bytes: Uint8Array): void;
  finish(): DumpAnalysis;
}

/** The maths module names the input at fault; a dump upload answers with it as a 400. */
function asInputError<T>(work: () => T): T {
  try {
    return work();
  } catch (error) {
    if (error instanceof SketchMathsError) throw new AppError(400, 'invalid', error.message, error.field === 'counters' ? 'file' : error.field);
    throw error;
  }
}

function textInner(reader: DelimitedReader | JsonDumpReader, settings: DumpSettings, histogram: CounterHistogram): Inner {
  return {
    write: (bytes) => reader.write(bytes),
    finish() {
      const matrix: TextMatrix = reader.end();
      for (const key of ['width', 'depth'] as const) {
        const given = settings[key];
        if (given !== undefined && given !== matrix[key]) {
          throw badDump(`The form says ${key} ${given}, but the file holds ${matrix.depth} rows of ${matrix.width} counters: correct the ${key}, or leave it empty for a ${settings.format} dump.`);
        }
      }
      const counters = matrix.counters.view();
      histogram.add(counters);
      return analyseDump({ ...settings, width: matrix.width, depth: matrix.depth, counters });
    },
  };
}

function innerFor(settings: DumpSettings, histogram: CounterHistogram): Inner {
  const { format, width, depth } = settings;
  if (!isRawFormat(format)) return textInner(format === 'csv' ? new DelimitedReader() : new JsonDumpReader(), settings, histogram);
  if (width === undefined) throw new AppError(400, 'invalid', `width is required for a raw ${format} dump: the number of counters in one row.`, 'width');
  if (depth === undefined) throw new AppError(400, 'invalid', `depth is required for a raw ${format} dump: the number of rows.`, 'depth');
  if (depth > MAX_DUMP_DEPTH) throw new AppError(400, 'invalid', `depth must be from 1 to ${MAX_DUMP_DEPTH}, the rows of a count-min sketch (got ${depth}).`, 'depth');
  return new RawReader(format, { ...settings, width, depth }, histogram);
}

/**
 * Reads one uploaded dump as it streams: the first bytes decide whether the
 * content matches the chosen format (never the file's name), then every
 * chunk goes to the format's reader. Any fault is an AppError of status 400.
 */
export function createDumpReader(settings: DumpSettings) {
  const histogram = new CounterHistogram();
  const inner = asInputError(() => innerFor(settings, histogram));
  let head: Uint8Array | null = new Uint8Array(0);
  let byteSize = 0;

  const checkHead = (bytes: Uint8Array) => {
    const problem = mismatch(settings.format, sniff(bytes));
    if (problem) throw badDump(problem);
    head = null;
    inner.write(bytes);
  };

  return {
    write(chunk: Uint8Array): void {
      byteSize += chunk.length;
      if (head === null) return asInputError(() => inner.write(chunk));
      const joined = new Uint8Array(head.length + chunk.length);
      joined.set(head);
      joined.set(chunk, head.length);
      if (joined.length < SNIFF_BYTES) head = joined;
      else asInputError(() => checkHead(joined));
    },
    finish(): DumpResult {
      if (byteSize === 0) throw badDump('The file is empty: choose the dump file again.');
      if (head !== null) asInputError(() => checkHead(head!));
      const analysis = asInputError(() => inner.finish());
      return { analysis, histogram: histogram.bins(), byteSize };
    },
  };
}
