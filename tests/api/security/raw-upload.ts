import net from 'node:net';

export interface RawAnswer {
  status: number;
  body: string;
  /** Bytes of the body the client had written when the answer began to arrive. */
  sentBeforeAnswer: number;
  /** Milliseconds from the first byte sent to the answer. */
  ms: number;
}

/**
 * A multipart upload written by hand on a socket, so a test can send part of
 * it, stall, or stop early, and see when and what the server answers. The
 * body is declared with Content-Length as a browser would; `send` is called
 * with a writer and decides how much of the body goes out and when.
 */
export function rawUpload(
  appUrl: string,
  path: string,
  headers: Record<string, string>,
  declaredLength: number,
  boundary: string,
  send: (write: (bytes: Buffer) => Promise<boolean>, end: () => void) => Promise<void>,
  timeoutMs = 20_000,
): Promise<RawAnswer> {
  const { hostname, port } = new URL(appUrl);
  return new Promise((resolve, reject) => {
    const socket = net.connect(Number(port), hostname);
    const started = Date.now();
    let sent = 0;
    let sentBeforeAnswer = -1;
    let received = '';
    let answered = false;
    const timer = setTimeout(() => {
      socket.destroy();
      reject(new Error(`no answer within ${timeoutMs} ms (sent ${sent} bytes)`));
    }, timeoutMs);
    const finish = () => {
      if (answered) return;
      answered = true;
      clearTimeout(timer);
      const [head, ...rest] = received.split('\r\n\r\n');
      const status = Number(/^HTTP\/1\.1 (\d{3})/.exec(head)?.[1] ?? 0);
      const bodyText = rest.join('\r\n\r\n');
      const chunked = /transfer-encoding: chunked/i.test(head);
      resolve({ status, body: chunked ? dechunk(bodyText) : bodyText, sentBeforeAnswer, ms: Date.now() - started });
    };
    socket.on('data', (chunk) => {
      if (sentBeforeAnswer < 0) sentBeforeAnswer = sent;
      received += chunk.toString('latin1');
    });
    socket.on('close', finish);
    socket.on('error', () => finish());
    socket.once('connect', () => {
      const head = [`POST ${path} HTTP/1.1`, `Host: ${hostname}:${port}`, `Content-Type: multipart/form-data; boundary=${boundary}`, `Content-Length: ${declaredLength}`, 'Connection: close',
        ...Object.entries(headers).map(([k, v]) => `${k}: ${v}`), '', ''].join('\r\n');
      socket.write(head);
      const write = (bytes: Buffer) =>
        new Promise<boolean>((done) => {
          if (socket.destroyed || answered || sentBeforeAnswer >= 0) return done(false);
          sent += bytes.length;
          socket.write(bytes, () => done(true));
        });
      void send(write, () => socket.end()).catch(reject);
    });
  });
}

function dechunk(text: string): string {
  let out = '';
  let rest = text;
  for (;;) {
    const at = rest.indexOf('\r\n');
    if (at < 0) return out;
    const size = parseInt(rest.slice(0, at), 16);
    if (!size) return out;
    out += rest.slice(at + 2, at + 2 + size);
    rest = rest.slice(at + 2 + size + 2);
  }
}

/** The parts of a dump form before the file's bytes, and the closing boundary after them. */
export function dumpFormParts(boundary: string, fields: Record<string, string | number>, fileName: string, contentType = 'application/octet-stream') {
  const head = Object.entries(fields)
    .map(([k, v]) => `--${boundary}\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`)
    .join('');
  return {
    head: Buffer.from(`${head}--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${fileName}"\r\nContent-Type: ${contentType}\r\n\r\n`),
    tail: Buffer.from(`\r\n--${boundary}--\r\n`),
  };
}
