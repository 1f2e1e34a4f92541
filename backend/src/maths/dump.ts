import { SketchMathsError, requireConfidence, requireNonNegative, requirePositive, requirePositiveInteger } from './errors';
import { medianInPlace, type CounterRow } from './noise-floor';
import { distinctFromNonzeroCells } from './occupancy';
import { summariseDump, type DumpAnalysis, type DumpFacts, type DumpRowSummary } from './dump-verdict';

/** 64-bit counters arrive as BigUint64Array; above 2^53 they are read to the nearest double. */
export type DumpCounters = ArrayLike<number> | BigUint64Array;

export interface DumpInput {
  width: number;
  depth: number;
  errorBudget: number;
  confidence: number;
  /** The service's own stream total; without it the largest row sum stands in. */
  streamTotal?: number;
}

export interface DumpAccumulator {
  push(chunk: DumpCounters): void;
  finish(): DumpAnalysis;
}

/** 2^27 counters (512 MiB of 32-bit cells): above that, check the width and depth given. */
export const MAX_DUMP_COUNTERS = 2 ** 27;
const UINT32_MAX = 0xffffffff;
/** No counter is wider than 64 bits; a bigger value is a misread file, and the bound keeps every sum finite. */
const MAX_COUNTER = 2 ** 64;

function summariseRow(row: number, cells: CounterRow, errorBudget: number): DumpRowSummary {
  let sum = 0;
  let zeros = 0;
  let atOrAbove = 0;
  for (let i = 0; i < cells.length; i++) {
    const v = cells[i];
    sum += v;
    if (v === 0) zeros++;
    else if (v >= errorBudget) atOrAbove++;
  }
  const width = cells.length;
  return {
    row,
    sum,
    mean: sum / width,
    zeroFraction: zeros / width,
    nonzeroCells: width - zeros,
    median: medianInPlace(cells),
    shareAtOrAboveBudget: atOrAbove / width,
    occupancy: distinctFromNonzeroCells(width - zeros, width),
  };
}

/**
 * Takes a k × m counter matrix row-major, in chunks of any size, so an upload
 * can be read as it streams. Cells are kept in one typed array (32 MiB for
 * 8 × 2^20 counters) because the median needs every value of a row; it starts
 * as 32-bit and widens to doubles only if a counter needs it.
 */
export function createDumpAccumulator(input: DumpInput): DumpAccumulator {
  const width = requirePositiveInteger('width', input.width);
  const depth = requirePositiveInteger('depth', input.depth);
  const errorBudget = requirePositive('errorBudget', input.errorBudget);
  const confidence = requireConfidence(input.confidence);
  const streamTotal = input.streamTotal === undefined ? undefined : requireNonNegative('streamTotal', input.streamTotal);
  const total = width * depth;
  if (total > MAX_DUMP_COUNTERS) {
    throw new SketchMathsError('width', `a dump of ${width} × ${depth} counters is larger than 2^27; check the width and depth given.`);
  }

  let cells: CounterRow = new Uint32Array(total);
  let filled = 0;
  let finished = false;

  const take = (v: number, index: number) => {
    if (!(Number.isInteger(v) && v >= 0 && v <= MAX_COUNTER)) {
      const at = filled + index;
      throw new SketchMathsError('counters', `the counter at row ${Math.floor(at / width)}, column ${at % width} is ${String(v)}; counters must be whole numbers from 0 to 2^64 − 1.`);
    }
    if (v > UINT32_MAX && cells instanceof Uint32Array) cells = Float64Array.from(cells);
    cells[filled + index] = v;
  };

  return {
    push(chunk) {
      if (finished) throw new SketchMathsError('counters', 'this dump is already finished; start a new one.');
      if (filled + chunk.length > total) {
        throw new SketchMathsError('counters', `the dump holds more than width × depth = ${total} counters; check the width and depth given.`);
      }
      // Every 32-bit unsigned value is a valid counter, so that common case is one bulk copy.
      if (chunk instanceof Uint32Array) cells.set(chunk, filled);
      else if (chunk instanceof BigUint64Array) for (let i = 0; i < chunk.length; i++) take(Number(chunk[i]), i);
      else for (let i = 0; i < chunk.length; i++) take(chunk[i], i);
      filled += chunk.length;
    },
    finish() {
      if (finished) throw new SketchMathsError('counters', 'this dump is already finished; start a new one.');
      if (filled !== total) {
        throw new SketchMathsError('counters', `the dump holds ${filled} counters but width × depth = ${total}; check the width and depth given.`);
      }
      finished = true;
      return analyseCells(cells, { width, depth, errorBudget, confidence, streamTotal });
    },
  };
}

function analyseCells(cells: CounterRow, facts: Omit<DumpFacts, 'rows'>): DumpAnalysis {
  const { width, depth, errorBudget } = facts;
  const rows: DumpRowSummary[] = [];
  for (let r = 0; r < depth; r++) rows.push(summariseRow(r, cells.subarray(r * width, (r + 1) * width), errorBudget));
  return summariseDump({ ...facts, rows });
}

/**
 * The whole matrix at once; the input is never rearranged. 32-bit counters of
 * the right count are read where they lie (their median needs no scratch
 * copy); anything else is checked and copied through the accumulator.
 */
export function analyseDump(input: DumpInput & { counters: DumpCounters }): DumpAnalysis {
  const accumulator = createDumpAccumulator(input);
  const { counters, width, depth, errorBudget, confidence, streamTotal } = input;
  if (counters instanceof Uint32Array && counters.length === width * depth) {
    return analyseCells(counters, { width, depth, errorBudget, confidence, streamTotal });
  }
  accumulator.push(counters);
  return accumulator.finish();
}
