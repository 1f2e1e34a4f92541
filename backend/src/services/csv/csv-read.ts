import { AppError } from '../../http/errors';

export interface CsvRecord {
  /** The line the record starts on, counting from 1 as editors do. */
  line: number;
  cells: string[];
}

const QUOTE = '"';

/**
 * Reads CSV text by RFC 4180: comma-separated cells, quoted cells that may
 * hold commas, doubled quotes and line breaks, CRLF or LF line ends. Blank
 * lines are skipped. A quote that opens mid-cell, text after a closing quote,
 * or a quote never closed is a 400 naming the line.
 */
export function readCsv(text: string, maxRecords: number): CsvRecord[] {
  const records: CsvRecord[] = [];
  let cells: string[] = [];
  let cell = '';
  let line = 1;
  let recordLine = 1;
  let quoted = false;
  let afterQuote = false;
  let cellStarted = false;
  const fail = (at: number, why: string) => new AppError(400, 'bad_csv', `Line ${at}: ${why}`, 'file');
  const endCell = () => {
    cells.push(cell);
    cell = '';
    cellStarted = afterQuote = false;
  };
  const endRecord = () => {
    endCell();
    if (!(cells.length === 1 && cells[0].trim() === '')) {
      if (records.length >= maxRecords) throw fail(recordLine, `the file has more than ${maxRecords} rows; split it into smaller files.`);
      records.push({ line: recordLine, cells });
    }
    cells = [];
  };

  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (quoted) {
      if (ch === QUOTE && text[i + 1] === QUOTE) {
        cell += QUOTE;
        i++;
      } else if (ch === QUOTE) {
        quoted = false;
        afterQuote = true;
      } else {
        if (ch === '\n') line++;
        cell += ch;
      }
      continue;
    }
    if (ch === ',') endCell();
    else if (ch === '\n' || ch === '\r') {
      if (ch === '\r' && text[i + 1] === '\n') i++;
      endRecord();
      line++;
      recordLine = line;
    } else if (afterQuote) {
      throw fail(line, `text follows a closing quote in cell ${cells.length + 1}; put the whole cell in quotes and double any quote inside it ("").`);
    } else if (ch === QUOTE) {
      if (cellStarted) throw fail(line, `a quote in the middle of cell ${cells.length + 1}; put the whole cell in quotes and double the quote inside it ("").`);
      quoted = true;
      cellStarted = true;
    } else {
      cell += ch;
      cellStarted = true;
    }
  }
  if (quoted) throw fail(recordLine, `a quoted cell is never closed; add the closing quote.`);
  if (cellStarted || cells.length > 0) endRecord();
  return records;
}
