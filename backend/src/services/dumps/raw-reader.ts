import { createDumpAccumulator, type DumpAccumulator, type DumpInput } from '../../maths/dump';
import type { DumpAnalysis } from '../../maths/dump-verdict';
import { badDump } from './dump-error';
import type { CounterHistogram } from './histogram';
import { RAW_WORD_BYTES, type RawFormat } from './shape';

/** The byte order of this machine's typed arrays. */
const LITTLE_ENDIAN = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/**
 * Raw little-endian counters, row after row, with the width and depth from
 * the form. Each chunk goes straight into the maths module's accumulator, so
 * nothing but the counters themselves is held; a word split across two
 * chunks waits in a few carried bytes.
 */
export class RawReader {
  private readonly accumulator: DumpAccumulator;
  private readonly wordBytes: number;
  private readonly expected: number;
  private readonly carry: Uint8Array;
  private carried = 0;
  private received = 0;

  constructor(
    private readonly format: RawFormat,
    private readonly input: DumpInput,
    private readonly histogram: CounterHistogram,
  ) {
    this.wordBytes = RAW_WORD_BYTES[format];
    this.expected = input.width * input.depth * this.wordBytes;
    this.carry = new Uint8Array(this.wordBytes);
    this.accumulator = createDumpAccumulator(input);
  }

  write(bytes: Uint8Array): void {
    if (this.received + bytes.length > this.expected) {
      throw badDump(
        `The file runs past byte offset ${this.expected}, but width × depth × ${this.wordBytes} = ${this.input.width} × ${this.input.depth} × ${this.wordBytes} = ${this.expected} bytes: check the width, the depth and the format (${this.format}).`,
      );
    }
    this.received += bytes.length;
    let start = 0;
    if (this.carried > 0) {
      const need = Math.min(this.wordBytes - this.carried, bytes.length);
      this.carry.set(bytes.subarray(0, need), this.carried);
      this.carried += need;
      start = need;
      if (this.carried < this.wordBytes) return;
      this.push(this.carry, 0, 1);
      this.carried = 0;
    }
    const words = Math.floor((bytes.length - start) / this.wordBytes);
    if (words > 0) this.push(bytes, start, words);
    const rest = start + words * this.wordBytes;
    this.carry.set(bytes.subarray(rest), 0);
    this.carried = bytes.length - rest;
  }

  finish(): DumpAnalysis {
    if (this.received !== this.expected) {
      const whole = this.received % this.wordBytes === 0 ? '' : `, which is not even a whole number of ${this.wordBytes}-byte counters`;
      throw badDump(
        `The file is ${this.received} bytes${whole}, but width × depth × ${this.wordBytes} = ${this.input.width} × ${this.input.depth} × ${this.wordBytes} = ${this.expected} bytes: check the width, the depth and the format (${this.format}).`,
      );
    }
    return this.accumulator.finish();
  }

  private push(bytes: Uint8Array, start: number, words: number): void {
    if (LITTLE_ENDIAN) return this.pushNative(bytes, start, words);
    const view = new DataView(bytes.buffer, bytes.byteOffset + start, words * this.wordBytes);
    if (this.format === 'u32le') {
      const chunk = new Uint32Array(words);
      for (let i = 0; i < words; i++) chunk[i] = view.getUint32(i * 4, true);
      this.histogram.add(chunk);
      this.accumulator.push(chunk);
    } else {
      const chunk = new BigUint64Array(words);
      for (let i = 0; i < words; i++) chunk[i] = view.getBigUint64(i * 8, true);
      this.histogram.add(chunk);
      this.accumulator.push(chunk);
    }
  }

  /**
   * On a little-endian machine the bytes already are the counters: read them
   * in place when they start on a word boundary, else from one aligned copy,
   * rather than word by word.
   */
  private pushNative(bytes: Uint8Array, start: number, words: number): void {
    const offset = bytes.byteOffset + start;
    const length = words * this.wordBytes;
    const aligned = offset % this.wordBytes === 0;
    // A copy through the Uint8Array constructor: a Buffer's slice() would share the unaligned memory.
    const buffer = aligned ? bytes.buffer : new Uint8Array(bytes.subarray(start, start + length)).buffer;
    const at = aligned ? offset : 0;
    const chunk = this.format === 'u32le' ? new Uint32Array(buffer, at, words) : new BigUint64Array(buffer, at, words);
    this.histogram.add(chunk);
    this.accumulator.push(chunk);
  }
}
