import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { createDb } from '../../backend/src/db';
import { doneCount, makeDue } from './collection-fleet';
import type { BenchRow } from './report';

const MiB = 2 ** 20;

/** A figure of /proc/<pid>/status in bytes (VmHWM: the peak resident set so far; VmRSS: now). */
function statusBytes(pid: number, field: 'VmHWM' | 'VmRSS'): number {
  const match = new RegExp(`^${field}:\\s+(\\d+) kB`, 'm').exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'));
  return match ? Number(match[1]) * 1024 : NaN;
}

/**
 * The collectors process as `npm start` runs it (node --import tsx
 * collectors/main.ts), over two rounds of `count` due targets, each until
 * every one is stored:
 * its peak resident memory (VmHWM) against its resident memory once started
 * and idle, before any target was due.
 */
export async function memoryRow(root: string, url: string, targetIds: number[], count: number): Promise<BenchRow> {
  const db = createDb(url, { max: 2 });
  await db('targets').update({ lease_owner: null, lease_expires_at: null, next_scrape_at: db.raw("now() + interval '1 day'") });
  const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'collectors/main.ts')], {
    cwd: root,
    env: { ...process.env, DATABASE_URL: url, COLLECTOR_METRICS_PORT: '0', COLLECTOR_ID: 'bench-memory', SMTP_PORT: '9', DEMO: 'false', TMPDIR: path.join(root, '.data') },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const output: string[] = [];
  child.stdout.on('data', (c: Buffer) => output.push(c.toString()));
  child.stderr.on('data', (c: Buffer) => output.push(c.toString()));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  try {
    const deadline = Date.now() + 60_000;
    while (!output.join('').includes('started')) {
      if (child.exitCode !== null || Date.now() > deadline) throw new Error(`the collectors process did not start:\n${output.join('')}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    await new Promise((r) => setTimeout(r, 2000));
    const idle = statusBytes(child.pid!, 'VmRSS');
    // Two rounds: the second runs with the history cache full, as a collector does from then on.
    let started = 0;
    for (let round = 0; round < 2; round++) {
      await makeDue(db, targetIds, count);
      started = performance.now();
      while ((await doneCount(db)) < count) {
        if (child.exitCode !== null) throw new Error(`the collectors process exited:\n${output.join('')}`);
        if (performance.now() - started > 180_000) throw new Error(`the collectors process stored fewer than ${count} targets in 180 s`);
        await new Promise((r) => setTimeout(r, 250));
      }
    }
    const seconds = (performance.now() - started) / 1000;
    const peak = statusBytes(child.pid!, 'VmHWM');
    return {
      figure: `collector peak memory, ${count.toLocaleString('en-GB')} targets`,
      measured: peak / MiB,
      baseline: idle / MiB,
      baselineName: 'same process, started and idle',
      unit: 'MiB',
      ratio: peak / idle,
      goal: '< 300 MiB',
      met: peak / MiB < 300,
      note: `in its second round the child stored all ${count} in ${seconds.toFixed(1)} s (${Math.round(count / seconds)} targets/s)`,
    };
  } finally {
    child.kill('SIGTERM');
    await exited;
    await db.destroy();
  }
}
