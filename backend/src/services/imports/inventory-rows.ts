import type { InventoryColumn } from '../../api-types';
import { AppError } from '../../http/errors';
import { readCsv } from '../csv/csv-read';
import { sniff } from '../dumps/sniff';
import { columnKey, INVENTORY_COLUMNS } from './inventory-columns';

export const MAX_INVENTORY_ROWS = 1000;

/** One data row of the file as the registration schema will read it, or why it cannot be read at all. */
export interface InventoryRow {
  line: number;
  input: Record<string, unknown>;
  problems: { field?: string; message: string }[];
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const instancesText = 'instances must list replicas as name=address pairs separated by spaces, such as checkout-1=http://10.0.4.7:9100/metrics checkout-2=http://10.0.4.8:9100/metrics';

function cellValue(column: InventoryColumn, text: string): unknown {
  if (column.kind === 'number') return NUMBER.test(text) ? Number(text) : text;
  if (column.kind !== 'instances') return text;
  return text.split(/[\s;]+/).filter(Boolean).map((pair) => {
    const at = pair.indexOf('=');
    if (at <= 0) throw new AppError(400, 'invalid', `${instancesText} (got '${pair.slice(0, 60)}').`, 'instances');
    return { instance: pair.slice(0, at), targetUrl: pair.slice(at + 1) };
  });
}

function decode(bytes: Uint8Array): string {
  const seen = sniff(bytes.subarray(0, 512));
  if (seen.kind === 'binary') {
    throw new AppError(400, 'bad_csv', `The file holds binary data (byte offset ${seen.binaryAt}), not CSV text: save the spreadsheet as "CSV UTF-8" and upload that.`, 'file');
  }
  try {
    return new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
  } catch {
    throw new AppError(400, 'bad_csv', 'The file is not UTF-8 text: save the spreadsheet as "CSV UTF-8" and upload that.', 'file');
  }
}

/**
 * The file's header row names the columns (in any order, any case); every
 * row after it becomes the input of one registration. Problems that belong
 * to a row are kept with the row; a file that has no usable header is a 400.
 */
export function inventoryRows(bytes: Uint8Array): InventoryRow[] {
  const records = readCsv(decode(bytes), MAX_INVENTORY_ROWS + 1);
  if (records.length === 0) throw new AppError(400, 'bad_csv', 'The file is empty: start from the template, with a header row and one sketch per row.', 'file');
  const [header, ...data] = records;
  const columns = header.cells.map((cell) => {
    const column = INVENTORY_COLUMNS.find((c) => columnKey(c.name) === columnKey(cell));
    if (!column) {
      throw new AppError(400, 'bad_csv', `Line ${header.line}: '${cell.slice(0, 60)}' is not a column of an inventory; the columns are ${INVENTORY_COLUMNS.map((c) => c.name).join(', ')}.`, 'file');
    }
    return column;
  });
  const twice = columns.find((c, i) => columns.indexOf(c) !== i);
  if (twice) throw new AppError(400, 'bad_csv', `Line ${header.line}: the column ${twice.name} appears twice; keep one.`, 'file');
  if (data.length === 0) throw new AppError(400, 'bad_csv', 'The file has a header row but no sketches: add one row per sketch below it.', 'file');

  return data.map((record) => {
    const row: InventoryRow = { line: record.line, input: {}, problems: [] };
    if (record.cells.length > columns.length) {
      row.problems.push({ message: `This row has ${record.cells.length} cells but the header has ${columns.length} columns; quote any cell that holds a comma.` });
      return row;
    }
    record.cells.forEach((cell, i) => {
      const text = cell.trim();
      if (text === '') return;
      try {
        row.input[columns[i].name] = cellValue(columns[i], text);
      } catch (error) {
        if (!(error instanceof AppError)) throw error;
        row.problems.push({ field: error.field, message: error.message });
      }
    });
    return row;
  });
}
