import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

/** Builds the front end when dist/ is missing or older than any of its sources (or the shared maths it imports). */
export function buildFrontendIfStale(root: string, log: (line: string) => void): void {
  const built = path.join(root, 'frontend', 'dist', 'index.html');
  const sources = [path.join(root, 'frontend'), path.join(root, 'backend', 'src', 'maths')];
  const builtAt = fs.existsSync(built) ? fs.statSync(built).mtimeMs : 0;
  const newest = Math.max(...sources.map((dir) => newestMtime(dir)));
  if (builtAt >= newest) return;
  log(builtAt ? 'The front end changed since its last build: building it again...' : 'Building the front end (first start)...');
  const vite = path.join(root, 'node_modules', 'vite', 'bin', 'vite.js');
  const r = spawnSync(process.execPath, [vite, 'build', '--config', 'frontend/vite.config.ts', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) throw new Error('The front-end build failed (see its output above). Fix the error, then run npm start again.');
}

function newestMtime(dir: string): number {
  let newest = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    if (entry.name === 'dist' || entry.name === 'node_modules') continue;
    const full = path.join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(full) : fs.statSync(full).mtimeMs);
  }
  return newest;
}
