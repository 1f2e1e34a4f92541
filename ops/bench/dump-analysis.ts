import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { createDumpAccumulator, mulberry32 } from '../../backend/src/maths';
import { median, type BenchRow } from './report';

const WIDTH = 2 ** 20;
const DEPTH = 8;
const REPEATS = 5;
const MiB = 2 ** 20;

/** A dump's counters: a sea of small counts with a few heavy cells, as a skewed stream leaves them (invented). */
function writeDumpFile(file: string): void {
  const random = mulberry32(7);
  const cells = new Uint32Array(WIDTH * DEPTH);
  for (let i = 0; i < cells.length; i++) {
    const u = random();
    cells[i] = u < 0.3 ? 0 : u > 0.9999 ? Math.floor(1e6 * random()) : Math.floor(-20 * Math.log(random()));
  }
  fs.writeFileSync(file, new Uint8Array(cells.buffer));
}

/** The file read from the disk itself, past the page cache (dd with O_DIRECT), into nothing; returns MiB per second. */
function readFromDisk(file: string): Promise<number> {
  return new Promise((resolve, reject) => {
    const started = performance.now();
    const dd = spawn('dd', [`if=${file}`, 'of=/dev/null', 'bs=1M', 'iflag=direct', 'status=none'], { stdio: ['ignore', 'ignore', 'pipe'] });
    let complaint = '';
    dd.stderr.on('data', (c: Buffer) => (complaint += c.toString()));
    dd.once('error', reject);
    dd.once('close', (code) => (code === 0 ? resolve(fs.statSync(file).size / MiB / ((performance.now() - started) / 1000)) : reject(new Error(`dd exited with ${code}: ${complaint}`))));
  });
}

/** The file from the page cache (it was just written), through Node's own stream; returns MiB per second. */
async function readFromCache(file: string, take: (chunk: Buffer) => void): Promise<number> {
  const started = performance.now();
  for await (const chunk of fs.createReadStream(file, { highWaterMark: MiB })) take(chunk as Buffer);
  return fs.statSync(file).size / MiB / ((performance.now() - started) / 1000);
}

/**
 * 8 × 2^20 32-bit counters (32 MiB) streamed from the file in 1 MiB chunks
 * through the maths module's dump accumulator (row sums, zero shares, cells
 * over budget, medians, the verdict), against reading the same bytes from
 * disk (O_DIRECT, past the page cache): the analysis must keep up with the
 * disk. The analysis reads the file from the page cache, so its figure is its
 * own pace; a second row sets it against that page-cache read.
 */
export async function dumpAnalysisRows(dataDir: string): Promise<BenchRow[]> {
  const file = path.join(dataDir, 'dump-8x1048576.u32');
  writeDumpFile(file);
  const rates = { disk: [] as number[], cache: [] as number[], analysed: [] as number[] };
  // Direct reads drop the file's cached pages, so they all come first, then one read fills the cache again.
  for (let i = 0; i < REPEATS; i++) rates.disk.push(await readFromDisk(file));
  await readFromCache(file, () => undefined);
  for (let i = 0; i < REPEATS; i++) {
    rates.cache.push(await readFromCache(file, () => undefined));
    const accumulator = createDumpAccumulator({ width: WIDTH, depth: DEPTH, errorBudget: 1000, confidence: 0.99 });
    // A fresh 1 MiB read starts on a 4-byte boundary and holds whole counters: viewed in place, not copied.
    rates.analysed.push(await readFromCache(file, (chunk) => accumulator.push(new Uint32Array(chunk.buffer, chunk.byteOffset, chunk.length / 4))));
    accumulator.finish();
  }
  const [disk, cache, analysed] = [median(rates.disk), median(rates.cache), median(rates.analysed)];
  const row = (figure: string, baseline: number, baselineName: string, goal: string, met: boolean): BenchRow => ({
    figure, measured: analysed, baseline, baselineName, unit: 'MiB/s', ratio: analysed / baseline, goal, met,
  });
  return [
    row('dump analysis, 8 × 2^20 u32 (32 MiB)', disk, 'reading it from disk (O_DIRECT)', '≥ 0.5× the read rate', analysed / disk >= 0.5),
    row('dump analysis, against the page cache', cache, 'reading it from the page cache', '—', true),
  ];
}
