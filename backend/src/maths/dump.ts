import { SketchMathsError, requireConfidence, requireNonNegative, requirePositive, requirePositiveInteger } from './errors';
import { RowTally } from './row-tally';
import { summariseDump, type DumpAnalysis, type DumpRowSummary } from './dump-verdict';

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

/** 2^27 counters: a dump larger than that is far larger than any sketch, so the width and depth given are likely wrong. */
export const MAX_DUMP_COUNTERS = 2 ** 27;
/** No counter is wider than 64 bits; a bigger value is a misread file, and the bound keeps every sum finite. */
const MAX_COUNTER = 2 ** 64;

/**
 * Takes a k × m counter matrix row-major, in chunks of any size, so an upload
 * can be read as it streams. Each row is summarised as it passes (RowTally),
 * so the matrix is never held: a 32 MiB dump costs two small buffers, not
 * 32 MiB of fresh memory, and each counter is read once.
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

  const tally = new RowTally(errorBudget);
  const rows: DumpRowSummary[] = [];
  let filled = 0;
  let finished = false;

  const check = (v: number, index: number) => {
    if (!(Number.isInteger(v) && v >= 0 && v <= MAX_COUNTER)) {
      const at = filled + index;
      throw new SketchMathsError('counters', `the counter at row ${Math.floor(at / width)}, column ${at % width} is ${String(v)}; counters must be whole numbers from 0 to 2^64 − 1.`);
    }
  };

  /** Feeds checked counters to the tally, closing each row as its last counter arrives. */
  const feed = (values: ArrayLike<number>) => {
    let from = 0;
    while (from < values.length) {
      const inRow = filled % width;
      const to = Math.min(values.length, from + width - inRow);
      tally.add(values, from, to);
      filled += to - from;
      from = to;
      if (filled % width === 0) rows.push(tally.finish(filled / width - 1));
    }
  };

  return {
    push(chunk) {
      if (finished) throw new SketchMathsError('counters', 'this dump is already finished; start a new one.');
      if (filled + chunk.length > total) {
        throw new SketchMathsError('counters', `the dump holds more than width × depth = ${total} counters; check the width and depth given.`);
      }
      // Every 32-bit unsigned value is a valid counter; anything else is checked before any of it counts.
      if (chunk instanceof Uint32Array) return feed(chunk);
      const values = chunk instanceof BigUint64Array ? Array.from(chunk, Number) : chunk;
      for (let i = 0; i < values.length; i++) check(values[i], i);
      feed(values);
    },
    finish() {
      if (finished) throw new SketchMathsError('counters', 'this dump is already finished; start a new one.');
      if (filled !== total) {
        throw new SketchMathsError('counters', `the dump holds ${filled} counters but width × depth = ${total}; check the width and depth given.`);
      }
      finished = true;
      return summariseDump({ width, depth, errorBudget, confidence, streamTotal, rows });
    },
  };
}

/** The whole matrix at once, read where it lies (never copied or rearranged). */
export function analyseDump(input: DumpInput & { counters: DumpCounters }): DumpAnalysis {
  const accumulator = createDumpAccumulator(input);
  accumulator.push(input.counters);
  return accumulator.finish();
}
