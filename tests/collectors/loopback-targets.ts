import http from 'node:http';
import type { AddressInfo } from 'node:net';

export interface TargetFigures {
  width: number;
  depth: number;
  streamTotal: number;
  nonzeroCells: number[];
  counterBytes?: number;
  windowSeconds?: number;
  conservative?: boolean;
}

/** The text exposition of one sketch, written by hand the way DESIGN.md lays it out. */
export function expositionOf(label: string, f: TargetFigures): string {
  const s = `sketch="${label}"`;
  return [
    '# TYPE countmin_width gauge',
    `countmin_width{${s}} ${f.width}`,
    `countmin_depth{${s}} ${f.depth}`,
    '# TYPE countmin_stream counter',
    `countmin_stream_total{${s}} ${f.streamTotal}`,
    ...f.nonzeroCells.map((c, row) => `countmin_nonzero_cells{${s},row="${row}"} ${c}`),
    `countmin_counter_bytes{${s}} ${f.counterBytes ?? 4}`,
    `countmin_window_seconds{${s}} ${f.windowSeconds ?? 0}`,
    `countmin_conservative{${s}} ${f.conservative ? 1 : 0}`,
    '# EOF',
    '',
  ].join('\n');
}

export type Behaviour =
  | { kind: 'sketch'; label: string; figures: TargetFigures }
  | { kind: 'status'; status: number; location?: string }
  | { kind: 'hang' }
  | { kind: 'stall' }
  | { kind: 'reset' }
  | { kind: 'huge' }
  | { kind: 'body'; body: string; contentType: string };

/**
 * A fake fleet on loopback: each path answers as the test says (a sketch, an
 * error status, a hang, a reset, an endless body) and every hit is recorded
 * with its time and the collector's User-Agent.
 */
export async function startLoopbackTargets() {
  const behaviours = new Map<string, Behaviour>();
  const hits: { path: string; at: number; agent: string }[] = [];
  const server = http.createServer((req, res) => {
    const path = req.url ?? '/';
    hits.push({ path, at: Date.now(), agent: String(req.headers['user-agent'] ?? '') });
    const b = behaviours.get(path);
    if (!b) return res.writeHead(404).end('no such target');
    switch (b.kind) {
      case 'sketch':
        return res.writeHead(200, { 'content-type': 'application/openmetrics-text; version=1.0.0; charset=utf-8' }).end(expositionOf(b.label, b.figures));
      case 'status':
        return res.writeHead(b.status, b.location ? { location: b.location } : {}).end('status');
      case 'hang':
        return;
      case 'stall':
        res.writeHead(200, { 'content-type': 'text/plain' });
        return res.write('countmin_width{sketch="x"} 1\n');
      case 'reset':
        return req.socket.destroy();
      case 'huge': {
        res.writeHead(200, { 'content-type': 'text/plain' });
        const chunk = Buffer.alloc(64 * 1024, '#');
        let sent = 0;
        const pump = () => {
          while (sent < 50 * 1024 * 1024 && !res.destroyed) {
            sent += chunk.length;
            if (!res.write(chunk)) return void res.once('drain', pump);
          }
          res.end();
        };
        return pump();
      }
      case 'body':
        return res.writeHead(200, { 'content-type': b.contentType }).end(b.body);
    }
  });
  server.keepAliveTimeout = 1;
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const port = (server.address() as AddressInfo).port;
  return {
    port,
    url: (path: string) => `http://127.0.0.1:${port}${path}`,
    behaviours,
    hits,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

export type LoopbackTargets = Awaited<ReturnType<typeof startLoopbackTargets>>;
