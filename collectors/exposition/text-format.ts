/**
 * The Prometheus text exposition format and OpenMetrics text format (open
 * standards): `# HELP` / `# TYPE` / `# UNIT` lines, samples
 * `name{label="value",…} value [timestamp]`, label values with the escapes
 * \\ \" \n, values such as NaN, +Inf, -Inf. Only what a sketch reading needs
 * is kept: the samples. Any input gives samples or a reason with its line.
 */
export interface Sample {
  name: string;
  labels: Record<string, string>;
  value: number;
  timestamp?: number;
  line: number;
}

export type Dialect = 'openmetrics' | 'prometheus';

export type ParsedExposition = { ok: true; samples: Sample[] } | { ok: false; reason: string };

const METRIC_NAME = /^[a-zA-Z_:][a-zA-Z0-9_:]*/;
const LABEL_NAME_AT = /[a-zA-Z_][a-zA-Z0-9_]*/y;
const FLOAT = /^[+-]?(?:(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?|inf|infinity|nan)$/i;
const DESCRIPTORS = new Set(['HELP', 'TYPE', 'UNIT']);

class LineError extends Error {}

export function parseNumber(token: string): number | undefined {
  if (!FLOAT.test(token)) return undefined;
  const lower = token.toLowerCase().replace(/^\+/, '');
  if (lower === 'nan' || lower === '-nan') return NaN;
  if (lower === 'inf' || lower === 'infinity') return Infinity;
  if (lower === '-inf' || lower === '-infinity') return -Infinity;
  return Number(token);
}

export function parseExposition(body: string, dialect: Dialect): ParsedExposition {
  const lines = body.split('\n');
  // A final newline leaves one empty string behind; it is not a line of its own.
  if (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  const samples: Sample[] = [];
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i].endsWith('\r') ? lines[i].slice(0, -1) : lines[i];
    const number = i + 1;
    if (line === '# EOF') {
      if (i !== lines.length - 1) return { ok: false, reason: `parse error at line ${number + 1}: text after # EOF` };
      return { ok: true, samples };
    }
    try {
      if (line.startsWith('#')) checkComment(line);
      else if (line.trim() !== '') samples.push(parseSample(line, number));
    } catch (err) {
      if (err instanceof LineError) return { ok: false, reason: `parse error at line ${number}: ${err.message}` };
      throw err;
    }
  }
  if (dialect === 'openmetrics') return { ok: false, reason: 'parse error: the OpenMetrics body does not end with # EOF (cut short?)' };
  return { ok: true, samples };
}

/** Descriptor lines must name a valid metric; other comments carry nothing a reading needs. */
function checkComment(line: string): void {
  const [hash, keyword, name] = line.split(/[ \t]+/, 3);
  if (hash !== '#' || !DESCRIPTORS.has(keyword)) return;
  if (name === undefined || !METRIC_NAME.test(name) || name.match(METRIC_NAME)?.[0] !== name) {
    throw new LineError(`# ${keyword} needs a metric name (got ${name === undefined ? 'nothing' : JSON.stringify(name)})`);
  }
}

function parseSample(line: string, number: number): Sample {
  const name = line.match(METRIC_NAME)?.[0];
  if (!name) throw new LineError(`a sample must start with a metric name (got ${JSON.stringify(line.slice(0, 20))})`);
  let at = name.length;
  const labels: Record<string, string> = Object.create(null);
  if (line[at] === '{') at = parseLabels(line, at + 1, labels);
  const rest = line.slice(at);
  if (rest !== '' && !/^[ \t]/.test(rest)) throw new LineError(`expected a space after ${name} (got ${JSON.stringify(rest.slice(0, 10))})`);
  // An OpenMetrics exemplar follows " # "; it describes one traced event, not the sketch.
  const hash = rest.indexOf('#');
  const tokens = (hash >= 0 ? rest.slice(0, hash) : rest).trim().split(/[ \t]+/).filter((t) => t !== '');
  if (tokens.length === 0) throw new LineError(`${name} has no value`);
  if (tokens.length > 2) throw new LineError(`unexpected text after the timestamp of ${name}: ${JSON.stringify(tokens[2].slice(0, 20))}`);
  const value = parseNumber(tokens[0]);
  if (value === undefined) throw new LineError(`${name} has a value that is not a number: ${JSON.stringify(tokens[0].slice(0, 20))}`);
  const sample: Sample = { name, labels, value, line: number };
  if (tokens.length === 2) {
    const timestamp = parseNumber(tokens[1]);
    if (timestamp === undefined || !Number.isFinite(timestamp)) throw new LineError(`${name} has a timestamp that is not a number: ${JSON.stringify(tokens[1].slice(0, 20))}`);
    sample.timestamp = timestamp;
  }
  return sample;
}

/** The first index at or after `at` that is neither a space nor a tab. */
function skipSpaces(line: string, at: number): number {
  while (line.charCodeAt(at) === 32 || line.charCodeAt(at) === 9) at++;
  return at;
}

/**
 * Reads `name="value",…}` from `at`; returns the index just past the closing
 * brace. Scanned by index with a sticky pattern and plain runs of the value
 * copied whole, since every scrape reads dozens of labelled lines.
 */
function parseLabels(line: string, at: number, labels: Record<string, string>): number {
  for (;;) {
    at = skipSpaces(line, at);
    if (line[at] === '}') return at + 1;
    LABEL_NAME_AT.lastIndex = at;
    const label = LABEL_NAME_AT.exec(line)?.[0];
    if (!label) throw new LineError(`expected a label name or } at column ${at + 1}`);
    if (label in labels) throw new LineError(`label ${label} appears twice`);
    at = skipSpaces(line, at + label.length);
    if (line[at] !== '=') throw new LineError(`expected = after label ${label}`);
    at = skipSpaces(line, at + 1);
    if (line[at] !== '"') throw new LineError(`the value of label ${label} must be in double quotes`);
    let value = '';
    for (at++; ; ) {
      const quote = line.indexOf('"', at);
      const backslash = line.indexOf('\\', at);
      if (backslash >= 0 && (quote < 0 || backslash < quote)) {
        value += line.slice(at, backslash);
        const escaped = line[backslash + 1];
        if (escaped === 'n') value += '\n';
        else if (escaped === '\\' || escaped === '"') value += escaped;
        else throw new LineError(`label ${label} has an unknown escape \\${escaped ?? ''}; only \\\\, \\" and \\n are allowed`);
        at = backslash + 2;
        continue;
      }
      if (quote < 0) throw new LineError(`the value of label ${label} is not closed with "`);
      value += line.slice(at, quote);
      at = quote;
      break;
    }
    labels[label] = value;
    at = skipSpaces(line, at + 1);
    if (line[at] === ',') at++;
    else if (line[at] !== '}') throw new LineError(`expected , or } after the value of label ${label}`);
  }
}
