import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AppError } from '../../../backend/src/http/errors';
import { readCsv } from '../../../backend/src/services/csv/csv-read';
import { csvRecord } from '../../../backend/src/services/csv/csv-write';
import { inventoryRows } from '../../../backend/src/services/imports/inventory-rows';

const refusedOr = (work: () => unknown) => {
  try {
    work();
    return 'read';
  } catch (error) {
    if (error instanceof AppError && error.status === 400) return 'refused';
    throw error;
  }
};

const cellArb = fc.array(fc.constantFrom(...'ab1 ,"\r\n=é-'.split('')), { maxLength: 8 }).map((c) => c.join(''));
const tableArb = fc
  .array(fc.array(cellArb, { minLength: 1, maxLength: 5 }), { minLength: 1, maxLength: 6 })
  .map((rows) => rows.filter((r) => !(r.length === 1 && r[0].trim() === '')));

/** RFC 4180 written the plainest way: every cell quoted, quotes doubled. */
const quoteAll = (rows: string[][], end: string) => rows.map((r) => r.map((c) => `"${c.replace(/"/g, '""')}"`).join(',')).join(end) + end;

describe('CSV reading under random input', () => {
  it('when any text is read, then the answer is records or a 400 naming a line, never a crash', () => {
    fc.assert(
      fc.property(fc.string({ unit: fc.constantFrom(...'a,"\r\n x'.split('')), maxLength: 200 }), (text) => {
        expect(['read', 'refused']).toContain(refusedOr(() => readCsv(text, 1000)));
      }),
      { numRuns: 3000 },
    );
  });

  it('when a table is written with every cell quoted, with CRLF or LF line ends, then it reads back cell for cell', () => {
    fc.assert(
      fc.property(tableArb, fc.constantFrom('\r\n', '\n'), (rows, end) => {
        expect(readCsv(quoteAll(rows, end), 1000).map((r) => r.cells)).toEqual(rows);
      }),
      { numRuns: 1000 },
    );
  });

  it('when a table is written by our own CSV writer, then it reads back, with formula-like text kept as text', () => {
    fc.assert(
      fc.property(tableArb, (rows) => {
        const guarded = rows.map((r) => r.map((c) => (/^[=+\-@\t\r]/.test(c) ? `'${c}` : c)));
        expect(readCsv(rows.map((r) => csvRecord(r)).join(''), 1000).map((r) => r.cells)).toEqual(guarded);
      }),
      { numRuns: 1000 },
    );
  });

  it('when any bytes are uploaded as an inventory, then the rows are read or the file is refused with a 400', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 300 }), (bytes) => {
        expect(['read', 'refused']).toContain(refusedOr(() => inventoryRows(bytes)));
      }),
      { numRuns: 2000 },
    );
  });
});
