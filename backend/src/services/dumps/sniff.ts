import type { DumpFormat } from '../../api-types';

/** What the first bytes of a file look like, whatever its name says. */
export type ContentKind = 'json' | 'delimited' | 'text' | 'binary';

export interface Sniffed {
  kind: ContentKind;
  /** For binary content: where the first byte that text never holds sits. */
  binaryAt?: number;
}

/** Enough bytes to tell text from binary and JSON from CSV. */
export const SNIFF_BYTES = 512;

const isWhitespace = (b: number) => b === 0x20 || b === 0x09 || b === 0x0a || b === 0x0d;
const isPrintable = (b: number) => isWhitespace(b) || (b >= 0x20 && b < 0x7f) || b >= 0x80;
const isDelimitedByte = (b: number) => isWhitespace(b) || (b >= 0x30 && b <= 0x39) || b === 0x2c || b === 0x3b;

/**
 * Text never holds a zero byte or other control bytes; raw counters almost
 * always do (small counters have zero high bytes). UTF-8 text may hold bytes
 * of 0x80 and above, so those alone do not make a file binary.
 */
export function sniff(head: Uint8Array): Sniffed {
  const bomLength = head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf ? 3 : 0;
  for (let i = bomLength; i < head.length; i++) {
    if (!isPrintable(head[i])) return { kind: 'binary', binaryAt: i };
  }
  let first = bomLength;
  while (first < head.length && isWhitespace(head[first])) first++;
  if (head[first] === 0x7b || head[first] === 0x5b) return { kind: 'json' };
  for (let i = bomLength; i < head.length; i++) if (!isDelimitedByte(head[i])) return { kind: 'text' };
  return { kind: 'delimited' };
}

const FORMAT_NAMES: Record<DumpFormat, string> = {
  csv: 'CSV/TSV text',
  json: 'JSON',
  u32le: 'raw little-endian 32-bit counters',
  u64le: 'raw little-endian 64-bit counters',
};

/** Null when the content can be what the form says; otherwise why not, and what to choose instead. */
export function mismatch(format: DumpFormat, seen: Sniffed): string | null {
  const chosen = FORMAT_NAMES[format];
  if (seen.kind === 'binary') {
    if (format === 'u32le' || format === 'u64le') return null;
    return `The file holds binary data (a control byte at byte offset ${seen.binaryAt}), not ${chosen}: if it is a raw dump, choose the format u32le or u64le and give the width and depth.`;
  }
  if (format === 'u32le' || format === 'u64le') {
    const looks = seen.kind === 'json' ? 'JSON' : 'text';
    return `The file looks like ${looks}, not ${chosen} (it holds no zero or control bytes): choose the format ${seen.kind === 'json' ? 'json' : 'csv'}.`;
  }
  if (format === 'json' && seen.kind !== 'json') {
    return `The file does not start with '{', so it is not a JSON dump: ${seen.kind === 'delimited' ? 'it looks like CSV/TSV, so choose the format csv' : 'a JSON dump reads {"width": …, "depth": …, "counters": […]}'}.`;
  }
  if (format === 'csv' && seen.kind === 'json') {
    return `The file starts with '${'{'}' or '[', so it looks like JSON, not CSV/TSV: choose the format json.`;
  }
  return null;
}
