import fs from 'node:fs';
import os from 'node:os';

/** One measured figure beside its baseline, measured in the same run on the same machine. */
export interface BenchRow {
  figure: string;
  measured: number;
  baseline: number;
  baselineName: string;
  unit: string;
  /** measured ÷ baseline: for rates, the share of the baseline reached; for latencies, how many times slower. */
  ratio: number;
  goal: string;
  met: boolean;
  note?: string;
}

const number = (n: number) => (n >= 100 ? Math.round(n).toLocaleString('en-GB') : n >= 10 ? n.toFixed(1) : n.toFixed(2));

function cells(row: BenchRow): string[] {
  return [row.figure, `${number(row.measured)} ${row.unit}`, `${number(row.baseline)} ${row.unit} (${row.baselineName})`, `${row.ratio.toFixed(2)}×`, row.goal, row.met ? 'met' : 'MISSED'];
}

const HEAD = ['figure', 'measured', 'baseline', 'ratio', 'goal', 'result'];

/** The table as printed on the terminal: fixed-width columns. */
export function textTable(rows: BenchRow[]): string {
  const all = [HEAD, ...rows.map(cells)];
  const widths = HEAD.map((_, i) => Math.max(...all.map((r) => r[i].length)));
  const line = (r: string[]) => r.map((c, i) => c.padEnd(widths[i])).join('  ').trimEnd();
  return [line(HEAD), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map((r) => line(cells(r)))].join('\n');
}

export function machineLine(): string {
  const cpu = os.cpus();
  return `${cpu.length} cores (${cpu[0]?.model.trim() ?? 'unknown CPU'}), ${Math.round(os.totalmem() / 2 ** 30)} GiB RAM, Node.js ${process.version}, ${os.platform()} ${os.release()}, load average ${os.loadavg()[0].toFixed(1)}`;
}

/** Writes the run's table, with its date and machine, for the README and for comparing runs. */
export function writeReport(file: string, rows: BenchRow[], notes: string[], seconds: number): void {
  const md = [
    '# Last benchmark run (`npm run bench`)',
    '',
    `- date: ${new Date().toISOString()}`,
    `- machine: ${machineLine()}`,
    `- core count (os.cpus().length): ${os.cpus().length}`,
    `- load average (1, 5, 15 min) at the end: ${os.loadavg().map((l) => l.toFixed(1)).join(', ')}`,
    `- whole run: ${seconds.toFixed(0)} s`,
    '',
    `| ${HEAD.join(' | ')} |`,
    `| ${HEAD.map(() => '---').join(' | ')} |`,
    ...rows.map((r) => `| ${cells(r).join(' | ')} |`),
    '',
    ...(notes.length ? ['## Notes', '', ...notes.map((n) => `- ${n}`), ''] : []),
  ].join('\n');
  fs.writeFileSync(file, md);
}

/** Runs `work` `times` times and returns each duration in milliseconds. */
export async function timeEach(times: number, work: () => Promise<unknown>): Promise<number[]> {
  const out: number[] = [];
  for (let i = 0; i < times; i++) {
    const started = performance.now();
    await work();
    out.push(performance.now() - started);
  }
  return out;
}

/** The p-th percentile (0–100) by the nearest-rank method. */
export function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))];
}

export const median = (values: number[]) => percentile(values, 50);
