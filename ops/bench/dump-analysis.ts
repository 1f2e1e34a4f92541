import fs from 'node:fs';
import path from 'node:path';
import { createDumpAccumulator, mulberry32 } from '../../backend/src/maths';
import { median, type BenchRow } from './report';

const WIDTH = 2 ** 20;
const DEPTH = 8;
const REPEATS = 5;
const CHUNK = 1024 * 1024;

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

/** Reads the file in 1 MiB chunks, handing each to `take`; returns MiB per second. */
async function readRate(file: string, take: (chunk: Buffer) => void, finish: () => void): Promise<number> {
  const started = performance.now();
  for await (const chunk of fs.createReadStream(file, { highWaterMark: CHUNK })) take(chunk as Buffer);
  finish();
  return fs.statSync(file).size / 2 ** 20 / ((performance.now() - started) / 1000);
}

/**
 * 8 × 2^20 32-bit counters (32 MiB) streamed from a file through the maths
 * module's dump accumulator (row sums, zero shares, medians, the verdict),
 * against streaming the same file and doing nothing with it. The file is
 * read back from the page cache in both cases, since it was just written.
 */
export async function dumpAnalysisRow(dataDir: string): Promise<BenchRow> {
  const file = path.join(dataDir, 'dump-8x1048576.u32');
  writeDumpFile(file);
  const raw: number[] = [];
  const analysed: number[] = [];
  for (let i = 0; i < REPEATS; i++) {
    let bytes = 0;
    raw.push(await readRate(file, (chunk) => (bytes += chunk.length), () => undefined));
    const accumulator = createDumpAccumulator({ width: WIDTH, depth: DEPTH, errorBudget: 1000, confidence: 0.99 });
    analysed.push(
      await readRate(
        file,
        // 1 MiB chunks of a fresh read start on a 4-byte boundary, so each is viewed as counters without a copy.
        (chunk) => accumulator.push(new Uint32Array(chunk.buffer, chunk.byteOffset, chunk.length / 4)),
        () => accumulator.finish(),
      ),
    );
  }
  const measured = median(analysed);
  const baseline = median(raw);
  return {
    figure: 'dump analysis, 8 × 2^20 u32 (32 MiB)',
    measured,
    baseline,
    baselineName: 'reading the file',
    unit: 'MiB/s',
    ratio: measured / baseline,
    goal: '≥ 0.5× the read rate',
    met: measured / baseline >= 0.5,
  };
}
