import fs from 'node:fs';
import path from 'node:path';

/**
 * Reads a profile written by `node --cpu-prof` and prints where the time went:
 * the functions with the most self time, and the project's own files by total
 * time (self time of everything they call). Usage:
 *   npx tsx ops/bench/top-frames.ts <file.cpuprofile> [rows]
 */
interface ProfileNode {
  id: number;
  callFrame: { functionName: string; url: string; lineNumber: number };
  children?: number[];
}
interface Profile {
  nodes: ProfileNode[];
  samples: number[];
  timeDeltas: number[];
}

const [file, rowsArg] = process.argv.slice(2);
if (!file) {
  console.error('usage: npx tsx ops/bench/top-frames.ts <file.cpuprofile> [rows]');
  process.exit(2);
}
const rows = Number(rowsArg ?? 25);
const profile = JSON.parse(fs.readFileSync(file, 'utf8')) as Profile;
const byId = new Map(profile.nodes.map((n) => [n.id, n]));
const parent = new Map<number, number>();
for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);

const selfMs = new Map<number, number>();
profile.samples.forEach((id, i) => selfMs.set(id, (selfMs.get(id) ?? 0) + (profile.timeDeltas[i] ?? 0) / 1000));
const total = [...selfMs.values()].reduce((a, b) => a + b, 0);

const where = (n: ProfileNode) => {
  const url = n.callFrame.url.replace(/^file:\/\//, '');
  const short = url.includes('node_modules') ? url.slice(url.lastIndexOf('node_modules') + 13) : path.relative(process.cwd(), url) || url;
  return `${n.callFrame.functionName || '(anonymous)'} ${short}:${n.callFrame.lineNumber + 1}`;
};

const self = new Map<string, number>();
for (const [id, ms] of selfMs) self.set(where(byId.get(id)!), (self.get(where(byId.get(id)!)) ?? 0) + ms);

// Inclusive time per project file: a sample counts once for every distinct project file on its stack.
const inclusive = new Map<string, number>();
for (const [id, ms] of selfMs) {
  const seen = new Set<string>();
  for (let at: number | undefined = id; at !== undefined; at = parent.get(at)) {
    const url = byId.get(at)!.callFrame.url;
    if (!url.startsWith('file://') || url.includes('node_modules')) continue;
    const rel = path.relative(process.cwd(), url.slice(7));
    if (!seen.has(rel)) {
      seen.add(rel);
      inclusive.set(rel, (inclusive.get(rel) ?? 0) + ms);
    }
  }
}

const show = (title: string, map: Map<string, number>) => {
  console.log(`\n${title}`);
  for (const [name, ms] of [...map].sort((a, b) => b[1] - a[1]).slice(0, rows)) {
    console.log(`${ms.toFixed(0).padStart(8)} ms ${((100 * ms) / total).toFixed(1).padStart(5)} %  ${name}`);
  }
};
console.log(`${file}: ${total.toFixed(0)} ms sampled`);
show('self time', self);
show('total time by project file', inclusive);
