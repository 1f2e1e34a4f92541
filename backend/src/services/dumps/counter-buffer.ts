import type { CounterRow } from '../../maths/select-rank';

const UINT32_MAX = 0xffffffff;

/**
 * The counters of a text dump, kept as they are read, because its depth is
 * known only at the end of the file. Four bytes a counter while every value
 * fits 32 bits, widened once to doubles when one does not; the maths reads a
 * 32-bit buffer in place, without a second copy.
 */
export class CounterBuffer {
  private cells: CounterRow = new Uint32Array(4096);
  private used = 0;

  get length(): number {
    return this.used;
  }

  push(value: number): void {
    if (this.used === this.cells.length) this.grow(this.cells.length * 2);
    if (value > UINT32_MAX && this.cells instanceof Uint32Array) this.cells = Float64Array.from(this.cells);
    this.cells[this.used++] = value;
  }

  /** The counters read so far, without copying. */
  view(): CounterRow {
    return this.cells.subarray(0, this.used);
  }

  private grow(size: number): void {
    const next = this.cells instanceof Uint32Array ? new Uint32Array(size) : new Float64Array(size);
    next.set(this.cells);
    this.cells = next;
  }
}
