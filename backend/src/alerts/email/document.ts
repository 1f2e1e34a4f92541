import type { HealthLevel } from '../../maths/health-levels';

/**
 * One message, described once and rendered twice (plain text and HTML), so
 * the two parts can never say different things.
 */
export interface MailRow {
  label: string;
  value: string;
  /** Set figures in the monospaced face. */
  figure?: boolean;
}

export interface MailTable {
  head: string[];
  rows: string[][];
  /** Columns holding figures: right-aligned, monospaced. */
  figureColumns: number[];
}

export interface MailSection {
  title: string;
  rows?: MailRow[];
  table?: MailTable;
  paragraphs?: string[];
  code?: string;
}

export interface MailDocument {
  /** Shown as a badge (shape and word) beside the heading. */
  level?: HealthLevel;
  badgeText?: string;
  heading: string;
  intro: string[];
  sections: MailSection[];
  caution: string;
}

const pad = (text: string, width: number) => text + ' '.repeat(Math.max(0, width - [...text].length));
const padStart = (text: string, width: number) => ' '.repeat(Math.max(0, width - [...text].length)) + text;

function textTable(table: MailTable): string[] {
  const widths = table.head.map((h, c) => Math.max([...h].length, ...table.rows.map((r) => [...(r[c] ?? '')].length)));
  const line = (cells: string[]) =>
    cells.map((cell, c) => (table.figureColumns.includes(c) ? padStart(cell, widths[c]) : pad(cell, widths[c]))).join('  ').trimEnd();
  return [line(table.head), widths.map((w) => '-'.repeat(w)).join('  '), ...table.rows.map(line)];
}

export function renderText(doc: MailDocument): string {
  const out: string[] = [];
  const badge = doc.badgeText ? `[${doc.badgeText}] ` : '';
  out.push(`${badge}${doc.heading}`, '='.repeat(Math.min(72, [...`${badge}${doc.heading}`].length)), '');
  for (const p of doc.intro) out.push(p, '');
  for (const section of doc.sections) {
    out.push(section.title.toUpperCase(), '');
    if (section.rows?.length) {
      const width = Math.max(...section.rows.map((r) => r.label.length)) + 2;
      for (const row of section.rows) out.push(`  ${pad(row.label, width)}${row.value}`);
      out.push('');
    }
    if (section.table) out.push(...textTable(section.table).map((l) => `  ${l}`), '');
    for (const p of section.paragraphs ?? []) out.push(p, '');
    if (section.code) out.push(...section.code.split('\n').map((l) => `    ${l}`), '');
  }
  out.push('--', `Caution: ${doc.caution}`);
  return `${out.join('\n')}\n`;
}
