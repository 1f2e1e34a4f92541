import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';

/** Checks made before anything starts, each failing with the variable to change and how. */

export function ensureWritableDataDir(dataDir: string): void {
  try {
    makeFolders(dataDir);
    const probe = path.join(dataDir, `.write-probe-${process.pid}`);
    fs.writeFileSync(probe, 'ok');
    fs.rmSync(probe);
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    throw new Error(`DATA_DIR '${dataDir}' is not writable (${reason}). Fix: set DATA_DIR to a folder you can write, e.g. DATA_DIR=./.data`, { cause: err });
  }
}

/** mkdir -p one level at a time: Node's recursive mkdir can spin forever under /proc. */
function makeFolders(dir: string): void {
  const missing: string[] = [];
  let at = path.resolve(dir);
  while (!fs.existsSync(at)) {
    missing.unshift(at);
    at = path.dirname(at);
  }
  for (const folder of missing) fs.mkdirSync(folder);
}

/** One `npm start` per data folder: a second one would fight the first over the same cluster. */
export function takeStartLock(dataDir: string): () => void {
  const lock = path.join(dataDir, 'brimwatch.pid');
  if (fs.existsSync(lock)) {
    const pid = Number(fs.readFileSync(lock, 'utf8').trim());
    if (pid && pid !== process.pid && isAlive(pid)) {
      throw new Error(`Brimwatch is already running from this folder (process ${pid}, data in ${dataDir}). Use that one, or stop it with Ctrl-C first.`);
    }
  }
  fs.writeFileSync(lock, String(process.pid));
  return () => {
    if (fs.existsSync(lock) && fs.readFileSync(lock, 'utf8').trim() === String(process.pid)) fs.rmSync(lock);
  };
}

function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

export async function ensurePortFree(host: string, port: number, variable: string): Promise<void> {
  await new Promise<void>((resolve, reject) => {
    const probe = net.createServer();
    probe.once('error', (err: NodeJS.ErrnoException) => {
      const why = err.code === 'EADDRINUSE' ? 'is already in use by another program' : `cannot be opened (${err.code ?? err.message})`;
      reject(new Error(`${variable}=${port}: port ${port} on ${host} ${why}. Fix: stop that program, or set ${variable} to a free port.`, { cause: err }));
    });
    probe.listen(port, host, () => probe.close(() => resolve()));
  });
}
