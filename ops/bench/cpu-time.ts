import { spawnSync } from 'node:child_process';
import fs from 'node:fs';

/**
 * CPU time (user + system) of other processes, read from /proc on Linux, so a
 * benchmark can say where a machine's cores went: the collector, PostgreSQL
 * or the simulated fleet. Figures are in seconds.
 */
let ticksPerSecond: number | undefined;
function clockTicks(): number {
  ticksPerSecond ??= Number(spawnSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).stdout.trim()) || 100;
  return ticksPerSecond;
}

/** Fields of /proc/<pid>/stat after the command name (which may hold spaces), or null when the process is gone. */
function statFields(pid: number): string[] | null {
  try {
    const text = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    return text.slice(text.lastIndexOf(')') + 2).split(' ');
  } catch {
    return null;
  }
}

// After the name: state(0) ppid(1) … utime(11) stime(12) cutime(13) cstime(14).
const ticksOf = (f: string[], withReaped: boolean) => Number(f[11]) + Number(f[12]) + (withReaped ? Number(f[13]) + Number(f[14]) : 0);

/**
 * A process and its children: its own time, the time of children it has
 * already reaped (PostgreSQL's postmaster reaps its backends) and the time of
 * children still running.
 */
export function treeCpuSeconds(rootPid: number): number {
  const root = statFields(rootPid);
  if (!root) return 0;
  let ticks = ticksOf(root, true);
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    const f = statFields(Number(entry));
    if (f && Number(f[1]) === rootPid) ticks += ticksOf(f, false);
  }
  return ticks / clockTicks();
}

/** This process's own CPU seconds. */
export const ownCpuSeconds = () => {
  const { user, system } = process.cpuUsage();
  return (user + system) / 1e6;
};

/** The postmaster's pid, from the first line of postmaster.pid in the cluster's data folder. */
export function postmasterPid(dataFolder: string): number {
  return Number(fs.readFileSync(`${dataFolder}/postmaster.pid`, 'utf8').split('\n')[0]);
}

export interface CpuSplit {
  /** This process: the bare loop, or the whole collector pipeline. */
  own: number;
  fleet: number;
  postgres: number;
}

/** CPU seconds each part used between `start()` and the `stop()` it returns. */
export function cpuMeter(pids: { fleet: number; postmaster: number }): { start(): () => CpuSplit } {
  const read = (): CpuSplit => ({ own: ownCpuSeconds(), fleet: treeCpuSeconds(pids.fleet), postgres: treeCpuSeconds(pids.postmaster) });
  return {
    start() {
      const before = read();
      return () => {
        const after = read();
        return { own: after.own - before.own, fleet: after.fleet - before.fleet, postgres: after.postgres - before.postgres };
      };
    },
  };
}
