import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';

export interface SimulatedFleet {
  port: number;
  /** The fleet's process, whose CPU time the collection figures account for. */
  pid: number;
  url(target: number): string;
  stop(): Promise<void>;
}

/** Starts ops/bench/target-server.ts as a child process and waits for its port. */
export async function startSimulatedFleet(root: string): Promise<SimulatedFleet> {
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'ops/bench/target-server.ts')], {
    cwd: root,
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const port = await new Promise<number>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (chunk: Buffer) => {
      out += chunk.toString();
      const line = out.split('\n')[0];
      if (out.includes('\n')) resolve(JSON.parse(line).port);
    });
    child.once('exit', (code) => reject(new Error(`the simulated fleet exited with ${code} before listening`)));
  });
  return {
    port,
    pid: child.pid!,
    url: (target) => `http://127.0.0.1:${port}/t/${target}`,
    async stop() {
      if (child.exitCode !== null) return;
      const exited = new Promise((resolve) => child.once('exit', resolve));
      child.kill('SIGTERM');
      await exited;
    },
  };
}
