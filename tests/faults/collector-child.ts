import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';

export interface CollectorChild {
  name: string;
  child: ChildProcess;
  output: string[];
  /** Resolves with the port of its /metrics once it has started. */
  metricsPort: Promise<number>;
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
}

/**
 * The real collectors process, as `npm start` runs it, against a test
 * database. Short leases come from the environment, as an operator would set them.
 */
export function startCollectorChild(name: string, databaseUrl: string, env: Record<string, string> = {}): CollectorChild {
  const child = spawn(process.execPath, ['--import', 'tsx', 'collectors/main.ts'], {
    cwd: path.resolve('.'),
    env: {
      ...process.env,
      NODE_ENV: 'test',
      DATABASE_URL: databaseUrl,
      COLLECTOR_ID: name,
      COLLECTOR_METRICS_PORT: '0',
      COLLECTOR_LEASE_MARGIN_SECONDS: '1',
      // No mail server in these tests: the alert jobs' sender finds nothing listening and retries later.
      SMTP_PORT: '9',
      TMPDIR: path.resolve('.data'),
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const output: string[] = [];
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => child.once('exit', (code, signal) => resolve({ code, signal })));
  const metricsPort = new Promise<number>((resolve, reject) => {
    child.stdout!.on('data', (chunk: Buffer) => {
      output.push(chunk.toString());
      const port = /metrics on http:\/\/[^:]+:(\d+)\/metrics/.exec(output.join(''))?.[1];
      if (port) resolve(Number(port));
    });
    void exited.then(() => reject(new Error(`collector ${name} exited before it started:\n${output.join('')}`)));
  });
  metricsPort.catch(() => undefined);
  child.stderr!.on('data', (chunk: Buffer) => output.push(chunk.toString()));
  return { name, child, output, metricsPort, exited };
}

/** Ends a child the test started, if it still runs, and waits for it. */
export async function endChild(c: CollectorChild | undefined): Promise<void> {
  if (!c || c.child.exitCode !== null || c.child.signalCode !== null) return;
  c.child.kill('SIGKILL');
  await c.exited;
}
