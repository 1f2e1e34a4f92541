import { MAX_DUMP_COUNTERS } from '../../maths/dump';
import { CounterBuffer } from './counter-buffer';
import { COUNTER_CEILING, TOO_BIG, whyNotACounter } from './cell-text';
import { badDump } from './dump-error';
import { MAX_DUMP_DEPTH } from './shape';

export interface TextMatrix {
  width: number;
  depth: number;
  counters: CounterBuffer;
}

const LF = 0x0a;
const SEPARATORS = new Set([0x2c, 0x3b, 0x09]); // , ; tab
const SHOWN_TEXT = 40;
const separatorName = (b: number) => (b === 0x09 ? 'a tab' : `'${String.fromCharCode(b)}'`);

/**
 * A CSV/TSV dump, one sketch row per line, read byte by byte as it streams in.
 * Digits are summed as they come, so a cell costs no string unless it is
 * wrong; the separator is the first of ',', ';' or tab the file uses.
 */
export class DelimitedReader {
  private readonly counters = new CounterBuffer();
  private separator = 0;
  private line = 1;
  private cell = 0;
  private width = 0;
  private rows = 0;
  private blankLine = 0;
  private started = false;
  private spaced = false;
  private bad = false;
  private digits = 0;
  private value = 0;
  private text = '';
  private atStart = true;

  write(bytes: Uint8Array): void {
    let i = 0;
    if (this.atStart && bytes.length > 0) {
      this.atStart = false;
      if (bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) i = 3;
    }
    for (; i < bytes.length; i++) {
      const b = bytes[i];
      if (b === LF) this.endLine();
      else if (b === this.separator || (this.separator === 0 && SEPARATORS.has(b))) {
        if (this.separator === 0) this.separator = b;
        this.endCell(false);
        this.cell++;
      } else if (b === 0x20 || b === 0x0d || b === 0x09) {
        if (this.started) {
          this.spaced = true;
          if (this.text.length <= SHOWN_TEXT) this.text += ' ';
        }
      } else this.take(b);
    }
  }

  end(): TextMatrix {
    if (this.started || this.cell > 0) this.endLine();
    if (this.rows === 0) throw badDump('The file holds no counters: a CSV/TSV dump has one line per sketch row, its counters separated by commas or tabs.');
    return { width: this.width, depth: this.rows, counters: this.counters };
  }

  private take(b: number): void {
    if (this.blankLine !== 0) {
      throw badDump(`Line ${this.blankLine} is empty, but more rows follow: every line of a dump holds one sketch row; remove the empty line.`);
    }
    this.started = true;
    if (this.text.length <= SHOWN_TEXT) this.text += String.fromCharCode(b);
    if (b >= 0x30 && b <= 0x39 && !this.spaced && !this.bad) {
      if (this.digits > 0 || b !== 0x30) this.digits++;
      this.value = this.value * 10 + (b - 0x30);
    } else this.bad = true;
  }

  private where(): string {
    return `line ${this.line}, cell ${this.cell + 1}`;
  }

  private endCell(atLineEnd: boolean): void {
    if (!this.started) {
      if (atLineEnd && this.cell > 0) {
        throw badDump(`Line ${this.line} ends with ${separatorName(this.separator)}: remove the trailing separator, or put the missing counter after it.`);
      }
      throw badDump(`At ${this.where()} the cell is empty: every cell holds one counter (0 for an empty one).`);
    }
    if (this.bad) {
      const hint = this.separator !== 0 && /[,;]/.test(this.text) ? ` (this file separates cells with ${separatorName(this.separator)})` : '';
      throw badDump(`At ${this.where()}: ${whyNotACounter(this.text)}${hint}.`);
    }
    if (this.digits > 20 || this.value > COUNTER_CEILING) throw badDump(`At ${this.where()}: the counter ${this.text.slice(0, SHOWN_TEXT)} ${TOO_BIG}.`);
    if (this.rows > 0 && this.cell >= this.width) {
      throw badDump(`Line ${this.line} has more than ${this.width} counters, but line 1 has ${this.width}: every row of a dump has the same width.`);
    }
    if (this.counters.length >= MAX_DUMP_COUNTERS) throw badDump(`At ${this.where()}: the dump holds more than 2^27 counters, more than Brimwatch checks at once.`);
    this.counters.push(this.value);
    this.started = this.spaced = this.bad = false;
    this.digits = this.value = 0;
    this.text = '';
  }

  private endLine(): void {
    if (!this.started && this.cell === 0) {
      if (this.blankLine === 0) this.blankLine = this.line;
      this.line++;
      return;
    }
    this.endCell(true);
    const cells = this.cell + 1;
    if (this.rows === 0) this.width = cells;
    else if (cells !== this.width) {
      throw badDump(`Line ${this.line} has ${cells} counters, but line 1 has ${this.width}: every row of a dump has the same width (a ragged row).`);
    }
    this.rows++;
    if (this.rows > MAX_DUMP_DEPTH) {
      throw badDump(`Line ${this.line} is row ${this.rows}, but a dump holds at most ${MAX_DUMP_DEPTH} rows: put one sketch row per line (not one counter per line).`);
    }
    this.cell = 0;
    this.line++;
  }
}
