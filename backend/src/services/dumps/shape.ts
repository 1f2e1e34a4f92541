import type { DumpFormat } from '../../api-types';

/**
 * A count-min sketch has a handful of rows: δ = e^(−k), so 64 rows already
 * stand for a confidence no one asks for. A file with more lines than that is
 * almost surely laid out one counter column per line, and would otherwise
 * produce a report with a row for every line.
 */
export const MAX_DUMP_DEPTH = 64;

export const DUMP_FORMATS = ['csv', 'json', 'u32le', 'u64le'] as const satisfies readonly DumpFormat[];

/** Bytes per counter of the raw formats. */
export const RAW_WORD_BYTES = { u32le: 4, u64le: 8 } as const;
export type RawFormat = keyof typeof RAW_WORD_BYTES;

export const isRawFormat = (format: DumpFormat): format is RawFormat => format === 'u32le' || format === 'u64le';
