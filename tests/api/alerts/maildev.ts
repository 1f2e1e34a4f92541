import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';

/** A port nothing listens on right now (maildev cannot be told to pick one itself). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

export interface ReceivedMail {
  id: string;
  subject: string;
  text: string;
  html: string;
  to: { address: string }[];
  /** Lower-case header names, e.g. headers['message-id']. */
  headers: Record<string, string>;
}

export interface MailFake {
  smtpPort: number;
  webPort: number;
  mailDir: string;
  /** Every message received, oldest first, through maildev's REST API (GET /api/email). */
  inbox(): Promise<ReceivedMail[]>;
  stop(): Promise<void>;
  /** Stops it and removes its mail folder. */
  discard(): Promise<void>;
}

const MAILDEV = path.resolve('node_modules/maildev/dist/bin/maildev.js');

// maildev needs a few seconds to load on a busy 2-core machine; a minute is a generous ceiling.
async function waitForApi(url: string, child: ChildProcess): Promise<void> {
  for (let i = 0; i < 600; i++) {
    if (child.exitCode !== null) throw new Error(`maildev exited with ${child.exitCode} before answering`);
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`maildev did not answer on ${url} within 60 s`);
}

/**
 * A real maildev as a child process on loopback, keeping its mail in a folder
 * of its own; pass an earlier fake's ports and folder to start it again as
 * the same server (a mail server back after an outage keeps what it had).
 */
export async function startMailFake(again?: Pick<MailFake, 'smtpPort' | 'webPort' | 'mailDir'>): Promise<MailFake> {
  const smtpPort = again?.smtpPort ?? (await freePort());
  const webPort = again?.webPort ?? (await freePort());
  const mailDir = again?.mailDir ?? fs.mkdtempSync(path.join(path.resolve('.data'), 'maildev-test-'));
  const child = spawn(
    process.execPath,
    [MAILDEV, '--smtp', String(smtpPort), '--ip', '127.0.0.1', '--web', String(webPort), '--web-ip', '127.0.0.1', '--mail-directory', mailDir, '--silent'],
    { stdio: 'ignore' },
  );
  // If the test process ends without its afterAll (an interrupted run), the mail fake must not outlive it.
  const reap = () => child.kill('SIGKILL');
  process.once('exit', reap);
  const api = `http://127.0.0.1:${webPort}/api/email`;
  await waitForApi(api, child);
  const stop = async () => {
    process.off('exit', reap);
    if (child.exitCode !== null) return;
    const exited = new Promise((r) => child.once('exit', r));
    child.kill('SIGTERM');
    await exited;
  };
  return {
    smtpPort,
    webPort,
    mailDir,
    stop,
    async inbox() {
      const res = await fetch(api);
      const mails = (await res.json()) as ReceivedMail[];
      return mails;
    },
    async discard() {
      await stop();
      fs.rmSync(mailDir, { recursive: true, force: true });
    },
  };
}
