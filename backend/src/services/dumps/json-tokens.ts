import { badDump } from './dump-error';

/** What the tokenizer hands on; positional arguments, so a million counters make no token objects. */
export interface JsonSink {
  punct(ch: '{' | '}' | '[' | ']' | ':' | ',', offset: number): void;
  string(value: string, offset: number): void;
  /** `text` is null for a plain run of digits, whose value is exact up to 2^53. */
  number(value: number, text: string | null, offset: number): void;
  literal(value: boolean | null, offset: number): void;
}

const MAX_STRING_BYTES = 1000;
const NUMBER = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?$/;
const PUNCT = new Map<number, '{' | '}' | '[' | ']' | ':' | ','>([[0x7b, '{'], [0x7d, '}'], [0x5b, '['], [0x5d, ']'], [0x3a, ':'], [0x2c, ',']]);
const isSpace = (b: number) => b === 0x20 || b === 0x09 || b === 0x0a || b === 0x0d;
const isNumberByte = (b: number) => (b >= 0x30 && b <= 0x39) || b === 0x2d || b === 0x2b || b === 0x2e || b === 0x65 || b === 0x45;
const isLetter = (b: number) => b >= 0x61 && b <= 0x7a;
const shown = (b: number) => (b >= 0x21 && b < 0x7f ? `'${String.fromCharCode(b)}'` : `the byte 0x${b.toString(16).padStart(2, '0')}`);

/**
 * JSON (RFC 8259) split into tokens as bytes stream in, so a dump of tens of
 * megabytes is never held as one string. Offsets count bytes from the start
 * of the file.
 */
export class JsonTokenizer {
  private state: 'between' | 'string' | 'escape' | 'number' | 'literal' = 'between';
  private offset = 0;
  private start = 0;
  private readonly held = new Uint8Array(MAX_STRING_BYTES);
  private used = 0;
  private plain = true;
  private digits = 0;
  private value = 0;

  constructor(private readonly sink: JsonSink) {}

  write(chunk: Uint8Array): void {
    for (let i = 0; i < chunk.length; i++, this.offset++) this.step(chunk[i]);
  }

  end(): void {
    if (this.state === 'string' || this.state === 'escape') {
      throw badDump(`The file ends inside a string that starts at byte offset ${this.start}: the JSON was cut short.`);
    }
    this.finishToken();
  }

  private step(b: number): void {
    switch (this.state) {
      case 'string':
        if (b === 0x22) return this.finishString();
        if (b === 0x5c) this.state = 'escape';
        return this.keep(b);
      case 'escape':
        this.state = 'string';
        return this.keep(b);
      case 'number':
        if (isNumberByte(b)) {
          if (b >= 0x30 && b <= 0x39 && this.plain) {
            this.digits++;
            this.value = this.value * 10 + (b - 0x30);
          } else this.plain = false;
          return this.keep(b);
        }
        this.finishToken();
        return this.step(b);
      case 'literal':
        if (isLetter(b)) return this.keep(b);
        this.finishToken();
        return this.step(b);
      default:
        this.between(b);
    }
  }

  private between(b: number): void {
    if (isSpace(b)) return;
    const punct = PUNCT.get(b);
    if (punct) return this.sink.punct(punct, this.offset);
    this.start = this.offset;
    this.used = 0;
    if (b === 0x22) {
      this.state = 'string';
    } else if (isNumberByte(b)) {
      this.state = 'number';
      this.plain = true;
      this.digits = this.value = 0;
      this.step(b);
    } else if (isLetter(b)) {
      this.state = 'literal';
      this.keep(b);
    } else throw badDump(`At byte offset ${this.offset}: ${shown(b)} cannot appear here in JSON.`);
  }

  private keep(b: number): void {
    if (this.used >= MAX_STRING_BYTES) {
      throw badDump(`At byte offset ${this.start}: a JSON value longer than ${MAX_STRING_BYTES} bytes; a dump holds only width, depth and a list of counters.`);
    }
    this.held[this.used++] = b;
  }

  private heldText(): string {
    return String.fromCharCode(...this.held.subarray(0, this.used));
  }

  private finishString(): void {
    this.state = 'between';
    let value: string;
    try {
      const raw = new TextDecoder('utf-8', { fatal: true }).decode(this.held.subarray(0, this.used));
      value = JSON.parse(`"${raw}"`) as string;
    } catch {
      throw badDump(`At byte offset ${this.start}: the string is not valid JSON (a bad escape, a control character or broken UTF-8).`);
    }
    this.sink.string(value, this.start);
  }

  private finishToken(): void {
    const state = this.state;
    this.state = 'between';
    if (state === 'number' && this.plain && !(this.digits > 1 && this.held[0] === 0x30)) return this.sink.number(this.value, null, this.start);
    const text = this.heldText();
    if (state === 'literal') {
      if (text === 'true' || text === 'false') this.sink.literal(text === 'true', this.start);
      else if (text === 'null') this.sink.literal(null, this.start);
      else throw badDump(`At byte offset ${this.start}: '${text}' is not JSON; a value is a number, a string, a list or true/false/null.`);
    } else if (state === 'number') {
      if (!NUMBER.test(text)) throw badDump(`At byte offset ${this.start}: '${text}' is not a JSON number.`);
      this.sink.number(Number(text), text, this.start);
    }
  }
}
