import { spawn, type ChildProcess } from 'node:child_process';

/**
 * The start script's children: each a real process with its output prefixed
 * by its name. Stopping sends SIGTERM, then SIGKILL to whatever is left after
 * the grace period.
 */
export interface Child {
  name: string;
  process: ChildProcess;
  exited: Promise<number | null>;
}

export function startChild(name: string, command: string, args: readonly string[], env: NodeJS.ProcessEnv, onUnexpectedExit: (name: string, code: number | null) => void): Child {
  const child = spawn(command, [...args], { env, stdio: ['ignore', 'pipe', 'pipe'] });
  const prefix = `[${name}]`.padEnd(14);
  const relay = (stream: NodeJS.ReadableStream, out: NodeJS.WriteStream) => {
    let rest = '';
    stream.on('data', (chunk: Buffer) => {
      const lines = (rest + chunk.toString()).split('\n');
      rest = lines.pop() ?? '';
      for (const line of lines) if (line.trim()) out.write(`${prefix} ${line.replace(/^\[[\w-]+\]\s*/, '')}\n`);
    });
  };
  relay(child.stdout!, process.stdout);
  relay(child.stderr!, process.stderr);
  let stopping = false;
  const exited = new Promise<number | null>((resolve) => {
    child.on('exit', (code) => {
      if (!stopping) onUnexpectedExit(name, code);
      resolve(code);
    });
  });
  child.on('error', (err) => process.stderr.write(`${prefix} could not start: ${err.message}\n`));
  const record: Child = { name, process: child, exited };
  const kill = child.kill.bind(child);
  child.kill = (signal?: NodeJS.Signals | number) => {
    stopping = true;
    return kill(signal);
  };
  return record;
}

export async function stopChildren(children: Child[], graceMs = 10_000): Promise<void> {
  await Promise.all(
    children.map(async (c) => {
      if (c.process.exitCode !== null || c.process.signalCode !== null) return;
      c.process.kill('SIGTERM');
      const timer = setTimeout(() => c.process.kill('SIGKILL'), graceMs);
      await c.exited;
      clearTimeout(timer);
    }),
  );
}

/** Polls a URL until it answers with a status below 500, or gives up with the piece's name. */
export async function waitForUrl(name: string, url: string, timeoutMs = 180_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    try {
      const res = await fetch(url, { signal: AbortSignal.timeout(2000) });
      if (res.status < 500) return;
    } catch {
      // not up yet
    }
    if (Date.now() > deadline) throw new Error(`${name} did not answer at ${url} within ${timeoutMs / 1000} s; its output above says why.`);
    await new Promise((r) => setTimeout(r, 250));
  }
}
