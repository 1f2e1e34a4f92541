import { spawnSync } from 'node:child_process';
import net from 'node:net';
import { describe, expect, it } from 'vitest';

/** Runs `npm start`'s script with a bad setting and returns what it printed. */
function startWith(env: Record<string, string>) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'ops/start.ts'], {
    env: { ...process.env, DATA_DIR: '.data/test-start', PGPORT: '54398', ...env },
    encoding: 'utf8',
    timeout: 30_000,
  });
  return { status: r.status, output: `${r.stdout}${r.stderr}` };
}

describe('npm start with bad configuration', () => {
  it('when PORT is not a number, then it stops naming PORT and the fix', () => {
    const r = startWith({ PORT: 'eighty' });
    expect(r.status).toBe(1);
    expect(r.output).toMatch(/PORT: PORT must be a whole number between 0 and 65535 \(got 'eighty'\)/);
    expect(r.output).toMatch(/Fix: unset PORT/);
  });

  it('when the rollups would be dropped before the raw readings they stand in for, then it stops naming both settings', () => {
    const r = startWith({ RAW_RETENTION_DAYS: '30', ROLLUP_RETENTION_DAYS: '7' });
    expect(r.status).toBe(1);
    expect(r.output).toMatch(/ROLLUP_RETENTION_DAYS: must be at least RAW_RETENTION_DAYS \(30\).*\(got '7'\)\. Fix: raise ROLLUP_RETENTION_DAYS/);
  });

  it('when DATA_DIR cannot be written, then it stops naming DATA_DIR', () => {
    const r = startWith({ DATA_DIR: '/proc/brimwatch-cannot-write-here' });
    expect(r.status).toBe(1);
    expect(r.output).toMatch(/DATA_DIR '\/proc\/brimwatch-cannot-write-here' is not writable/);
  });

  it('when the web port is taken, then it stops naming PORT before starting anything', async () => {
    const blocker = net.createServer();
    await new Promise<void>((resolve) => blocker.listen(0, '127.0.0.1', resolve));
    const port = (blocker.address() as net.AddressInfo).port;
    try {
      const r = startWith({ PORT: String(port) });
      expect(r.status).toBe(1);
      expect(r.output).toMatch(new RegExp(`PORT=${port}: port ${port} on 127.0.0.1 is already in use`));
      expect(r.output).not.toMatch(/PostgreSQL is up/);
    } finally {
      blocker.close();
    }
  });
});
