import { execFileSync, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/**
 * A private PostgreSQL cluster from Debian's server, on loopback, owned by the
 * project. Used by `npm start` and by the test setup (each with its own folder
 * and port). initdb refuses to run as root, so as root every server command
 * runs as the `postgres` OS user.
 */
export interface ClusterOptions {
  dataDir: string; // the project's data folder; the cluster lives under it when the postgres user can reach it
  name: string; // sub-folder name, e.g. "pg" or "test-pg"
  host: string;
  port: number;
  user: string;
  extraSettings?: string[]; // e.g. ['fsync=off'] for tests
  log?: (line: string) => void;
}

export interface Cluster {
  dir: string;
  socketDir: string;
  logFile: string;
  start(): void;
  stop(): void;
  isRunning(): boolean;
  createDatabase(name: string): void;
}

const isRoot = () => process.getuid?.() === 0;

export function findServerBinaries(log: (line: string) => void = console.log): string {
  const found = latestBinDir();
  if (found) return found;
  if (!isRoot()) {
    throw new Error("PostgreSQL's server is not installed. Install Debian's package: sudo apt-get install -y postgresql");
  }
  log("PostgreSQL's server is missing: installing Debian's postgresql package with apt-get (about a minute)...");
  execFileSync('apt-get', ['install', '-y', '--no-install-recommends', 'postgresql'], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  const after = latestBinDir();
  if (!after) throw new Error('apt-get finished but no PostgreSQL server binaries were found under /usr/lib/postgresql');
  return after;
}

function latestBinDir(): string | undefined {
  const root = '/usr/lib/postgresql';
  if (!fs.existsSync(root)) return undefined;
  const versions = fs.readdirSync(root).filter((v) => fs.existsSync(path.join(root, v, 'bin', 'initdb')));
  versions.sort((a, b) => Number(b) - Number(a));
  return versions[0] ? path.join(root, versions[0], 'bin') : undefined;
}

/** As root the cluster must sit where the postgres user can reach; otherwise a per-project folder under /var/tmp. */
function clusterHome(opts: ClusterOptions): string {
  const wanted = path.join(opts.dataDir, opts.name);
  if (!isRoot()) return wanted;
  fs.mkdirSync(opts.dataDir, { recursive: true });
  const reachable = spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-x', opts.dataDir]).status === 0;
  if (reachable) return wanted;
  const tag = createHash('sha1').update(path.resolve(opts.dataDir)).digest('hex').slice(0, 10);
  const elsewhere = path.join('/var/tmp', `brimwatch-${tag}`, opts.name);
  opts.log?.(`The postgres user cannot reach ${opts.dataDir}; keeping the cluster in ${elsewhere} instead.`);
  return elsewhere;
}

function run(bin: string, args: string[], options: { allowFail?: boolean } = {}): { status: number; output: string } {
  const [cmd, full] = isRoot() ? ['runuser', ['-u', 'postgres', '--', bin, ...args]] : [bin, args];
  const r = spawnSync(cmd, full, { encoding: 'utf8', cwd: '/' });
  const output = `${r.stdout ?? ''}${r.stderr ?? ''}`.trim();
  if (r.status !== 0 && !options.allowFail) {
    throw new Error(`${path.basename(bin)} ${args.join(' ')} failed (exit ${r.status}): ${output}`);
  }
  return { status: r.status ?? 1, output };
}

export function openCluster(opts: ClusterOptions): Cluster {
  const bin = findServerBinaries(opts.log);
  const home = clusterHome(opts);
  const dir = path.join(home, 'data');
  const socketDir = path.join(home, 'socket');
  const logFile = path.join(home, 'server.log');
  const pg = (tool: string) => path.join(bin, tool);

  const prepare = () => {
    fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
    fs.mkdirSync(socketDir, { recursive: true });
    if (isRoot()) execFileSync('chown', ['-R', 'postgres:postgres', home]);
    if (!fs.existsSync(path.join(dir, 'PG_VERSION'))) {
      opts.log?.(`Creating a private PostgreSQL cluster in ${dir}`);
      run(pg('initdb'), ['-D', dir, '-U', opts.user, '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
    }
  };

  const isRunning = () => fs.existsSync(path.join(dir, 'PG_VERSION')) && run(pg('pg_ctl'), ['-D', dir, 'status'], { allowFail: true }).status === 0;

  return {
    dir,
    socketDir,
    logFile,
    isRunning,
    start() {
      prepare();
      if (isRunning()) return;
      const settings = [`listen_addresses=${opts.host}`, `unix_socket_directories=${socketDir}`, ...(opts.extraSettings ?? [])];
      const o = [`-p ${opts.port}`, ...settings.map((s) => `-c ${s}`)].join(' ');
      const r = run(pg('pg_ctl'), ['-D', dir, '-l', logFile, '-w', '-t', '60', '-o', o, 'start'], { allowFail: true });
      if (r.status !== 0) {
        const tail = fs.existsSync(logFile) ? fs.readFileSync(logFile, 'utf8').split('\n').slice(-8).join('\n') : '';
        throw new Error(`PostgreSQL did not start on ${opts.host}:${opts.port}. ${r.output}\n${tail}\nIf the port is taken, set PGPORT to a free port.`);
      }
    },
    stop() {
      if (isRunning()) run(pg('pg_ctl'), ['-D', dir, '-m', 'fast', '-w', 'stop']);
    },
    createDatabase(name: string) {
      const r = run(pg('createdb'), ['-h', opts.host, '-p', String(opts.port), '-U', opts.user, name], { allowFail: true });
      if (r.status !== 0 && !/already exists/.test(r.output)) throw new Error(`createdb ${name} failed: ${r.output}`);
    },
  };
}
