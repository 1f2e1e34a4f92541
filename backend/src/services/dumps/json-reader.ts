import { MAX_DUMP_COUNTERS } from '../../maths/dump';
import { CounterBuffer } from './counter-buffer';
import { COUNTER_CEILING, TOO_BIG, whyNotACounter } from './cell-text';
import { badDump } from './dump-error';
import { JsonTokenizer, type JsonSink } from './json-tokens';
import type { TextMatrix } from './delimited-reader';
import { MAX_DUMP_DEPTH } from './shape';

type State =
  | 'start' | 'first-key' | 'key' | 'colon' | 'after-member' | 'shape-value' | 'skip' | 'done'
  | 'counters' | 'first-counter' | 'flat-after' | 'flat-next' | 'row-first' | 'row-after' | 'row-next' | 'rows-after' | 'rows-next';

const SHAPE = 'A JSON dump reads {"width": m, "depth": k, "counters": [...]}, the counters row after row or as a list of rows';

/**
 * A JSON dump: `{ width, depth, counters }`, where counters is either one flat
 * list, row after row, or a list of rows. Other keys are skipped. Built on the
 * streaming tokenizer, so the counters go into a compact buffer as they come.
 */
export class JsonDumpReader implements JsonSink {
  private readonly tokens = new JsonTokenizer(this);
  private readonly counters = new CounterBuffer();
  private state: State = 'start';
  private key = '';
  private readonly seen = new Set<string>();
  private readonly shape: { width?: number; depth?: number } = {};
  private nested = false;
  private rowWidth = 0;
  private rows = 0;
  private inRow = 0;
  private skipDepth = 0;

  write(bytes: Uint8Array): void {
    this.tokens.write(bytes);
  }

  end(): TextMatrix {
    this.tokens.end();
    if (this.state !== 'done') throw badDump(`The JSON ends before its closing '}': the file was cut short. ${SHAPE}.`);
    if (!this.seen.has('counters')) throw badDump(`The JSON has no "counters" list. ${SHAPE}.`);
    const { width, depth } = this.shape;
    if (this.nested) {
      if (width !== undefined && width !== this.rowWidth) throw badDump(`"width" says ${width}, but each row of "counters" holds ${this.rowWidth} counters.`);
      if (depth !== undefined && depth !== this.rows) throw badDump(`"depth" says ${depth}, but "counters" holds ${this.rows} rows.`);
      return { width: this.rowWidth, depth: this.rows, counters: this.counters };
    }
    if (width === undefined || depth === undefined) throw badDump(`"counters" is one flat list, so the JSON must give "width" and "depth" too. ${SHAPE}.`);
    if (depth > MAX_DUMP_DEPTH) throw badDump(`"depth" is ${depth}, but a dump holds at most ${MAX_DUMP_DEPTH} rows.`);
    if (width * depth !== this.counters.length) {
      throw badDump(`"counters" holds ${this.counters.length} counters, but width × depth = ${width} × ${depth} = ${width * depth}.`);
    }
    return { width, depth, counters: this.counters };
  }

  punct(ch: '{' | '}' | '[' | ']' | ':' | ',', offset: number): void {
    const s = this.state;
    if (s === 'skip') return this.skipPunct(ch, offset);
    if (s === 'start' && ch === '{') this.state = 'first-key';
    else if (s === 'first-key' && ch === '}') this.state = 'done';
    else if (s === 'colon' && ch === ':') this.state = this.key === 'counters' ? 'counters' : this.key === 'width' || this.key === 'depth' ? 'shape-value' : 'skip';
    else if (s === 'after-member' && ch === ',') this.state = 'key';
    else if (s === 'after-member' && ch === '}') this.state = 'done';
    else if (s === 'counters' && ch === '[') this.state = 'first-counter';
    else if (s === 'first-counter' && ch === '[') this.startRow(offset);
    else if (s === 'first-counter' && ch === ']') throw badDump(`At byte offset ${offset}: "counters" is empty. ${SHAPE}.`);
    else if (s === 'flat-after' && ch === ',') this.state = 'flat-next';
    else if ((s === 'flat-after' || s === 'rows-after') && ch === ']') this.state = 'after-member';
    else if (s === 'row-after' && ch === ',') this.state = 'row-next';
    else if (s === 'row-after' && ch === ']') this.endRow(offset);
    else if (s === 'row-first' && ch === ']') throw badDump(`At byte offset ${offset}: row ${this.rows + 1} of "counters" is empty.`);
    else if (s === 'rows-after' && ch === ',') this.state = 'rows-next';
    else if (s === 'rows-next' && ch === '[') this.startRow(offset);
    else this.unexpected(`'${ch}'`, offset);
  }

  string(value: string, offset: number): void {
    if (this.state === 'skip') return this.skipScalar();
    if (this.state !== 'first-key' && this.state !== 'key') return this.unexpected('a string', offset);
    if (this.seen.has(value)) throw badDump(`At byte offset ${offset}: the key "${value}" appears twice.`);
    this.seen.add(value);
    this.key = value;
    this.state = 'colon';
  }

  number(value: number, text: string | null, offset: number): void {
    const s = this.state;
    if (s === 'skip') return this.skipScalar();
    if (s === 'shape-value') return this.takeShape(value, offset);
    if (s !== 'first-counter' && s !== 'flat-next' && s !== 'row-first' && s !== 'row-next') return this.unexpected('a number', offset);
    const where = this.nested ? `row ${this.rows + 1}, counter ${this.inRow + 1}` : `counter ${this.counters.length + 1}`;
    if (!(Number.isInteger(value) && value >= 0)) throw badDump(`At byte offset ${offset} (${where}): ${whyNotACounter(text ?? String(value))}.`);
    if (value > COUNTER_CEILING) throw badDump(`At byte offset ${offset} (${where}): the counter ${text ?? value} ${TOO_BIG}.`);
    if (this.counters.length >= MAX_DUMP_COUNTERS) throw badDump(`At byte offset ${offset}: the dump holds more than 2^27 counters, more than Brimwatch checks at once.`);
    if (this.nested && this.rows > 0 && this.inRow >= this.rowWidth) {
      throw badDump(`At byte offset ${offset}: row ${this.rows + 1} of "counters" has more than ${this.rowWidth} counters, but row 1 has ${this.rowWidth} (a ragged row).`);
    }
    this.counters.push(value);
    this.inRow++;
    this.state = s === 'first-counter' || s === 'flat-next' ? 'flat-after' : 'row-after';
  }

  literal(value: boolean | null, offset: number): void {
    if (this.state === 'skip') return this.skipScalar();
    this.unexpected(String(value), offset);
  }

  private takeShape(value: number, offset: number): void {
    if (!(Number.isSafeInteger(value) && value >= 1)) throw badDump(`At byte offset ${offset}: "${this.key}" must be a whole number of 1 or more.`);
    this.shape[this.key as 'width' | 'depth'] = value;
    this.state = 'after-member';
  }

  private startRow(offset: number): void {
    this.nested = true;
    if (this.rows >= MAX_DUMP_DEPTH) throw badDump(`At byte offset ${offset}: "counters" holds more than ${MAX_DUMP_DEPTH} rows, more than a sketch has.`);
    this.inRow = 0;
    this.state = 'row-first';
  }

  private endRow(offset: number): void {
    if (this.rows === 0) this.rowWidth = this.inRow;
    else if (this.inRow !== this.rowWidth) {
      throw badDump(`At byte offset ${offset}: row ${this.rows + 1} of "counters" has ${this.inRow} counters, but row 1 has ${this.rowWidth} (a ragged row).`);
    }
    this.rows++;
    this.state = 'rows-after';
  }

  /** Skips the value of a key a dump does not use: a scalar, or a nested list or object up to its close. */
  private skipPunct(ch: string, offset: number): void {
    if (ch === '{' || ch === '[') this.skipDepth++;
    else if (this.skipDepth === 0) this.unexpected(`'${ch}'`, offset);
    else if (ch === '}' || ch === ']') this.skipScalar(-1);
  }

  private skipScalar(change = 0): void {
    this.skipDepth += change;
    if (this.skipDepth === 0) this.state = 'after-member';
  }

  private unexpected(what: string, offset: number): never {
    if (this.state === 'shape-value') throw badDump(`At byte offset ${offset}: "${this.key}" must be a whole number of 1 or more, not ${what}.`);
    throw badDump(`At byte offset ${offset}: ${what} was not expected here. ${SHAPE}.`);
  }
}
