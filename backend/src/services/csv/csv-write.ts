/**
 * One CSV record (RFC 4180): a cell with a comma, a quote or a line break is
 * quoted with its quotes doubled. Text that a spreadsheet would run as a
 * formula (starting with =, +, -, @ or a tab) gets a leading apostrophe, so
 * an alert note cannot become a formula in someone's spreadsheet; numbers are
 * written as they are.
 */
export function csvRecord(cells: readonly (string | number | boolean | null | undefined)[]): string {
  return `${cells.map(csvCell).join(',')}\r\n`;
}

function csvCell(value: string | number | boolean | null | undefined): string {
  if (value === null || value === undefined) return '';
  if (typeof value !== 'string') return String(value);
  const text = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
