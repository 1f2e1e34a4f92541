import { SketchMathsError, requirePositiveInteger } from './errors';
import { writeExposition, type ExpositionOptions, type SketchReading } from './exposition';
import { MERSENNE_31, drawRowSeeds, fingerprint, isRowSeed, rowColumn, type RowSeed } from './hashing';
import { mulberry32 } from './random';

export interface SketchOptions {
  width: number;
  depth: number;
  /** One (a, b) per row; two sketches merge only with the same seeds. */
  seeds?: readonly RowSeed[];
  /** Draws the seeds when none are given; the same seed gives the same sketch. */
  seed?: number;
  /** Conservative update (Estan & Varghese, SIGCOMM 2002). */
  conservative?: boolean;
}

const COUNTER_MAX = 0xffffffff;

/**
 * A count-min sketch (Cormode & Muthukrishnan, J. Algorithms 55(1), 2005) with
 * 32-bit counters that stop at 2^32 − 1 rather than wrap, since a wrapped
 * counter would undercount and break the one-sided guarantee.
 */
export class CountMinSketch {
  readonly width: number;
  readonly depth: number;
  readonly conservative: boolean;
  readonly seeds: readonly RowSeed[];
  readonly counterBytes = 4;
  private readonly cells: Uint32Array;
  private readonly columns: Float64Array;
  private total = 0;

  constructor(options: SketchOptions) {
    this.width = requirePositiveInteger('width', options.width);
    this.depth = requirePositiveInteger('depth', options.depth);
    if (this.width > MERSENNE_31) {
      throw new SketchMathsError('width', `width must be at most 2^31 − 1, the range of the row hash (got ${this.width}).`);
    }
    const seeds = options.seeds ?? drawRowSeeds(this.depth, mulberry32(options.seed ?? 1));
    if (seeds.length !== this.depth || !seeds.every(isRowSeed)) {
      throw new SketchMathsError('seeds', `seeds must hold ${this.depth} pairs {a, b} with 1 ≤ a < 2^31 − 1 and 0 ≤ b < 2^31 − 1.`);
    }
    this.seeds = seeds.map((s) => ({ a: s.a, b: s.b }));
    this.conservative = options.conservative ?? false;
    this.cells = new Uint32Array(this.width * this.depth);
    this.columns = new Float64Array(this.depth);
  }

  /** n: the sum of all increments, kept apart from the counters, which saturate and (conservatively) undercount n. */
  get streamTotal(): number {
    return this.total;
  }

  /** Row-major, row r at [r·width, (r+1)·width). The live array: read it, do not write it. */
  get counters(): Uint32Array {
    return this.cells;
  }

  private locate(key: string): Float64Array {
    const x = fingerprint(key);
    for (let r = 0; r < this.depth; r++) this.columns[r] = r * this.width + rowColumn(x, this.seeds[r], this.width);
    return this.columns;
  }

  update(key: string, count = 1): void {
    if (!Number.isSafeInteger(count) || count < 0) {
      throw new SketchMathsError('count', `count must be a whole number of 0 or more; the sketch's guarantee needs non-negative updates (got ${String(count)}).`);
    }
    const at = this.locate(key);
    const cells = this.cells;
    if (this.conservative) {
      const target = Math.min(COUNTER_MAX, this.estimateAt(at) + count);
      for (let r = 0; r < this.depth; r++) if (cells[at[r]] < target) cells[at[r]] = target;
    } else {
      for (let r = 0; r < this.depth; r++) cells[at[r]] = Math.min(COUNTER_MAX, cells[at[r]] + count);
    }
    this.total += count;
  }

  private estimateAt(at: Float64Array): number {
    let least = this.cells[at[0]];
    for (let r = 1; r < this.depth; r++) least = Math.min(least, this.cells[at[r]]);
    return least;
  }

  /** Never below the key's true count (while no counter has saturated). */
  estimate(key: string): number {
    return this.estimateAt(this.locate(key));
  }

  merge(other: CountMinSketch): void {
    const sameSeeds = this.seeds.every((s, r) => s.a === other.seeds[r]?.a && s.b === other.seeds[r]?.b);
    if (other.width !== this.width || other.depth !== this.depth || !sameSeeds || other.conservative !== this.conservative) {
      throw new SketchMathsError('sketch', 'only sketches of the same width, depth, seeds and update rule can be merged.');
    }
    for (let i = 0; i < this.cells.length; i++) this.cells[i] = Math.min(COUNTER_MAX, this.cells[i] + other.cells[i]);
    this.total += other.total;
  }

  /** A windowed sketch starts each window empty, seeds unchanged. */
  reset(): void {
    this.cells.fill(0);
    this.total = 0;
  }

  nonzeroCells(): number[] {
    const perRow: number[] = [];
    for (let r = 0; r < this.depth; r++) {
      let nonzero = 0;
      for (let i = r * this.width; i < (r + 1) * this.width; i++) if (this.cells[i] !== 0) nonzero++;
      perRow.push(nonzero);
    }
    return perRow;
  }

  reading(sketch: string, windowSeconds = 0): SketchReading {
    return {
      sketch,
      width: this.width,
      depth: this.depth,
      streamTotal: this.total,
      nonzeroCells: this.nonzeroCells(),
      counterBytes: this.counterBytes,
      windowSeconds,
      conservative: this.conservative,
    };
  }

  toExposition(sketch: string, options: ExpositionOptions & { windowSeconds?: number } = {}): string {
    return writeExposition([this.reading(sketch, options.windowSeconds ?? 0)], options);
  }
}
